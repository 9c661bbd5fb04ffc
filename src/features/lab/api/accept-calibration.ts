import { useMutation, useQueryClient } from '@tanstack/react-query';
import { calibrationDecisionSchema } from '../../../../shared/schemas/lab.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { labKeys, labPath } from './lab-keys.ts';

export const acceptCalibration = (orgId: string, id: string) => apiSend('POST', `${labPath(orgId)}/calibrations/${id}/accept`, undefined, calibrationDecisionSchema);

export function useAcceptCalibration(orgId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => acceptCalibration(orgId, id),
    onSuccess: () => Promise.all([client.invalidateQueries({ queryKey: labKeys.all(orgId) }), client.invalidateQueries({ queryKey: ['profiles'] })]),
  });
}
