import { queryOptions, useQuery } from '@tanstack/react-query';
import { calibrationListSchema } from '../../../../shared/schemas/lab.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { labKeys, labPath } from './lab-keys.ts';

export const getCalibrations = (orgId: string) => apiGet(`${labPath(orgId)}/calibrations`, calibrationListSchema);

/** Polls every 1.5 s while a calibration is queued or running, so progress shows. */
export const calibrationsQueryOptions = (orgId: string) =>
  queryOptions({
    queryKey: labKeys.calibrations(orgId),
    queryFn: () => getCalibrations(orgId),
    refetchInterval: (q) => (q.state.data?.calibrations.some((c) => c.status === 'queued' || c.status === 'running') ? 1500 : false),
  });

export const useCalibrations = (orgId: string) => useQuery(calibrationsQueryOptions(orgId));
