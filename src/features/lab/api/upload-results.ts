import { useMutation, useQueryClient } from '@tanstack/react-query';
import { uploadResultSchema, type ColumnMapping } from '../../../../shared/schemas/lab.schema.ts';
import { apiUpload } from '../../../lib/api-client.ts';
import { labKeys, labPath } from './lab-keys.ts';

export function uploadResults(orgId: string, file: File, mapping: ColumnMapping | null) {
  const form = new FormData();
  if (mapping) form.set('mapping', JSON.stringify(mapping));
  form.set('file', file);
  return apiUpload(`${labPath(orgId)}/uploads`, form, uploadResultSchema);
}

export function useUploadResults(orgId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ file, mapping }: { file: File; mapping: ColumnMapping | null }) => uploadResults(orgId, file, mapping),
    onSuccess: () => client.invalidateQueries({ queryKey: labKeys.all(orgId) }),
  });
}
