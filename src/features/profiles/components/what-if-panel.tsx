import { useMemo, useState } from 'react';
import { DEFAULT_WINDOW_SETTINGS } from '../../../../shared/forecast/window-settings.ts';
import { organismParamsSchema, type OrganismParams, type ProfileDetail } from '../../../../shared/schemas/organism.schema.ts';
import { changedParameters, parameterInfo, parameterValue } from '../../../../shared/schemas/organism-parameters.ts';
import type { Site } from '../../../../shared/schemas/site.schema.ts';
import type { CurrentPart } from '../../../../shared/schemas/tides.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField } from '../../../components/ui/field.tsx';
import type { WhatIfInput } from '../../../workers/what-if-protocol.ts';
import { useCreateProfileVersion } from '../api/create-profile-version.ts';
import { useActiveTides } from '../api/get-active-tides.ts';
import { useForecastGrid } from '../api/get-forecast-grid.ts';
import { useLatestForecast } from '../api/get-latest-forecast.ts';
import { useWhatIf } from '../hooks/use-what-if.ts';
import { figure, siteTime } from './format.ts';
import { ForecastPane } from './forecast-pane.tsx';
import { movableParameters, numericValue, withValue } from './param-access.ts';
import { ParamSlider } from './param-slider.tsx';

const HORIZON_DAYS = 3;
const LAYERS = 50;
const HOUR_MS = 3_600_000;

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted.length ? sorted[Math.floor(sorted.length / 2)]! : Number.NaN;
};

function whatIfInput(site: Site, current: CurrentPart, startMs: number, organismName: string, params: OrganismParams): WhatIfInput {
  return {
    site: { latitudeDeg: site.latitudeDeg, longitudeDeg: site.longitudeDeg, waterDepthM: site.waterDepthM, bedRoughnessM: site.bedRoughnessM },
    organismName,
    params,
    current: { constituents: current.constituents, axisDeg: current.axisDeg },
    startMs,
    horizonDays: HORIZON_DAYS,
    layers: LAYERS,
    windowSettings: DEFAULT_WINDOW_SETTINGS,
  };
}

interface WhatIfPanelProps {
  orgId: string;
  profile: ProfileDetail;
  sites: Site[];
  canSave: boolean;
}

/** The biologist's what-if: move a parameter, see a 3-day forecast for a site recomputed in the browser beside the saved one. */
export function WhatIfPanel({ orgId, profile, sites, canSave }: WhatIfPanelProps) {
  const [siteId, setSiteId] = useState<string | null>(sites[0]?.id ?? null);
  const site = sites.find((s) => s.id === siteId) ?? null;
  const saved = profile.latest.params;
  const [edited, setEdited] = useState<OrganismParams>(saved);
  const [savedVersionId, setSavedVersionId] = useState(profile.latest.id);
  // A new saved version (after "Save as new version" or an edit) becomes the starting point.
  if (savedVersionId !== profile.latest.id) {
    setSavedVersionId(profile.latest.id);
    setEdited(profile.latest.params);
  }
  const [fallbackStartMs] = useState(() => Math.floor(Date.now() / HOUR_MS) * HOUR_MS);

  const tides = useActiveTides(orgId, siteId);
  const latest = useLatestForecast(orgId, siteId, profile.id);
  const stored = latest.data?.forecast ?? null;
  const storedGrid = useForecastGrid(orgId, stored?.id ?? null);
  const current = tides.data?.set?.current ?? null;
  const startMs = stored ? Date.parse(stored.forecastStart) : fallbackStartMs;
  const ready = site !== null && current !== null && !latest.isPending;

  const check = organismParamsSchema.safeParse(edited);
  const editedInput = useMemo(() => {
    const parsed = organismParamsSchema.safeParse(edited);
    return ready && parsed.success ? whatIfInput(site, current, startMs, profile.name, parsed.data) : null;
  }, [ready, edited, site, current, startMs, profile.name]);
  // Without a stored forecast, the saved version is computed the same way, so the two compare like for like.
  const savedInput = useMemo(
    () => (ready && !stored ? whatIfInput(site, current, startMs, profile.name, saved) : null),
    [ready, stored, site, current, startMs, profile.name, saved],
  );

  const editedRun = useWhatIf(editedInput);
  const savedRun = useWhatIf(savedInput);
  const save = useCreateProfileVersion(orgId, profile.id);
  const changed = changedParameters(saved, edited);

  if (sites.length === 0) return <p className="text-sm text-ink-soft">Add a site first: the what-if runs at a site, with its tides.</p>;

  const gear = site ? { topM: site.gearTopM, bottomM: site.gearBottomM } : { topM: 0, bottomM: 0 };
  const timeZone = site?.timeZone ?? 'UTC';
  const last = editedRun.result?.timing;
  const note = `What-if at ${site?.name ?? 'a site'}: ${changed.map((k) => `${parameterInfo(k).label.toLowerCase()} ${parameterValue(saved, k)} → ${parameterValue(edited, k)}`).join('; ')}`.slice(0, 500);

  return (
    <section aria-labelledby="what-if-heading" className="space-y-4">
      <h2 id="what-if-heading" className="text-lg font-bold text-tide-900">What-if</h2>
      <p className="text-sm text-ink-soft">
        Move a parameter and a {HORIZON_DAYS}-day forecast at {LAYERS} layers is recomputed in your browser from the site’s active current constituents, beside the saved version. Nothing is stored until you save.
      </p>
      <div className="grid gap-4 lg:grid-cols-[20rem_1fr]">
        <div className="space-y-4">
          <SelectField label="Site" value={siteId ?? ''} onChange={(e) => setSiteId(e.target.value || null)}>
            {sites.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </SelectField>
          <fieldset className="space-y-4">
            <legend className="sr-only">What-if parameters</legend>
            {movableParameters(edited).map((key) => (
              <ParamSlider key={key} info={parameterInfo(key)} value={numericValue(edited, key) ?? 0} onChange={(value) => setEdited((p) => withValue(p, key, value))} />
            ))}
          </fieldset>
          {!check.success && (
            <ul role="alert" className="text-xs font-semibold text-alarm-600">
              {check.error.issues.map((issue) => (
                <li key={issue.path.join('.')}>{issue.message}</li>
              ))}
            </ul>
          )}
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" disabled={changed.length === 0} onClick={() => setEdited(saved)}>
              Back to saved values
            </Button>
            {canSave && (
              <Button disabled={changed.length === 0 || !check.success || save.isPending} onClick={() => check.success && save.mutate({ params: check.data, note })}>
                {save.isPending ? 'Saving…' : 'Save as new version'}
              </Button>
            )}
          </div>
          {save.isSuccess && changed.length === 0 && <p role="status" className="text-sm text-kelp-500">Saved as version {profile.latest.version}.</p>}
          {save.error && <p role="alert" className="text-sm font-semibold text-alarm-600">{save.error.message}</p>}
        </div>

        <div className="min-w-0 space-y-3">
          {tides.isPending && siteId && <p className="text-sm text-ink-soft">Loading the site’s tides…</p>}
          {tides.data && !current && <p className="text-sm text-ink-soft">This site has no active current constituents yet: a manager adds them on the site’s tides screen.</p>}
          {tides.error && <p role="alert" className="text-sm text-alarm-600">{tides.error.message}</p>}
          <p role="status" aria-live="polite" data-testid="what-if-timing" data-last-ms={last ? last.totalMs.toFixed(1) : ''} data-runs={editedRun.timings.length} data-cancelled={editedRun.cancelled} className="text-sm">
            {editedRun.running ? 'Recomputing… ' : ''}
            {last
              ? `Last recompute ${figure(last.totalMs)} ms in your browser (engine ${figure(last.modelMs)} ms); median of ${editedRun.timings.length}: ${figure(median(editedRun.timings))} ms.`
              : ready
                ? 'Computing the first what-if…'
                : ''}
          </p>
          {editedRun.error && <p role="alert" className="text-sm font-semibold text-alarm-600">{editedRun.error}</p>}
          <div className="grid gap-4 xl:grid-cols-2">
            {site && stored && storedGrid.data ? (
              <ForecastPane
                title={`Saved: stored forecast (version ${stored.inputs.profile.version})`}
                subtitle={`Made ${siteTime(Date.parse(stored.createdAt), timeZone)}; tides version ${stored.inputs.tides.version ?? '—'}.`}
                grid={storedGrid.data}
                windows={stored.windows}
                timeZone={timeZone}
                gear={gear}
                label={`Concentration of ${profile.name}, cells/L, stored forecast`}
                testId="what-if-saved"
              />
            ) : site && savedRun.result ? (
              <ForecastPane
                title={`Saved: version ${profile.latest.version}, computed here`}
                subtitle={latest.data?.reason === 'subscription' ? 'Stored forecasts need a subscription; this is the saved version computed in your browser.' : 'No stored forecast for this site yet; this is the saved version computed in your browser.'}
                grid={savedRun.result.grid}
                windows={savedRun.result.windows}
                timeZone={timeZone}
                gear={gear}
                label={`Concentration of ${profile.name}, cells/L, saved version`}
                testId="what-if-saved"
              />
            ) : (
              ready && <p className="text-sm text-ink-soft">Loading the saved forecast…</p>
            )}
            {site && editedRun.result && (
              <ForecastPane
                title={changed.length ? 'What-if: edited values' : 'What-if: saved values (move a parameter)'}
                subtitle={`From ${siteTime(startMs, timeZone)}, ${HORIZON_DAYS} days, ${LAYERS} layers; default window settings.`}
                grid={editedRun.result.grid}
                windows={editedRun.result.windows}
                timeZone={timeZone}
                gear={gear}
                label={`Concentration of ${profile.name}, cells/L, what-if`}
                testId="what-if-edited"
              />
            )}
          </div>
        </div>
      </div>
    </section>
  );
}
