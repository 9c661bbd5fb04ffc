/** Query keys of organism profiles: ['profiles'] invalidates the whole family. */
export const profilesKeys = {
  all: ['profiles'] as const,
  list: (orgId: string) => ['profiles', 'list', orgId] as const,
  detail: (profileId: string) => ['profiles', 'detail', profileId] as const,
};

export const profilesPath = (orgId: string) => `/orgs/${orgId}/profiles`;
