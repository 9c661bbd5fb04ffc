import PgBoss from 'pg-boss';

/** One forecast run (site × profile version × constituent set × start). */
export const FORECAST_QUEUE = 'forecast-run';
/** A site's scheduled forecast: refresh its tides, then make and queue its runs. */
export const SITE_QUEUE = 'site-forecasts';

export interface ForecastJobData {
  runId: string;
}

export interface SiteJobData {
  organisationId: string;
  siteId: string;
  forecastStartMs: number;
  trigger: 'schedule' | 'manual';
}

export interface QueueSettings {
  /** A job whose worker stops answering is given back to the queue after this long. */
  expireInSeconds: number;
  retryLimit: number;
  /** First retry delay; later ones back off exponentially. */
  retryDelaySeconds: number;
  /** How often pg-boss looks for expired jobs. */
  maintenanceIntervalSeconds: number;
  pollingIntervalSeconds: number;
}

export const DEFAULT_QUEUE_SETTINGS: QueueSettings = {
  expireInSeconds: 15 * 60,
  retryLimit: 4,
  retryDelaySeconds: 30,
  maintenanceIntervalSeconds: 60,
  pollingIntervalSeconds: 2,
};

/**
 * The PostgreSQL-backed job queue (pg-boss) shared by every worker on every machine that reaches
 * the same database. Returns a started instance with the forecast queue created.
 */
export async function startQueue(connectionString: string, settings: QueueSettings = DEFAULT_QUEUE_SETTINGS, onError: (error: Error) => void = () => {}): Promise<PgBoss> {
  const boss = new PgBoss({
    connectionString,
    schema: 'pgboss',
    max: 4,
    application_name: 'planktide-queue',
    maintenanceIntervalSeconds: settings.maintenanceIntervalSeconds,
    monitorStateIntervalSeconds: Math.max(settings.maintenanceIntervalSeconds, 10),
  });
  boss.on('error', onError);
  await boss.start();
  const queue = {
    name: FORECAST_QUEUE,
    retryLimit: settings.retryLimit,
    retryDelay: settings.retryDelaySeconds,
    retryBackoff: true,
    expireInSeconds: settings.expireInSeconds,
  };
  for (const name of [FORECAST_QUEUE, SITE_QUEUE]) {
    await boss.createQueue(name, { ...queue, name });
    await boss.updateQueue(name, { ...queue, name });
  }
  return boss;
}

/** Puts a run on the queue; the run id is the singleton key, so it is queued at most once at a time. */
export async function enqueueRun(boss: PgBoss, runId: string): Promise<void> {
  await boss.send(FORECAST_QUEUE, { runId } satisfies ForecastJobData, { singletonKey: runId });
}
