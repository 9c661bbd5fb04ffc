import { useMutation, useQueryClient } from '@tanstack/react-query';
import { calibrationSchema } from '../../../../shared/schemas/lab.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { labKeys, labPath } from './lab-keys.ts';

export const discardCalibration = (orgId: string, id: string) => apiSend('POST', `${labPath(orgId)}/calibrations/${id}/discard`, undefined, calibrationSchema);

export function useDiscardCalibration(orgId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => discardCalibration(orgId, id),
    onSuccess: () => client.invalidateQueries({ queryKey: labKeys.calibrations(orgId) }),
  });
}
