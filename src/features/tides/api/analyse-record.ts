import { useMutation } from '@tanstack/react-query';
import { analysisResultSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiUpload } from '../../../lib/api-client.ts';
import { tidesPath } from './tides-keys.ts';

export interface RecordUpload {
  file: File;
  /** Comma-separated names to try; empty = the default eleven. */
  constituents?: string;
  label?: string;
  activate?: boolean;
}

export function recordForm(upload: RecordUpload): FormData {
  const form = new FormData();
  if (upload.constituents?.trim()) form.set('constituents', upload.constituents.trim());
  if (upload.label?.trim()) form.set('label', upload.label.trim());
  if (upload.activate !== undefined) form.set('activate', String(upload.activate));
  form.set('file', upload.file);
  return form;
}

/** Fits the record and answers the fit; nothing is stored. */
export const analyseRecord = (orgId: string, siteId: string, upload: RecordUpload) => apiUpload(`${tidesPath(orgId, siteId)}/analyses`, recordForm(upload), analysisResultSchema);

export const useAnalyseRecord = (orgId: string, siteId: string) => useMutation({ mutationFn: (upload: RecordUpload) => analyseRecord(orgId, siteId, upload) });
