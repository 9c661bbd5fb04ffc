/** Query keys of the sampling plan: ['samples'] invalidates every list. */
export const samplingKeys = {
  all: ['samples'] as const,
  list: (orgId: string, filters: { siteId?: string; from?: string; to?: string }) => ['samples', 'list', orgId, filters] as const,
  settings: (siteId: string) => ['samples', 'forecast-settings', siteId] as const,
};

export const samplesPath = (orgId: string) => `/orgs/${orgId}/samples`;
