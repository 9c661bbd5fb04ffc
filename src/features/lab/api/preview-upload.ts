import { useMutation } from '@tanstack/react-query';
import { uploadPreviewSchema, type ColumnMapping } from '../../../../shared/schemas/lab.schema.ts';
import { apiUpload } from '../../../lib/api-client.ts';
import { labPath } from './lab-keys.ts';

export function previewUpload(orgId: string, file: File, mapping: ColumnMapping | null) {
  const form = new FormData();
  if (mapping) form.set('mapping', JSON.stringify(mapping));
  form.set('file', file);
  return apiUpload(`${labPath(orgId)}/uploads/preview`, form, uploadPreviewSchema);
}

export const usePreviewUpload = (orgId: string) =>
  useMutation({ mutationFn: ({ file, mapping }: { file: File; mapping: ColumnMapping | null }) => previewUpload(orgId, file, mapping) });
