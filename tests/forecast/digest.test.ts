import { DateTime } from 'luxon';
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { prepareSiteRuns } from '../../server/forecasts/prepare-runs.ts';
import { startQueue } from '../../server/forecasts/queue.ts';
import { runForecastJob } from '../../server/forecasts/run-forecast.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { sendDueDigests } from '../../server/mail/digest.ts';
import { createMailer, type Mailer } from '../../server/mail/mailer.ts';
import { saveMailSettings } from '../../server/mail/mail-settings.repository.ts';
import { startSmtpStandIn, type SmtpStandIn } from '../../server/mail/smtp-standin.ts';
import type { ForecastWindowDto } from '../../shared/schemas/forecast.schema.ts';
import { insertForecastSite, insertOrganisation, waitFor } from '../helpers/forecast-fixture.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

describe('the daily digest e-mail', () => {
  let database: TestDatabase;
  let boss: PgBoss;
  let smtp: SmtpStandIn;
  let mailer: Mailer;
  let userId: string;
  const forecastStart = Date.parse('2026-12-10T03:00:00Z');

  beforeAll(async () => {
    database = await createTestDatabase();
    boss = await startQueue(database.url, { expireInSeconds: 60, retryLimit: 1, retryDelaySeconds: 1, maintenanceIntervalSeconds: 5, pollingIntervalSeconds: 1 });
    smtp = await startSmtpStandIn(0);
    mailer = createMailer(smtp.url, 'Planktide <digest@planktide.invalid>');
    const db = database.db;
    const org = await insertOrganisation(db);
    const site = await insertForecastSite(db, org, { name: 'Nordvik longlines', timeZone: 'Europe/Oslo' });
    const user = await db.insertInto('users').values({ email: 'ines@fjordline.test', display_name: 'Ines' }).returning('id').executeTakeFirstOrThrow();
    userId = user.id;
    await db.insertInto('memberships').values({ organisation_id: org, user_id: user.id, role: 'manager' }).execute();
    // The reader travels: her digest comes at 06:30 in Tokyo, not in the site's zone.
    await saveMailSettings(db, user.id, { digestEnabled: true, digestLocalTime: '06:30', timeZone: 'Asia/Tokyo', alertsEnabled: true });
    const tides = siteTideSource({ db });
    const [runId] = await prepareSiteRuns({ db, boss, tides }, { organisationId: org, siteId: site.siteId, forecastStartMs: forecastStart, trigger: 'schedule' });
    expect(await runForecastJob({ db, tides }, runId!)).toBe('done');
  }, 60_000);

  afterAll(async () => {
    mailer.close();
    await smtp.close();
    await boss.stop({ graceful: false, wait: true });
    await database.drop();
  });

  it('is not sent before the reader\'s local digest time', async () => {
    // 06:00 in Tokyo (UTC+9) is 21:00 UTC the evening before.
    expect(await sendDueDigests({ db: database.db, mailer, appBaseUrl: 'http://127.0.0.1:9999' }, Date.parse('2026-12-10T21:00:00Z'))).toBe(0);
  });

  it('arrives once at the SMTP stand-in and shows the next windows in the reader\'s time zone', async () => {
    const now = Date.parse('2026-12-10T21:45:00Z'); // 06:45 on 11 Dec in Tokyo
    const deps = { db: database.db, mailer, appBaseUrl: 'http://127.0.0.1:9999' };
    expect(await sendDueDigests(deps, now)).toBe(1);
    expect(await sendDueDigests(deps, now + 60_000)).toBe(0);
    const mail = await waitFor('the digest', async () => smtp.messages().find((m) => m.to.includes('ines@fjordline.test')));
    expect(mail.subject).toBe('Planktide: your sites on Fri 11 Dec');
    expect(mail.text).toContain('Times are in Asia/Tokyo (GMT+9)');
    expect(mail.text).toContain('Nordvik longlines');

    const stored = await database.db.selectFrom('forecasts').select('windows').executeTakeFirstOrThrow();
    const next = (stored.windows as ForecastWindowDto[]).filter((w) => w.endMs > now && w.startMs < now + 86_400_000);
    expect(next.length).toBeGreaterThan(0);
    const slack = next.find((w) => w.kind === 'slack')!;
    const tokyo = (ms: number) => DateTime.fromMillis(ms, { zone: 'Asia/Tokyo' }).toFormat('ccc d LLL HH:mm');
    expect(mail.text).toContain(`Slack water: ${tokyo(slack.startMs)} to ${tokyo(slack.endMs)}`);
    expect(mail.html).toContain('Unsubscribe');
    expect(mail.text).toMatch(/not official results/);
    const token = /unsubscribe\/([A-Za-z0-9_-]+)/.exec(mail.text)![1]!;
    const row = await database.db.selectFrom('mail_settings').select('unsubscribe_token').where('user_id', '=', userId).executeTakeFirstOrThrow();
    expect(token).toBe(row.unsubscribe_token);
  });
});
