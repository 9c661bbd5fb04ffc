/** Query keys of the lab area: one prefix per organisation invalidates the family. */
export const labKeys = {
  all: (orgId: string) => ['lab', orgId] as const,
  results: (orgId: string, filters: { siteId?: string; taxon?: string }) => ['lab', orgId, 'results', filters] as const,
  taxa: (orgId: string) => ['lab', orgId, 'taxa'] as const,
  comparison: (orgId: string, profileId: string, siteId: string | undefined) => ['lab', orgId, 'comparison', { profileId, siteId }] as const,
  calibrations: (orgId: string) => ['lab', orgId, 'calibrations'] as const,
  calibration: (orgId: string, id: string) => ['lab', orgId, 'calibrations', id] as const,
  sites: (orgId: string) => ['lab', orgId, 'sites'] as const,
  profiles: (orgId: string) => ['lab', orgId, 'profiles'] as const,
};

export const labPath = (orgId: string) => `/orgs/${orgId}/lab`;

export const query = (params: Record<string, string | undefined>) => {
  const search = new URLSearchParams(Object.entries(params).filter((e): e is [string, string] => Boolean(e[1])));
  const text = search.toString();
  return text ? `?${text}` : '';
};
