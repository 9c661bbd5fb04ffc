import { useMutation, useQueryClient } from '@tanstack/react-query';
import { calibrationSchema } from '../../../../shared/schemas/lab.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { labKeys, labPath } from './lab-keys.ts';

export interface CalibrationRequest {
  profileVersionId: string;
  siteId: string;
  fitGrowth: boolean;
}

export const startCalibration = (orgId: string, input: CalibrationRequest) => apiSend('POST', `${labPath(orgId)}/calibrations`, input, calibrationSchema);

export function useStartCalibration(orgId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: CalibrationRequest) => startCalibration(orgId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: labKeys.calibrations(orgId) }),
  });
}
