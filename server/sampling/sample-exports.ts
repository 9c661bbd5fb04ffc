import { createEvents, type EventAttributes } from 'ics';
import { DateTime } from 'luxon';
import Papa from 'papaparse';
import type { PlannedSample } from '../../shared/schemas/sampling.schema.ts';
import type { SampleWithSite } from './sampling.repository.ts';

const CAUTION = 'Planktide gives model estimates, not official results: it never replaces official biotoxin testing or closures; never harvest from a closed area; local regulation and licensed practice come first; a slack window is not a dive plan.';

const metres = (m: number) => `${Number(m.toFixed(2))} m`;

/** "bottle at 17.5 m below surface" or "hose 0–10 m below surface". */
export function depthText(sample: Pick<PlannedSample, 'method' | 'depthM' | 'topM' | 'bottomM'>): string {
  if (sample.method === 'bottle') return `bottle at ${metres(sample.depthM ?? 0)} below surface`;
  return `hose ${Number((sample.topM ?? 0).toFixed(2))}–${metres(sample.bottomM ?? 0)} below surface`;
}

/** Site-local clock time with the zone's name and UTC offset, e.g. "Tue 1 Dec 2026 14:20 Europe/London (UTC+0)". */
export function localTimeText(iso: string, zone: string): string {
  const dt = DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone);
  return `${dt.toFormat('ccc d LLL yyyy HH:mm')} ${zone} (UTC${dt.toFormat('ZZ')})`;
}

/** A stable UID per sample, so calendar programs update the event instead of adding another. */
export const sampleUid = (id: string) => `${id}@planktide.sampling`;

/** The plan as an RFC 5545 calendar: times in UTC; each description names the site's zone and local time. */
export function samplesCalendar(samples: SampleWithSite[], calName: string): string {
  const events: EventAttributes[] = samples.map(({ dto, latitudeDeg, longitudeDeg }) => {
    const start = Date.parse(dto.plannedAt);
    const taken = dto.takenAt ? `Taken ${localTimeText(dto.takenAt, dto.timeZone)}${dto.takenBy ? ` by ${dto.takenBy.displayName}` : ''}.` : 'Not taken yet.';
    const description = [
      `Site-local time: ${localTimeText(dto.plannedAt, dto.timeZone)}. Site time zone: ${dto.timeZone}.`,
      `Method: ${depthText(dto)}.`,
      dto.reason ? `Why: ${dto.reason}` : '',
      taken,
      dto.notes ? `Notes: ${dto.notes}` : '',
      CAUTION,
    ]
      .filter(Boolean)
      .join('\n');
    return {
      uid: sampleUid(dto.id),
      start,
      startInputType: 'utc',
      startOutputType: 'utc',
      duration: { minutes: 30 },
      title: `${dto.takenAt ? '[taken] ' : ''}Sample ${depthText(dto)}: ${dto.siteName}`,
      description,
      location: dto.siteName,
      geo: { lat: latitudeDeg, lon: longitudeDeg },
      status: 'CONFIRMED',
      categories: ['Planktide', 'sampling'],
      lastModified: Date.parse(dto.updatedAt),
      productId: 'planktide/sampling-plan',
      calName,
    };
  });
  const { error, value } = createEvents(events, { productId: 'planktide/sampling-plan', calName, method: 'PUBLISH' });
  if (error || value === null) throw error ?? new Error('The calendar could not be made.');
  return value;
}

const CSV_FIELDS = [
  'sample_id',
  'site',
  'time_utc',
  'time_local',
  'time_zone',
  'method',
  'depth_m_below_surface',
  'top_m_below_surface',
  'bottom_m_below_surface',
  'reason',
  'forecast_id',
  'status',
  'taken_at_utc',
  'taken_by',
  'notes',
] as const;

/** The plan as RFC 4180 CSV (CRLF line ends, fields quoted when they need it). */
export function samplesCsv(samples: PlannedSample[]): string {
  const rows = samples.map((s) => [
    s.id,
    s.siteName,
    s.plannedAt,
    DateTime.fromISO(s.plannedAt, { zone: 'utc' }).setZone(s.timeZone).toISO({ suppressMilliseconds: true }) ?? '',
    s.timeZone,
    s.method,
    s.depthM ?? '',
    s.topM ?? '',
    s.bottomM ?? '',
    s.reason,
    s.forecastId ?? '',
    s.takenAt ? 'taken' : 'planned',
    s.takenAt ?? '',
    s.takenBy?.displayName ?? '',
    s.notes ?? '',
  ]);
  return `${Papa.unparse({ fields: [...CSV_FIELDS], data: rows }, { newline: '\r\n', quotes: false, escapeFormulae: true })}\r\n`;
}
