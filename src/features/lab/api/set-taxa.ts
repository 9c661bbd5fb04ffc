import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiErrorSchema } from '../../../../shared/schemas/api-error.schema.ts';
import { taxonMappingListSchema } from '../../../../shared/schemas/lab.schema.ts';
import { ApiError } from '../../../lib/api-client.ts';
import { labKeys, labPath } from './lab-keys.ts';

/** PUT /lab/taxa (apiSend has no PUT): the same headers and the same typed errors. */
export async function setTaxa(orgId: string, mappings: { taxon: string; profileId: string | null }[]) {
  const response = await fetch(`/api${labPath(orgId)}/taxa`, {
    method: 'PUT',
    credentials: 'same-origin',
    headers: { Accept: 'application/json', 'Content-Type': 'application/json', 'X-Planktide-CSRF': '1' },
    body: JSON.stringify({ mappings }),
  });
  const body: unknown = await response.json().catch(() => null);
  if (response.ok) return taxonMappingListSchema.parse(body);
  const error = apiErrorSchema.safeParse(body);
  if (error.success) throw new ApiError(response.status, error.data.error.code, error.data.error.message);
  throw new ApiError(response.status, 'unexpected_response', `The server answered ${response.status} without an error body.`);
}

export function useSetTaxa(orgId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (mappings: { taxon: string; profileId: string | null }[]) => setTaxa(orgId, mappings),
    onSuccess: () => client.invalidateQueries({ queryKey: labKeys.all(orgId) }),
  });
}
