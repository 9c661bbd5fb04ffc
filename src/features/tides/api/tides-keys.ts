/** Query keys of a site's tides: one prefix per site invalidates the family. */
export const tidesKeys = {
  site: (siteId: string) => ['tides', siteId] as const,
  sets: (siteId: string) => ['tides', siteId, 'sets'] as const,
  preview: (siteId: string, start: string | null) => ['tides', siteId, 'preview', { start }] as const,
  stations: (siteId: string) => ['tides', siteId, 'stations'] as const,
  refreshes: (siteId: string) => ['tides', siteId, 'refreshes'] as const,
};

export const tidesPath = (orgId: string, siteId: string) => `/orgs/${orgId}/sites/${siteId}/tides`;
