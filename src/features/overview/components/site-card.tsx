import { DateTime } from 'luxon';
import { Link } from 'react-router-dom';
import type { ForecastWindowDto } from '../../../../shared/schemas/forecast.schema.ts';
import type { OverviewSite } from '../../../../shared/schemas/sampling.schema.ts';

const KIND_COLOURS: Record<ForecastWindowDto['kind'], string> = {
  slack: 'var(--color-tide-500)',
  slump: 'var(--color-ember-600)',
  mixed: 'var(--color-kelp-500)',
  subsurface_peak: 'var(--color-alarm-600)',
};
const KIND_NAMES: Record<ForecastWindowDto['kind'], string> = { slack: 'slack', slump: 'slump', mixed: 'mixed', subsurface_peak: 'layer' };

const clock = (ms: number, zone: string) => DateTime.fromMillis(ms, { zone }).setLocale('en-GB').toFormat('ccc HH:mm ZZZZ');
const ago = (iso: string) => DateTime.fromISO(iso).toRelative({ locale: 'en-GB' }) ?? iso;

/** Today and tomorrow (site-local) on one line per organism: slack, slump, mixed and layer windows. */
function Timeline({ site, nowMs }: { site: OverviewSite; nowMs: number }) {
  const start = Date.parse(site.todayStart);
  const end = Date.parse(site.tomorrowEnd);
  const pct = (ms: number) => `${(Math.min(1, Math.max(0, (ms - start) / (end - start))) * 100).toFixed(2)}%`;
  const midnight = DateTime.fromMillis(start, { zone: site.timeZone }).plus({ days: 1 }).toMillis();
  const rows = site.forecasts.map((f) => ({ label: f.profileName, windows: f.windows }));
  const hours = [6, 12, 18].flatMap((h) => [0, 1].map((d) => DateTime.fromMillis(start, { zone: site.timeZone }).plus({ days: d }).set({ hour: h }).toMillis()));
  return (
    <div className="mt-2 space-y-1" aria-label={`Windows today and tomorrow at ${site.name}, ${site.timeZone}`} role="group">
      <div className="relative h-4 text-[10px] text-ink-soft">
        <span className="absolute left-0">Today</span>
        <span className="absolute" style={{ left: pct(midnight) }}>
          Tomorrow
        </span>
      </div>
      {rows.map((row) => (
        <div key={row.label} className="flex items-center gap-2">
          <span className="w-32 shrink-0 truncate text-xs sm:w-44" title={row.label}>
            {row.label}
          </span>
          <div className="relative h-5 flex-1 overflow-hidden rounded bg-tide-50">
            {hours.map((h) => (
              <span key={h} className="absolute top-0 h-full border-l border-line" style={{ left: pct(h) }} aria-hidden="true" />
            ))}
            <span className="absolute top-0 h-full border-l-2 border-ink-soft" style={{ left: pct(midnight) }} aria-hidden="true" />
            {row.windows
              .filter((w) => w.kind !== 'subsurface_peak' || w.strength > 0)
              .map((w) => (
                <span
                  key={`${w.kind}-${w.startMs}`}
                  className="absolute rounded-sm"
                  style={{ left: pct(w.startMs), width: `calc(${pct(w.endMs)} - ${pct(w.startMs)})`, minWidth: 2, background: KIND_COLOURS[w.kind], top: w.kind === 'slack' ? 0 : w.kind === 'slump' ? '25%' : w.kind === 'mixed' ? '50%' : '75%', height: '25%' }}
                  title={`${KIND_NAMES[w.kind]} ${clock(w.startMs, site.timeZone)} to ${clock(w.endMs, site.timeZone)}`}
                />
              ))}
            <span className="absolute top-0 h-full border-l-2 border-alarm-600" style={{ left: pct(nowMs) }} title="now" aria-hidden="true" />
          </div>
        </div>
      ))}
      <ul className="flex flex-wrap gap-3 text-[11px] text-ink-soft" aria-hidden="true">
        {(Object.keys(KIND_COLOURS) as ForecastWindowDto['kind'][]).map((k) => (
          <li key={k} className="flex items-center gap-1">
            <span className="inline-block h-2 w-3 rounded-sm" style={{ background: KIND_COLOURS[k] }} /> {KIND_NAMES[k]}
          </li>
        ))}
        <li className="flex items-center gap-1">
          <span className="inline-block h-3 border-l-2 border-alarm-600" /> now
        </li>
      </ul>
    </div>
  );
}

export interface SiteBasics {
  id: string;
  name: string;
  timeZone: string;
  waterDepthM: number;
  gearTopM: number;
  gearBottomM: number;
}

const fmt = (n: number) => n.toLocaleString('en-GB', { maximumFractionDigits: 1 });

function Heading({ orgId, base }: { orgId: string; base: SiteBasics }) {
  return (
    <div>
      <h3 id={`site-${base.id}`} className="text-lg font-bold">
        <Link className="text-tide-700 underline" to={`/o/${orgId}/sites/${base.id}/forecast`}>
          {base.name}
        </Link>
      </h3>
      <p className="text-xs text-ink-soft">
        {fmt(base.waterDepthM)} m deep · gear {fmt(base.gearTopM)}–{fmt(base.gearBottomM)} m below surface · {base.timeZone}
      </p>
    </div>
  );
}

/** One site on the overview: windows of today and tomorrow, next slack and slump, alerts, forecast age. */
export function SiteCard({ orgId, base, site, nowMs, unlocked }: { orgId: string; base: SiteBasics; site: OverviewSite | undefined; nowMs: number; unlocked: boolean | undefined }) {
  if (!site) {
    return (
      <li className="rounded-lg border border-line bg-white p-4" aria-labelledby={`site-${base.id}`}>
        <Heading orgId={orgId} base={base} />
        <p className="mt-2 text-sm text-ink-soft">{unlocked === undefined ? 'Loading forecasts…' : 'No forecast information.'}</p>
      </li>
    );
  }
  const first = site.forecasts[0];
  const nextSlack = site.forecasts.map((f) => f.nextSlack).find(Boolean) ?? null;
  const slumps = site.forecasts.flatMap((f) => (f.nextSlump ? [{ w: f.nextSlump, name: f.profileName }] : [])).sort((a, b) => a.w.startMs - b.w.startMs);
  const oldest = site.forecasts.map((f) => f.createdAt).sort()[0];
  return (
    <li className="rounded-lg border border-line bg-white p-4" aria-labelledby={`site-${site.id}`}>
      <Heading orgId={orgId} base={base} />
      {!unlocked ? (
        <p className="mt-2 text-sm text-ink-soft">Forecasts are locked until the organisation subscribes.</p>
      ) : !first ? (
        <p className="mt-2 text-sm text-ink-soft">No forecast yet for this site.</p>
      ) : (
        <>
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
            <dt className="text-ink-soft">Next slack</dt>
            <dd>{nextSlack ? `${clock(nextSlack.peakMs, site.timeZone)} (${clock(nextSlack.startMs, site.timeZone)}–${DateTime.fromMillis(nextSlack.endMs, { zone: site.timeZone }).toFormat('HH:mm')})` : 'none forecast'}</dd>
            <dt className="text-ink-soft">Next slump</dt>
            <dd>{slumps[0] ? `${clock(slumps[0].w.startMs, site.timeZone)}, ${slumps[0].name}` : 'none forecast'}</dd>
            <dt className="text-ink-soft">Forecast age</dt>
            <dd>{oldest ? `made ${ago(oldest)}` : ''}</dd>
            <dt className="text-ink-soft">Samples today</dt>
            <dd>{site.plannedToday} planned</dd>
          </dl>
          <Timeline site={site} nowMs={nowMs} />
        </>
      )}
      {site.openAlerts.length > 0 && (
        <ul className="mt-2 space-y-1 text-sm" aria-label={`Open alerts at ${site.name}`}>
          {site.openAlerts.map((a) => (
            <li key={a.id} className="rounded bg-ember-100 px-2 py-1">
              <strong>Alert:</strong> {a.message}
            </li>
          ))}
        </ul>
      )}
    </li>
  );
}
