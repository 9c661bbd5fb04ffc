import { DateTime } from 'luxon';
import type { DayAdvice } from '../../shared/forecast/advice.ts';
import type { Db } from '../db/connect.ts';
import type { Mailer } from '../mail/mailer.ts';
import { mailSettingsOf } from '../mail/mail-settings.repository.ts';

export interface NotifyDeps {
  db: Db;
  mailer?: Mailer;
  appBaseUrl: string;
  /** Told of each alert mail that could not be sent now (it is tried again by retryAlertMails). */
  onMailFailed?: (to: string, error: unknown) => void;
}

/** Alerts younger than this whose mail could not be sent are tried again. */
const ALERT_MAIL_RETRY_MS = 24 * 3_600_000;

/**
 * Mails an alert to each member of its organisation who wants alerts and has not had it yet. Safe to
 * call again: each mail is claimed in mail_log in the same transaction that sends it, so a mail that
 * could not be sent (mail service down or slow) stays unclaimed for the next try, and one that was
 * sent is never sent twice. Returns how many were sent.
 */
export async function mailAlert(deps: NotifyDeps, alertId: string): Promise<number> {
  if (!deps.mailer) return 0;
  const mailer = deps.mailer;
  const alert = await deps.db
    .selectFrom('alerts as a')
    .innerJoin('sites as s', 's.id', 'a.site_id')
    .select(['a.id', 'a.organisation_id', 'a.message', 's.name'])
    .where('a.id', '=', alertId)
    .executeTakeFirst();
  if (!alert) return 0;
  const members = await deps.db.selectFrom('memberships as m').innerJoin('users as u', 'u.id', 'm.user_id').select(['u.id', 'u.email']).where('m.organisation_id', '=', alert.organisation_id).execute();
  let sent = 0;
  for (const member of members) {
    const settings = await mailSettingsOf(deps.db, member.id);
    if (!settings.alertsEnabled) continue;
    try {
      const didSend = await deps.db.transaction().execute(async (trx) => {
        const claimed = await trx
          .insertInto('mail_log')
          .values({ user_id: member.id, kind: 'alert', dedupe_key: `alert:${alert.id}:${member.id}` })
          .onConflict((oc) => oc.column('dedupe_key').doNothing())
          .returning('id')
          .executeTakeFirst();
        if (!claimed) return false;
        await mailer.send({
          to: member.email,
          subject: `Planktide alert: ${alert.name}`,
          text: `${alert.message}\n\nOpen Planktide: ${deps.appBaseUrl}/\nUnsubscribe: ${deps.appBaseUrl}/api/mail/unsubscribe/${settings.unsubscribeToken}`,
        });
        return true;
      });
      if (didSend) sent++;
    } catch (error) {
      deps.onMailFailed?.(member.email, error);
    }
  }
  return sent;
}

/** Each scheduler tick: sends the alert mail of the last day that could not be sent before. */
export async function retryAlertMails(deps: NotifyDeps, nowMs: number): Promise<number> {
  const recent = await deps.db
    .selectFrom('alerts')
    .select('id')
    .where('created_at', '>', new Date(nowMs - ALERT_MAIL_RETRY_MS))
    .where('acknowledged_at', 'is', null)
    .execute();
  let sent = 0;
  for (const alert of recent) sent += await mailAlert(deps, alert.id);
  return sent;
}

/**
 * After a forecast is stored: when the gear band's mean crosses the organism's trigger level, an alert
 * is recorded and mailed at once to the members who want alerts (once per forecast and person).
 */
export function notifyOnStored(deps: NotifyDeps): (forecastId: string) => Promise<void> {
  return async (forecastId) => {
    const f = await deps.db
      .selectFrom('forecasts as f')
      .innerJoin('sites as s', 's.id', 'f.site_id')
      .select(['f.id', 'f.organisation_id', 'f.site_id', 'f.inputs', 'f.advice', 's.name', 's.time_zone', 's.gear_top_m', 's.gear_bottom_m'])
      .where('f.id', '=', forecastId)
      .executeTakeFirstOrThrow();
    const inputs = f.inputs as { profile: { name: string; triggerCellsPerL: number } };
    const exposed = (f.advice as DayAdvice[]).flatMap((d) => d.exposure.periods);
    if (exposed.length === 0) return;
    const first = exposed[0]!;
    const hours = exposed.reduce((h, p) => h + (p.endMs - p.startMs) / 3_600_000, 0);
    const when = DateTime.fromMillis(first.startMs, { zone: f.time_zone }).toFormat("ccc d LLL HH:mm ZZZZ");
    const message = `${inputs.profile.name} is forecast above its trigger of ${inputs.profile.triggerCellsPerL} cells/L at the gear band (${f.gear_top_m}–${f.gear_bottom_m} m below surface) for ${hours.toFixed(1)} h, first from ${when}. This is a model estimate: follow official testing and local rules.`;
    const alert = await deps.db
      .insertInto('alerts')
      .values({ organisation_id: f.organisation_id, site_id: f.site_id, forecast_id: f.id, kind: 'gear_trigger', message, starts_at: new Date(first.startMs) })
      .returning('id')
      .executeTakeFirstOrThrow();
    await mailAlert(deps, alert.id);
  };
}
