import { randomBytes } from 'node:crypto';
import type { MailSettings } from '../../shared/schemas/forecast.schema.ts';
import type { Db } from '../db/connect.ts';

/** A user's mail settings, created with defaults (digest 06:30 in the zone of their first site) on first use. */
export async function mailSettingsOf(db: Db, userId: string): Promise<MailSettings & { unsubscribeToken: string }> {
  let row = await db.selectFrom('mail_settings').selectAll().where('user_id', '=', userId).executeTakeFirst();
  if (!row) {
    const site = await db
      .selectFrom('sites as s')
      .innerJoin('memberships as m', 'm.organisation_id', 's.organisation_id')
      .select('s.time_zone')
      .where('m.user_id', '=', userId)
      .orderBy('s.created_at')
      .limit(1)
      .executeTakeFirst();
    await db
      .insertInto('mail_settings')
      .values({ user_id: userId, time_zone: site?.time_zone ?? 'UTC', unsubscribe_token: randomBytes(24).toString('base64url') })
      .onConflict((oc) => oc.column('user_id').doNothing())
      .execute();
    row = await db.selectFrom('mail_settings').selectAll().where('user_id', '=', userId).executeTakeFirstOrThrow();
  }
  return { digestEnabled: row.digest_enabled, digestLocalTime: row.digest_local_time, timeZone: row.time_zone, alertsEnabled: row.alerts_enabled, unsubscribeToken: row.unsubscribe_token };
}

export async function saveMailSettings(db: Db, userId: string, settings: MailSettings): Promise<void> {
  await mailSettingsOf(db, userId);
  await db
    .updateTable('mail_settings')
    .set({ digest_enabled: settings.digestEnabled, digest_local_time: settings.digestLocalTime, time_zone: settings.timeZone, alerts_enabled: settings.alertsEnabled })
    .where('user_id', '=', userId)
    .execute();
}

/** Turns off every mail for the token's user; returns whether the token was known. */
export async function unsubscribe(db: Db, token: string): Promise<boolean> {
  const result = await db.updateTable('mail_settings').set({ digest_enabled: false, alerts_enabled: false }).where('unsubscribe_token', '=', token).executeTakeFirst();
  return Number(result.numUpdatedRows) > 0;
}
