import type { Config } from '../server/config.ts';
import type { QueueSettings } from '../server/forecasts/queue.ts';

export function queueSettingsFrom(config: Config): QueueSettings {
  return {
    expireInSeconds: config.QUEUE_JOB_TIMEOUT_S,
    retryLimit: 4,
    retryDelaySeconds: config.QUEUE_RETRY_DELAY_S,
    maintenanceIntervalSeconds: config.QUEUE_MAINTENANCE_S,
    pollingIntervalSeconds: 2,
  };
}
