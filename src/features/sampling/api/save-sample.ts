import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { plannedSampleSchema, type SampleInput, type SampleUpdate, type TakenInput } from '../../../../shared/schemas/sampling.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { samplesPath, samplingKeys } from './sampling-keys.ts';

export const createSample = (orgId: string, siteId: string, input: SampleInput) => apiSend('POST', `/orgs/${orgId}/sites/${siteId}/samples`, input, plannedSampleSchema);
export const updateSample = (orgId: string, sampleId: string, changes: SampleUpdate) => apiSend('PATCH', `${samplesPath(orgId)}/${sampleId}`, changes, plannedSampleSchema);
export const deleteSample = (orgId: string, sampleId: string) => apiSend('DELETE', `${samplesPath(orgId)}/${sampleId}`);
export const markTaken = (orgId: string, sampleId: string, input: Partial<TakenInput>) => apiSend('POST', `${samplesPath(orgId)}/${sampleId}/taken`, input, plannedSampleSchema);
export const addFromAdvice = (orgId: string, siteId: string, forecastId: string, dates?: string[]) =>
  apiSend('POST', `/orgs/${orgId}/sites/${siteId}/samples/from-advice`, { forecastId, dates }, z.object({ samples: z.array(plannedSampleSchema), skipped: z.number() }));

function useSamplesMutation<A, R>(fn: (args: A) => Promise<R>) {
  const client = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => client.invalidateQueries({ queryKey: samplingKeys.all }) });
}

export const useCreateSample = (orgId: string) => useSamplesMutation(({ siteId, input }: { siteId: string; input: SampleInput }) => createSample(orgId, siteId, input));
export const useUpdateSample = (orgId: string) => useSamplesMutation(({ sampleId, changes }: { sampleId: string; changes: SampleUpdate }) => updateSample(orgId, sampleId, changes));
export const useDeleteSample = (orgId: string) => useSamplesMutation((sampleId: string) => deleteSample(orgId, sampleId));
export const useMarkTaken = (orgId: string) => useSamplesMutation(({ sampleId, notes }: { sampleId: string; notes: string }) => markTaken(orgId, sampleId, { notes }));
export const useAddFromAdvice = (orgId: string, siteId: string) => useSamplesMutation(({ forecastId, dates }: { forecastId: string; dates?: string[] }) => addFromAdvice(orgId, siteId, forecastId, dates));
