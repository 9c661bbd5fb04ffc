import { DateTime } from 'luxon';
import type { ForecastWindowDto } from '../../shared/schemas/forecast.schema.ts';
import type { Db } from '../db/connect.ts';
import type { Mailer } from './mailer.ts';
import { mailSettingsOf } from './mail-settings.repository.ts';

const KIND_WORDS: Record<string, string> = {
  slack: 'Slack water',
  slump: 'Cells settled near the bed',
  mixed: 'Well mixed (representative sampling)',
  subsurface_peak: 'Layer below the surface',
};

const CAUTION =
  'Planktide gives model estimates, not official results. It never replaces official biotoxin testing or closures; never harvest from a closed area; local regulation and licensed practice come first. A slack window is not a dive plan.';

export interface DigestDeps {
  db: Db;
  mailer: Mailer;
  appBaseUrl: string;
  /** Told of each digest that could not be sent now; it stays due and is tried at the next tick. */
  onMailFailed?: (to: string, error: unknown) => void;
}

interface SiteDigest {
  siteName: string;
  siteZone: string;
  profileName: string;
  madeAt: Date;
  windows: ForecastWindowDto[];
}

const escape = (text: string) => text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

async function digestItems(db: Db, userId: string, fromMs: number, toMs: number): Promise<SiteDigest[]> {
  const rows = await db
    .selectFrom('forecasts as f')
    .innerJoin('sites as s', 's.id', 'f.site_id')
    .innerJoin('memberships as m', 'm.organisation_id', 'f.organisation_id')
    .innerJoin('organism_profile_versions as v', 'v.id', 'f.profile_version_id')
    .innerJoin('organism_profiles as p', 'p.id', 'v.profile_id')
    .select(['s.id as site_id', 's.name as site_name', 's.time_zone', 'p.id as profile_id', 'p.name as profile_name', 'f.created_at', 'f.windows', 'f.forecast_start'])
    .where('m.user_id', '=', userId)
    .where('s.archived_at', 'is', null)
    .orderBy('s.name')
    .orderBy('p.name')
    .orderBy('f.forecast_start', 'desc')
    .execute();
  const seen = new Set<string>();
  const items: SiteDigest[] = [];
  for (const r of rows) {
    const key = `${r.site_id}:${r.profile_id}`;
    if (seen.has(key)) continue; // only the newest forecast of each site and organism
    seen.add(key);
    const windows = (r.windows as ForecastWindowDto[]).filter((w) => w.endMs > fromMs && w.startMs < toMs);
    items.push({ siteName: r.site_name, siteZone: r.time_zone, profileName: r.profile_name, madeAt: r.created_at, windows });
  }
  return items;
}

/** The digest for one user: the next 24 h of windows of their sites, in the user's own time zone. */
export function composeDigest(input: { name: string; zone: string; nowMs: number; items: SiteDigest[]; alerts: { siteName: string; message: string }[]; settingsUrl: string; unsubscribeUrl: string }) {
  const local = (ms: number) => DateTime.fromMillis(ms, { zone: input.zone }).toFormat('ccc d LLL HH:mm');
  const zoneLabel = `${input.zone} (${DateTime.fromMillis(input.nowMs, { zone: input.zone }).toFormat('ZZZZ')})`;
  const text: string[] = [`Good morning ${input.name},`, '', `Your Planktide forecasts for the next 24 hours. Times are in ${zoneLabel}.`, ''];
  const html: string[] = [`<p>Good morning ${escape(input.name)},</p><p>Your Planktide forecasts for the next 24 hours. Times are in <strong>${escape(zoneLabel)}</strong>.</p>`];
  if (input.alerts.length) {
    text.push('ALERTS');
    html.push('<h2>Alerts</h2><ul>');
    for (const a of input.alerts) {
      text.push(`- ${a.siteName}: ${a.message}`);
      html.push(`<li><strong>${escape(a.siteName)}</strong>: ${escape(a.message)}</li>`);
    }
    text.push('');
    html.push('</ul>');
  }
  for (const item of input.items) {
    const ageH = Math.max(0, Math.round((input.nowMs - item.madeAt.getTime()) / 3_600_000));
    text.push(`${item.siteName} · ${item.profileName} (forecast made ${ageH} h ago)`);
    html.push(`<h2>${escape(item.siteName)} · ${escape(item.profileName)}</h2><p>Forecast made ${ageH} h ago.</p><ul>`);
    if (item.windows.length === 0) {
      text.push('  No windows in the next 24 hours.');
      html.push('<li>No windows in the next 24 hours.</li>');
    }
    for (const w of item.windows) {
      const line = `${KIND_WORDS[w.kind] ?? w.kind}: ${local(w.startMs)} to ${local(w.endMs)}, peak ${local(w.peakMs)}${w.peakDepthM !== undefined ? ` at ${w.peakDepthM.toFixed(1)} m below surface` : ''}`;
      text.push(`  - ${line}`);
      html.push(`<li>${escape(line)}</li>`);
    }
    text.push('');
    html.push('</ul>');
  }
  text.push(CAUTION, '', `Change your mail settings: ${input.settingsUrl}`, `Unsubscribe from all Planktide mail: ${input.unsubscribeUrl}`);
  html.push(`<p style="color:#6b5a2e">${escape(CAUTION)}</p><p><a href="${escape(input.settingsUrl)}">Mail settings</a> · <a href="${escape(input.unsubscribeUrl)}">Unsubscribe</a></p>`);
  return { text: text.join('\n'), html: `<!doctype html><html><body style="font-family:'Nunito Sans',system-ui,sans-serif;color:#1c2b3a">${html.join('')}</body></html>` };
}

/**
 * Sends each user's daily digest once, at or after their chosen local time. The day's mail_log row is
 * claimed in the transaction that sends, so two schedulers send it once and a failed send is tried
 * again at the next tick. Returns the number of digests sent.
 */
export async function sendDueDigests(deps: DigestDeps, nowMs: number): Promise<number> {
  const users = await deps.db.selectFrom('users as u').innerJoin('memberships as m', 'm.user_id', 'u.id').select(['u.id', 'u.email', 'u.display_name']).distinct().execute();
  let sent = 0;
  for (const user of users) {
    const settings = await mailSettingsOf(deps.db, user.id);
    if (!settings.digestEnabled) continue;
    const now = DateTime.fromMillis(nowMs, { zone: settings.timeZone });
    const [hour = 6, minute = 30] = settings.digestLocalTime.split(':').map(Number);
    if (now < now.set({ hour, minute, second: 0, millisecond: 0 })) continue;
    const items = await digestItems(deps.db, user.id, nowMs, nowMs + 24 * 3_600_000);
    if (items.length === 0) continue;
    const alerts = await deps.db
      .selectFrom('alerts as a')
      .innerJoin('sites as s', 's.id', 'a.site_id')
      .innerJoin('memberships as m', 'm.organisation_id', 'a.organisation_id')
      .select(['s.name as siteName', 'a.message'])
      .where('m.user_id', '=', user.id)
      .where('a.acknowledged_at', 'is', null)
      .execute();
    const key = `digest:${user.id}:${now.toISODate()}`;
    try {
      const didSend = await deps.db.transaction().execute(async (trx) => {
        const claimed = await trx.insertInto('mail_log').values({ user_id: user.id, kind: 'digest', dedupe_key: key }).onConflict((oc) => oc.column('dedupe_key').doNothing()).returning('id').executeTakeFirst();
        if (!claimed) return false;
        const body = composeDigest({
          name: user.display_name,
          zone: settings.timeZone,
          nowMs,
          items,
          alerts,
          settingsUrl: `${deps.appBaseUrl}/account`,
          unsubscribeUrl: `${deps.appBaseUrl}/api/mail/unsubscribe/${settings.unsubscribeToken}`,
        });
        await deps.mailer.send({ to: user.email, subject: `Planktide: your sites on ${now.toFormat('ccc d LLL')}`, ...body });
        return true;
      });
      if (didSend) sent++;
    } catch (error) {
      // Nothing was claimed: the digest stays due for the next tick.
      deps.onMailFailed?.(user.email, error);
    }
  }
  return sent;
}
