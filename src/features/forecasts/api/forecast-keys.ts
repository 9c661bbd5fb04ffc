/** Query keys of forecasts: one prefix per site invalidates the family. */
export const forecastKeys = {
  site: (siteId: string) => ['forecasts', siteId] as const,
  latest: (siteId: string, profileId: string) => ['forecasts', siteId, 'latest', profileId] as const,
  grid: (forecastId: string) => ['forecasts', 'grid', forecastId] as const,
  runs: (siteId: string) => ['forecasts', siteId, 'runs'] as const,
  watch: (siteId: string) => ['forecasts', siteId, 'watch'] as const,
  profiles: (orgId: string) => ['forecasts', 'profiles', orgId] as const,
};
