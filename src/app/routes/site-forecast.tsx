import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import type { ForecastWindowDto } from '../../../shared/schemas/forecast.schema.ts';
import { drawnTimeSpan } from '../../components/charts/heatmap-bins.ts';
import { siteClock } from '../../components/charts/time-axis.ts';
import { FIELD_UNITS, TimeDepthHeatmap, WINDOW_KIND_LABELS, type HeatmapCursor } from '../../components/charts/time-depth-heatmap.tsx';
import { Button } from '../../components/ui/button.tsx';
import { SelectField } from '../../components/ui/field.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { forecastKeys } from '../../features/forecasts/api/forecast-keys.ts';
import { useForecastGrid } from '../../features/forecasts/api/get-forecast-grid.ts';
import { useLatestForecast } from '../../features/forecasts/api/get-latest-forecast.ts';
import { useProfiles, useWatch } from '../../features/forecasts/api/get-watch.ts';
import { useRunNow, useRuns } from '../../features/forecasts/api/runs.ts';
import { AdviceList } from '../../features/forecasts/components/advice-list.tsx';
import { ForecastInputs } from '../../features/forecasts/components/forecast-inputs.tsx';
import { TideStrip } from '../../features/forecasts/components/tide-strip.tsx';
import { useForecastSettings } from '../../features/sampling/api/forecast-settings.ts';
import { AddFromAdviceButton } from '../../features/sampling/components/add-from-advice-button.tsx';
import { ForecastSettingsForm } from '../../features/sampling/components/forecast-settings-form.tsx';
import { useSite } from '../../features/sites/api/get-site.ts';
import { useTidePreview } from '../../features/tides/api/get-tide-preview.ts';
import { ApiError } from '../../lib/api-client.ts';
import { canManage, useOrg } from '../org-context.ts';

type Field = 'concentration' | 'speed' | 'diffusivity';
const FIELD_LABELS: Record<Field, string> = { concentration: 'Concentration', speed: 'Current speed', diffusivity: 'Eddy diffusivity' };
const DEFAULT_SCALE: Record<Field, 'linear' | 'log'> = { concentration: 'log', speed: 'linear', diffusivity: 'log' };
const DAY_MS = 86_400_000;

function RunNow({ orgId, siteId, defaultDays }: { orgId: string; siteId: string; defaultDays: number }) {
  const [days, setDays] = useState(defaultDays);
  const [started, setStarted] = useState<string[]>([]);
  const runNow = useRunNow(orgId, siteId);
  const runs = useRuns(orgId, siteId, true);
  const client = useQueryClient();
  const mine = (runs.data?.runs ?? []).filter((r) => started.includes(r.id));
  const finished = mine.length > 0 && mine.every((r) => r.status === 'done' || r.status === 'failed');
  useEffect(() => {
    if (finished) void client.invalidateQueries({ queryKey: forecastKeys.site(siteId) });
  }, [finished, client, siteId]);
  return (
    <section aria-labelledby="run-heading" className="rounded-lg border border-line bg-white p-4 text-sm">
      <h2 id="run-heading" className="font-bold text-tide-900">Run now</h2>
      <div className="mt-2 flex flex-wrap items-end gap-2">
        <SelectField label="Days ahead" value={String(days)} onChange={(e) => setDays(Number(e.target.value))}>
          {[3, 4, 5, 6, 7].map((d) => (
            <option key={d} value={d}>
              {d} days
            </option>
          ))}
        </SelectField>
        <Button onClick={() => runNow.mutate(days, { onSuccess: (answer) => setStarted(answer?.runs.map((r) => r.id) ?? []) })} disabled={runNow.isPending || (mine.length > 0 && !finished)}>
          {runNow.isPending ? 'Starting…' : 'Run now'}
        </Button>
      </div>
      {runNow.error && <p role="alert" className="mt-2 text-alarm-600">{runNow.error.message}</p>}
      {mine.length > 0 && (
        <ul className="mt-2 space-y-1" aria-live="polite">
          {mine.map((r) => (
            <li key={r.id}>
              <span className="font-semibold">{r.profileName}</span>: {r.status === 'running' ? `running, ${Math.round(r.progress * 100)} %` : r.status}
              {r.error ? ` (${r.error})` : ''}
              <progress className="ml-2 h-2 w-24 align-middle" max={1} value={r.status === 'done' ? 1 : r.progress} aria-label={`Progress of ${r.profileName}`} />
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

function WindowTable({ windows, zone }: { windows: ForecastWindowDto[]; zone: string }) {
  return (
    <details className="rounded-lg border border-line bg-white p-3 text-sm">
      <summary className="cursor-pointer font-semibold">Windows as a list ({windows.length})</summary>
      <ul className="mt-2 space-y-1">
        {windows.map((w) => (
          <li key={`${w.kind}-${w.startMs}`}>
            <strong>{WINDOW_KIND_LABELS[w.kind]}</strong>: {siteClock(w.startMs, zone)} to {siteClock(w.endMs, zone)}
            {w.peakDepthM !== undefined ? `, at ${Number(w.peakDepthM.toFixed(1))} m below surface` : ''}
            {w.tideStage ? `, ${w.tideStage.replace('_', ' ')}` : ''}
            {w.clipped ? ' (cut by the forecast edge)' : ''}
          </li>
        ))}
      </ul>
    </details>
  );
}

export default function SiteForecastRoute() {
  const { orgId, role } = useOrg();
  const editor = canManage(role);
  const { siteId = '' } = useParams();
  const [params, setParams] = useSearchParams();
  const site = useSite(orgId, siteId);
  const watch = useWatch(orgId, siteId);
  const profiles = useProfiles(orgId);
  const settings = useForecastSettings(orgId, siteId);
  const watched = (profiles.data?.profiles ?? []).filter((p) => watch.data?.profileIds.includes(p.id));
  const profileId = params.get('profile') ?? watched[0]?.id;
  const field = (['concentration', 'speed', 'diffusivity'] as const).find((f) => f === params.get('show')) ?? 'concentration';
  const scale = params.get('scale') === 'linear' || params.get('scale') === 'log' ? (params.get('scale') as 'linear' | 'log') : DEFAULT_SCALE[field];
  const days = Math.min(7, Math.max(3, Number(params.get('days') ?? 3) || 3));
  const forecast = useLatestForecast(orgId, siteId, profileId);
  const grid = useForecastGrid(orgId, forecast.data?.id);
  const preview = useTidePreview(orgId, siteId, forecast.data?.forecastStart ?? null);
  const [cursor, setCursor] = useState<HeatmapCursor | null>(null);
  const set = (key: string, value: string | null) => {
    const next = new URLSearchParams(params);
    if (value === null) next.delete(key);
    else next.set(key, value);
    setParams(next, { replace: true });
  };
  const startMs = forecast.data ? Date.parse(forecast.data.forecastStart) : 0;
  const timeRange = useMemo(() => ({ startMs, endMs: startMs + days * DAY_MS }), [startMs, days]);

  return (
    <QueryState query={site}>
      {(siteData) => {
        const zone = siteData.timeZone;
        const profileName = watched.find((p) => p.id === profileId)?.name ?? 'organism';
        const windows = forecast.data?.windows ?? [];
        const span = grid.data ? drawnTimeSpan(grid.data, timeRange) : null;
        const visibleWindows = span ? windows.filter((w) => w.endMs > span.startMs && w.startMs < span.endMs) : [];
        const visibleDates = new Set((forecast.data?.advice ?? []).filter((d) => d.dayEndMs > timeRange.startMs && d.dayStartMs < timeRange.endMs).map((d) => d.date));
        const label = `${FIELD_LABELS[field]} of ${profileName} at ${siteData.name}, ${FIELD_UNITS[field]}, by depth below surface and time (${zone})`;
        return (
          <div className="space-y-5">
            <PageHeader title={`Forecast: ${siteData.name}`}>
              <Link to={`/o/${orgId}/sites/${siteId}/tides`} className="rounded-md border border-tide-700 px-3 py-2 text-sm font-semibold text-tide-700 hover:bg-tide-50">
                Tides
              </Link>
              <Link to={`/o/${orgId}/plan?site=${siteId}`} className="rounded-md border border-tide-700 px-3 py-2 text-sm font-semibold text-tide-700 hover:bg-tide-50">
                Sampling plan
              </Link>
            </PageHeader>
            <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_20rem]">
              <div className="min-w-0 space-y-4">
                <div className="flex flex-wrap items-end gap-3" role="group" aria-label="What to show">
                  <SelectField label="Organism" value={profileId ?? ''} onChange={(e) => set('profile', e.target.value)} disabled={watched.length === 0}>
                    {watched.length === 0 && <option value="">No organism watched</option>}
                    {watched.map((p) => (
                      <option key={p.id} value={p.id}>
                        {p.name}
                      </option>
                    ))}
                  </SelectField>
                  <SelectField label="Show" value={field} onChange={(e) => set('show', e.target.value)}>
                    {(Object.keys(FIELD_LABELS) as Field[]).map((f) => (
                      <option key={f} value={f}>
                        {FIELD_LABELS[f]} ({FIELD_UNITS[f]})
                      </option>
                    ))}
                  </SelectField>
                  <SelectField label="Colour scale" value={scale} onChange={(e) => set('scale', e.target.value)}>
                    <option value="linear">Linear</option>
                    <option value="log">Logarithmic</option>
                  </SelectField>
                  <SelectField label="Days shown" value={String(days)} onChange={(e) => set('days', e.target.value)}>
                    {[3, 4, 5, 6, 7].map((d) => (
                      <option key={d} value={d}>
                        {d} days
                      </option>
                    ))}
                  </SelectField>
                </div>
                {watch.data && watched.length === 0 && !profiles.isPending && <p className="text-ink-soft">This site watches no organism yet.{editor ? ' Choose organisms on the Organisms screen.' : ''}</p>}
                {profileId && (
                  <QueryState query={forecast}>
                    {(data) => (
                      <div className="space-y-4">
                        {data.horizonDays < days && (
                          <p className="rounded bg-ember-100 p-2 text-sm">
                            This forecast covers {data.horizonDays} days; the chart shows those.{editor ? ' Run now with more days ahead for a longer one.' : ''}
                          </p>
                        )}
                        <section aria-labelledby="chart-heading" className="rounded-lg border border-line bg-white p-3">
                          <h2 id="chart-heading" className="mb-2 font-bold text-tide-900">
                            {FIELD_LABELS[field]} of {profileName}
                          </h2>
                          {grid.isPending ? (
                            <p className="text-sm text-ink-soft">Loading the grid…</p>
                          ) : grid.error ? (
                            <p role="alert" className="text-sm text-alarm-600">{grid.error.message}</p>
                          ) : (
                            grid.data && (
                              <>
                                <TimeDepthHeatmap
                                  grid={grid.data}
                                  field={field}
                                  scale={scale}
                                  timeZone={zone}
                                  gearBand={{ topM: data.inputs.site.gearTopM, bottomM: data.inputs.site.gearBottomM }}
                                  windows={visibleWindows}
                                  label={label}
                                  timeRange={timeRange}
                                  onCursorChange={setCursor}
                                />
                                <TideStrip grid={grid.data} preview={preview.data?.preview ?? null} timeZone={zone} timeRange={timeRange} cursorMs={cursor?.timeMs ?? null} />
                              </>
                            )
                          )}
                        </section>
                        <WindowTable windows={visibleWindows} zone={zone} />
                        <section aria-labelledby="advice-heading" className="space-y-2">
                          <div className="flex flex-wrap items-center justify-between gap-2">
                            <h2 id="advice-heading" className="text-lg font-bold text-tide-900">Sampling advice</h2>
                            {editor && <AddFromAdviceButton orgId={orgId} siteId={siteId} forecastId={data.id} dates={[...visibleDates]} />}
                          </div>
                          <AdviceList days={data.advice} visibleDates={visibleDates} />
                        </section>
                      </div>
                    )}
                  </QueryState>
                )}
              </div>
              <aside className="space-y-4">
                <SafetyNotice />
                {forecast.data && <ForecastInputs forecast={forecast.data} />}
                {forecast.data && (
                  <section aria-labelledby="download-heading" className="rounded-lg border border-line bg-white p-4 text-sm">
                    <h2 id="download-heading" className="font-bold text-tide-900">Download</h2>
                    <p className="mt-1 flex gap-4">
                      <a className="font-semibold text-tide-700 underline" href={`/api/orgs/${orgId}/forecasts/${forecast.data.id}/download.csv`} download>
                        CSV
                      </a>
                      <a className="font-semibold text-tide-700 underline" href={`/api/orgs/${orgId}/forecasts/${forecast.data.id}/download.json`} download>
                        JSON
                      </a>
                    </p>
                  </section>
                )}
                {forecast.error instanceof ApiError && forecast.error.status === 402 && role === 'owner' && (
                  <Link className="block text-sm font-semibold text-tide-700 underline" to={`/o/${orgId}/billing`}>
                    Subscribe to unlock forecasts
                  </Link>
                )}
                {editor && <RunNow orgId={orgId} siteId={siteId} defaultDays={settings.data?.forecastHorizonDays ?? 3} />}
                {editor && settings.data && (
                  <details className="rounded-lg border border-line bg-white p-4 text-sm">
                    <summary className="cursor-pointer font-bold text-tide-900">Forecast settings</summary>
                    <div className="mt-3">
                      <ForecastSettingsForm key={JSON.stringify(settings.data)} orgId={orgId} siteId={siteId} settings={settings.data} timeZone={zone} />
                    </div>
                  </details>
                )}
              </aside>
            </div>
          </div>
        );
      }}
    </QueryState>
  );
}
