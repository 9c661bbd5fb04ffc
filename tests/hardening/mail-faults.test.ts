import net from 'node:net';
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { notifyOnStored, retryAlertMails } from '../../server/forecasts/notify.ts';
import { prepareSiteRuns } from '../../server/forecasts/prepare-runs.ts';
import { startQueue } from '../../server/forecasts/queue.ts';
import { runForecastJob } from '../../server/forecasts/run-forecast.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { sendDueDigests } from '../../server/mail/digest.ts';
import { createMailer } from '../../server/mail/mailer.ts';
import { saveMailSettings } from '../../server/mail/mail-settings.repository.ts';
import { startSmtpStandIn, type SmtpStandIn } from '../../server/mail/smtp-standin.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { insertForecastSite, insertOrganisation, SINKING_DIATOM } from '../helpers/forecast-fixture.ts';
import { freePort } from '../helpers/free-port.ts';
import { startTeamWorld } from '../helpers/team-world.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

const FROM = 'Planktide <alerts@planktide.invalid>';
/** Short, so that a slow mail service fails a send quickly in tests (the product's default is 10 s). */
const TIMEOUT_MS = 400;

/** A mail service that accepts the connection and never says a word (a hung or overloaded server). */
async function silentSmtp(port: number): Promise<net.Server> {
  const sockets = new Set<net.Socket>();
  const server = net.createServer((socket) => {
    sockets.add(socket);
    socket.on('close', () => sockets.delete(socket));
  });
  await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', resolve));
  const close = server.close.bind(server);
  server.close = (callback) => {
    for (const socket of sockets) socket.destroy();
    return close(callback);
  };
  return server;
}

describe('the mail service down or slow', () => {
  let database: TestDatabase;
  let boss: PgBoss;
  let smtpPort: number;
  let organisationId: string;
  let forecastId: string;
  const failures: string[] = [];
  const mailer = () => createMailer(`smtp://127.0.0.1:${smtpPort}`, FROM, { timeoutMs: TIMEOUT_MS });
  const deps = () => ({ db: database.db, mailer: mailer(), appBaseUrl: 'http://127.0.0.1:3000', onMailFailed: (to: string) => failures.push(to) });
  const forecastStart = Date.parse('2026-12-10T03:00:00Z');

  beforeAll(async () => {
    database = await createTestDatabase();
    boss = await startQueue(database.url, { expireInSeconds: 60, retryLimit: 1, retryDelaySeconds: 1, maintenanceIntervalSeconds: 5, pollingIntervalSeconds: 1 });
    smtpPort = await freePort(); // nothing listens there yet: the mail service is down
    const db = database.db;
    organisationId = await insertOrganisation(db, 'Skerry Oysters');
    // A trigger far below the starting concentration: the forecast raises an alert.
    const site = await insertForecastSite(db, organisationId, { name: 'Skerry sound', timeZone: 'Europe/Dublin', params: { ...SINKING_DIATOM, triggerCellsPerL: 100 } });
    const user = await db.insertInto('users').values({ email: 'aoife@skerry.test', display_name: 'Aoife' }).returning('id').executeTakeFirstOrThrow();
    await db.insertInto('memberships').values({ organisation_id: organisationId, user_id: user.id, role: 'manager' }).execute();
    await saveMailSettings(db, user.id, { digestEnabled: true, digestLocalTime: '00:00', timeZone: 'Europe/Dublin', alertsEnabled: true });
    const tides = siteTideSource({ db });
    const [runId] = await prepareSiteRuns({ db, boss, tides }, { organisationId, siteId: site.siteId, forecastStartMs: forecastStart, trigger: 'schedule' });
    // The alert mail fails (mail service down): the forecast is still stored and its run done.
    expect(await runForecastJob({ db, tides, onStored: notifyOnStored(deps()) }, runId!)).toBe('done');
    const run = await db.selectFrom('forecast_runs').select(['status', 'error']).where('id', '=', runId!).executeTakeFirstOrThrow();
    expect(run).toEqual({ status: 'done', error: null });
    forecastId = (await db.selectFrom('forecasts').select('id').where('run_id', '=', runId!).executeTakeFirstOrThrow()).id;
  }, 90_000);
  afterAll(async () => {
    await boss?.stop({ graceful: false, wait: true });
    await database?.drop();
  });

  it('records the alert in the app even though its mail could not be sent, and claims no mail', async () => {
    const alerts = await database.db.selectFrom('alerts').select(['forecast_id', 'kind']).where('organisation_id', '=', organisationId).execute();
    expect(alerts).toEqual([{ forecast_id: forecastId, kind: 'gear_trigger' }]);
    expect(failures).toContain('aoife@skerry.test');
    expect(await database.db.selectFrom('mail_log').select('id').where('kind', '=', 'alert').execute()).toEqual([]);
  });

  it('gives up on a silent mail service after the timeout and keeps the mail for later', async () => {
    const silent = await silentSmtp(smtpPort);
    try {
      failures.length = 0;
      expect(await retryAlertMails(deps(), Date.now())).toBe(0);
      expect(failures).toEqual(['aoife@skerry.test']);
      expect(await database.db.selectFrom('mail_log').select('id').where('kind', '=', 'alert').execute()).toEqual([]);
      // The digest that is due is not sent either, and the tick goes on without throwing.
      expect(await sendDueDigests(deps(), forecastStart + 3_600_000)).toBe(0);
    } finally {
      await new Promise((resolve) => silent.close(resolve));
    }
  });

  it('sends the alert and the digest once the mail service is back, exactly once', async () => {
    let smtp: SmtpStandIn | undefined;
    try {
      smtp = await startSmtpStandIn(smtpPort);
      expect(await retryAlertMails(deps(), Date.now())).toBe(1);
      expect(await sendDueDigests(deps(), forecastStart + 3_600_000)).toBe(1);
      expect(await retryAlertMails(deps(), Date.now())).toBe(0);
      expect(await sendDueDigests(deps(), forecastStart + 3_600_000)).toBe(0);
      const subjects = smtp.messages().map((m) => m.subject);
      expect(subjects.filter((s) => s === 'Planktide alert: Skerry sound')).toHaveLength(1);
      expect(subjects.filter((s) => s.startsWith('Planktide: your sites on'))).toHaveLength(1);
      expect(smtp.messages()[0]!.to).toEqual(['aoife@skerry.test']);
    } finally {
      await smtp?.close();
    }
  });
});

describe('an invitation while the mail service is slow', () => {
  it('answers 503 after the timeout, saying the mail could not be sent, and saves nothing', async () => {
    const port = await freePort();
    const silent = await silentSmtp(port);
    const world = await startTeamWorld({ mailer: createMailer(`smtp://127.0.0.1:${port}`, FROM, { timeoutMs: TIMEOUT_MS }) });
    try {
      const before = await world.database.db.selectFrom('invitations').select('id').execute();
      const owner = await world.as('ownerA');
      const answer = await owner.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/invitations`, { email: 'slow@alder.test', role: 'crew' });
      expect(answer.status).toBe(503);
      expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/could not be sent, so no invitation was made/);
      expect(await world.database.db.selectFrom('invitations').select('id').execute()).toHaveLength(before.length);
    } finally {
      await world.close();
      await new Promise((resolve) => silent.close(resolve));
    }
  }, 60_000);
});
