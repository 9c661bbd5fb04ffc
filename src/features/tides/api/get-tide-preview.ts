import { queryOptions, useQuery } from '@tanstack/react-query';
import { previewAnswerSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { tidesKeys, tidesPath } from './tides-keys.ts';

/** The 7-day preview from the active set; start null = from the current hour. */
export const getTidePreview = (orgId: string, siteId: string, start: string | null) =>
  apiGet(`${tidesPath(orgId, siteId)}/preview?days=7${start ? `&start=${encodeURIComponent(start)}` : ''}`, previewAnswerSchema);

export const tidePreviewQueryOptions = (orgId: string, siteId: string, start: string | null = null) =>
  queryOptions({ queryKey: tidesKeys.preview(siteId, start), queryFn: () => getTidePreview(orgId, siteId, start) });

export const useTidePreview = (orgId: string, siteId: string, start: string | null = null) => useQuery(tidePreviewQueryOptions(orgId, siteId, start));
