import { useState } from 'react';
import type { Calibration } from '../../../../shared/schemas/lab.schema.ts';
import type { Profile } from '../../../../shared/schemas/organism.schema.ts';
import type { Site } from '../../../../shared/schemas/site.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { QueryState } from '../../../components/ui/query-state.tsx';
import { useAcceptCalibration } from '../api/accept-calibration.ts';
import { useDiscardCalibration } from '../api/discard-calibration.ts';
import { useCalibrations } from '../api/get-calibrations.ts';
import { useStartCalibration } from '../api/start-calibration.ts';
import { metric } from './format.ts';

function CalibrationCard({ orgId, calibration, canEdit }: { orgId: string; calibration: Calibration; canEdit: boolean }) {
  const accept = useAcceptCalibration(orgId);
  const discard = useDiscardCalibration(orgId);
  const r = calibration.result;
  const busy = calibration.status === 'queued' || calibration.status === 'running';
  return (
    <li className="rounded-md border border-line bg-white p-3 text-sm">
      <p className="font-semibold">
        {calibration.profileName} version {calibration.version} at {calibration.siteName}: {calibration.status}
        {calibration.fitGrowth ? ' (settling and loss rate)' : ' (settling)'}
      </p>
      {busy && (
        <div className="mt-2 flex items-center gap-2">
          <progress value={calibration.progress} max={1} aria-label="Calibration progress" className="w-48" />
          <span>{Math.round(calibration.progress * 100)} %</span>
        </div>
      )}
      {calibration.error && <p className="mt-1 text-alarm-600">{calibration.error}</p>}
      {r && (
        <div className="mt-2 space-y-1">
          <p>
            Fitted settling velocity <strong>{r.fitted.settlingVelocityMPerDay.toFixed(2)} m/day</strong> (searched {r.bounds.settlingVelocityMPerDay[0]}–{r.bounds.settlingVelocityMPerDay[1]} m/day)
            {r.fitted.mortalityPerDay !== null && <>, loss rate <strong>{r.fitted.mortalityPerDay.toFixed(3)} per day</strong></>}; {r.samples} results, {r.evaluations} model runs.
          </p>
          {r.atBound.length > 0 && <p className="text-ember-600">At the edge of the search range: {r.atBound.join(', ')}. The best value may lie outside it.</p>}
          <table className="text-left">
            <thead>
              <tr className="border-b border-line">
                <th className="px-2 py-0.5">log10 cells/L</th>
                <th className="px-2 py-0.5 text-right">Bias</th>
                <th className="px-2 py-0.5 text-right">RMSE</th>
                <th className="px-2 py-0.5 text-right">Correlation</th>
              </tr>
            </thead>
            <tbody>
              {([['Before', r.before], ['After', r.after]] as const).map(([label, s]) => (
                <tr key={label} className="border-b border-line">
                  <th scope="row" className="px-2 py-0.5 font-normal">{label}</th>
                  <td className="px-2 py-0.5 text-right">{metric(s.bias)}</td>
                  <td className="px-2 py-0.5 text-right">{metric(s.rmse)}</td>
                  <td className="px-2 py-0.5 text-right">{metric(s.correlation)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canEdit && calibration.status === 'done' && (
        <div className="mt-2 flex gap-2">
          <Button onClick={() => accept.mutate(calibration.id)} disabled={accept.isPending}>Accept as a new profile version</Button>
          <Button variant="secondary" onClick={() => discard.mutate(calibration.id)} disabled={discard.isPending}>Discard</Button>
        </div>
      )}
      {accept.data && <p role="status" className="mt-1 text-kelp-500">Saved as version {accept.data.version} of {calibration.profileName}.</p>}
      {(accept.error ?? discard.error) && <p role="alert" className="mt-1 text-alarm-600">{(accept.error ?? discard.error)!.message}</p>}
    </li>
  );
}

/** Fit a profile's settling velocity (and optionally its loss rate) to a site's results, and decide on the proposal. */
export function CalibrationPanel({ orgId, profiles, sites, canEdit }: { orgId: string; profiles: Profile[]; sites: Site[]; canEdit: boolean }) {
  const calibrations = useCalibrations(orgId);
  const start = useStartCalibration(orgId);
  const [profileId, setProfileId] = useState(profiles[0]?.id ?? '');
  const [siteId, setSiteId] = useState(sites[0]?.id ?? '');
  const [fitGrowth, setFitGrowth] = useState(false);
  const profile = profiles.find((p) => p.id === profileId);
  return (
    <section aria-labelledby="calibration-heading" className="space-y-3">
      <h2 id="calibration-heading" className="text-lg font-bold text-tide-900">Calibration</h2>
      <p className="text-sm text-ink-soft">
        Fits the settling velocity (0–50 m/day) of the profile's latest version to the site's lab results by least squares on log10 cells/L, re-running the model over the sampled period with the site's active tidal constituents. A proposal becomes a new profile version only when accepted.
      </p>
      {canEdit && (
        <div className="flex flex-wrap items-end gap-3">
          <label className="flex flex-col text-sm">
            Organism profile
            <select className="rounded-md border border-line bg-white px-2 py-1" value={profileId} onChange={(e) => setProfileId(e.target.value)}>
              {profiles.map((p) => (
                <option key={p.id} value={p.id}>{p.name} (version {p.latest.version})</option>
              ))}
            </select>
          </label>
          <label className="flex flex-col text-sm">
            Site
            <select className="rounded-md border border-line bg-white px-2 py-1" value={siteId} onChange={(e) => setSiteId(e.target.value)}>
              {sites.map((s) => (
                <option key={s.id} value={s.id}>{s.name}</option>
              ))}
            </select>
          </label>
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={fitGrowth} onChange={(e) => setFitGrowth(e.target.checked)} /> Also fit the loss rate (net growth)
          </label>
          <Button disabled={!profile || !siteId || start.isPending} onClick={() => profile && start.mutate({ profileVersionId: profile.latest.id, siteId, fitGrowth })}>
            Start calibration
          </Button>
        </div>
      )}
      {start.error && <p role="alert" className="text-sm text-alarm-600">{start.error.message}</p>}
      <QueryState query={calibrations}>
        {(data) =>
          data.calibrations.length === 0 ? (
            <p className="text-sm text-ink-soft">No calibrations yet.</p>
          ) : (
            <ul className="space-y-2">
              {data.calibrations.map((c) => (
                <CalibrationCard key={c.id} orgId={orgId} calibration={c} canEdit={canEdit} />
              ))}
            </ul>
          )
        }
      </QueryState>
    </section>
  );
}
