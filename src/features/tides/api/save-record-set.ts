import { useMutation, useQueryClient } from '@tanstack/react-query';
import { setFromRecordResultSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiUpload } from '../../../lib/api-client.ts';
import { recordForm, type RecordUpload } from './analyse-record.ts';
import { tidesKeys, tidesPath } from './tides-keys.ts';

/** Fits the record again on the server and stores the fit as a new version (source "analysis"). */
export const saveRecordSet = (orgId: string, siteId: string, upload: RecordUpload) =>
  apiUpload(`${tidesPath(orgId, siteId)}/sets/from-record`, recordForm(upload), setFromRecordResultSchema);

export function useSaveRecordSet(orgId: string, siteId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (upload: RecordUpload) => saveRecordSet(orgId, siteId, upload),
    onSuccess: () => client.invalidateQueries({ queryKey: tidesKeys.site(siteId) }),
  });
}
