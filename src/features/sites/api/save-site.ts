import { useMutation, useQueryClient } from '@tanstack/react-query';
import { siteSchema, type SiteInput } from '../../../../shared/schemas/site.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';

export const createSite = (orgId: string, input: SiteInput) => apiSend('POST', `/orgs/${orgId}/sites`, input, siteSchema);
export const updateSite = (orgId: string, siteId: string, input: Partial<SiteInput>) => apiSend('PATCH', `/orgs/${orgId}/sites/${siteId}`, input, siteSchema);
export const archiveSite = (orgId: string, siteId: string) => apiSend('POST', `/orgs/${orgId}/sites/${siteId}/archive`, undefined, siteSchema);

/** Create (no siteId) or update a site; refreshes every site query afterwards. */
export function useSaveSite(orgId: string, siteId?: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: SiteInput) => (siteId ? updateSite(orgId, siteId, input) : createSite(orgId, input)),
    onSuccess: () => client.invalidateQueries({ queryKey: ['sites'] }),
  });
}

export function useArchiveSite(orgId: string) {
  const client = useQueryClient();
  return useMutation({ mutationFn: (siteId: string) => archiveSite(orgId, siteId), onSuccess: () => client.invalidateQueries({ queryKey: ['sites'] }) });
}
