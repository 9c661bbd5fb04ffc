import { useMutation, useQueryClient } from '@tanstack/react-query';
import { constituentSetSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiUpload } from '../../../lib/api-client.ts';
import { tidesKeys, tidesPath } from './tides-keys.ts';

export interface ConstituentTableUpload {
  file: File;
  kind: 'current' | 'level';
  datumM?: string;
  activate: boolean;
}

export function uploadConstituentTable(orgId: string, siteId: string, upload: ConstituentTableUpload) {
  const form = new FormData();
  form.set('kind', upload.kind);
  if (upload.datumM) form.set('datumM', upload.datumM);
  form.set('activate', String(upload.activate));
  form.set('file', upload.file);
  return apiUpload(`${tidesPath(orgId, siteId)}/uploads/constituents`, form, constituentSetSchema);
}

export function useUploadConstituentTable(orgId: string, siteId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (upload: ConstituentTableUpload) => uploadConstituentTable(orgId, siteId, upload),
    onSuccess: () => client.invalidateQueries({ queryKey: tidesKeys.site(siteId) }),
  });
}
