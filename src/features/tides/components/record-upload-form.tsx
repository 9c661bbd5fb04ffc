import { useState, type FormEvent } from 'react';
import type { AnalysisResult } from '../../../../shared/schemas/tides.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { useAnalyseRecord } from '../api/analyse-record.ts';
import { useSaveRecordSet } from '../api/save-record-set.ts';
import { num, siteTime } from './format.ts';
import { LineChart } from './line-chart.tsx';
import { UploadProblems } from '../../../components/ui/upload-problems.tsx';

function xTicksOf(times: string[], timeZone: string) {
  const count = 6;
  return Array.from({ length: count }, (_, k) => Math.round((k * (times.length - 1)) / (count - 1))).map((at) => ({ at, label: siteTime(times[at]!, timeZone).slice(0, 10) }));
}

function FitView({ analysis, timeZone }: { analysis: AnalysisResult; timeZone: string }) {
  const { fit, series } = analysis;
  const ticks = xTicksOf(series.times, timeZone);
  const unit = series.unit;
  return (
    <div className="mt-4 space-y-3">
      <p className="text-sm">
        {fit.validSamples} of {fit.samples} samples, {num(fit.spanHours / 24, 1)} days at {num(fit.sampleIntervalMinutes, 1)} min, {num(fit.missingFraction * 100, 1)} % missing. Variance explained {num(fit.varianceExplained * 100, 1)} %, residual rms {num(fit.residualRms)} {unit}.
      </p>
      <LineChart
        title={`Observed and predicted: ${series.quantity}`}
        yLabel={unit}
        xTicks={ticks}
        zeroLine
        series={[
          { label: 'observed', values: series.observed, colour: 'var(--color-ramp-2)' },
          { label: 'predicted from the fit', values: series.predicted, colour: 'var(--color-ember-600)', dashed: true },
        ]}
      />
      <LineChart title="Residual (observed − predicted)" yLabel={unit} xTicks={ticks} zeroLine series={[{ label: 'residual', values: series.residual, colour: 'var(--color-ramp-4)' }]} />
      <div className="overflow-x-auto rounded-lg border border-line bg-white">
        <table className="w-full text-left text-sm">
          <caption className="px-3 py-2 text-left font-semibold">Fitted constituents (± standard error, a lower bound)</caption>
          <thead className="bg-tide-50 text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2">Constituent</th>
              <th scope="col" className="px-3 py-2">{analysis.kind === 'current' ? 'Major axis (m/s)' : 'Amplitude (m)'}</th>
              {analysis.kind === 'current' && <th scope="col" className="px-3 py-2">Minor axis (m/s)</th>}
              {analysis.kind === 'current' && <th scope="col" className="px-3 py-2">Inclination (°)</th>}
              <th scope="col" className="px-3 py-2">Phase g (°)</th>
            </tr>
          </thead>
          <tbody>
            {analysis.constituents.map((c) => (
              <tr key={c.name} className="border-t border-line tabular-nums">
                <th scope="row" className="px-3 py-1.5 font-semibold">{c.name}</th>
                <td className="px-3 py-1.5">{num(c.amplitude)} ± {num(c.amplitudeSe)}</td>
                {analysis.kind === 'current' && <td className="px-3 py-1.5">{c.minor === null ? '–' : num(c.minor)}</td>}
                {analysis.kind === 'current' && <td className="px-3 py-1.5">{c.inclinationDeg === null ? '–' : num(c.inclinationDeg, 1)}</td>}
                <td className="px-3 py-1.5">{num(c.phaseDeg, 1)} ± {num(c.phaseSeDeg, 1)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {fit.dropped.length > 0 && (
        <ul className="list-disc pl-5 text-xs text-ink-soft">
          {fit.dropped.map((d) => (
            <li key={d.name}>{d.reason}</li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** Upload a current or level record, see the harmonic fit, and save it as a new version. */
export function RecordUploadForm({ orgId, siteId, timeZone }: { orgId: string; siteId: string; timeZone: string }) {
  const analyse = useAnalyseRecord(orgId, siteId);
  const save = useSaveRecordSet(orgId, siteId);
  const [file, setFile] = useState<File | null>(null);
  const [constituents, setConstituents] = useState('');
  const [label, setLabel] = useState('');

  function submit(event: FormEvent) {
    event.preventDefault();
    save.reset();
    if (file) analyse.mutate({ file, constituents });
  }

  return (
    <section aria-labelledby="record-heading" className="rounded-lg border border-line bg-white p-4">
      <h3 id="record-heading" className="font-semibold">Fit a current or level record</h3>
      <p className="mt-1 text-xs text-ink-soft">
        CSV with a time column (ISO-8601 with offset, e.g. 2025-03-01T10:20:00Z, or local times with a zone column) and speed (m/s) with direction_deg (toward, clockwise from north), or u and v (m/s), or level (m). At least 15 days at 10-minute steps separates the main constituents; 29 days or more is better.
      </p>
      <form onSubmit={submit} className="mt-3 grid gap-3 sm:grid-cols-2">
        <TextField label="Record (CSV)" type="file" accept=".csv,text/csv" onChange={(e) => { setFile(e.target.files?.[0] ?? null); analyse.reset(); save.reset(); }} />
        <TextField label="Constituents to fit (optional)" placeholder="M2, S2, N2, K1, O1, M4" value={constituents} onChange={(e) => setConstituents(e.target.value)} hint="Empty: the eleven main ones; those the record cannot separate are dropped, with the reason." />
        <div className="sm:col-span-2">
          <Button type="submit" disabled={!file || analyse.isPending}>{analyse.isPending ? 'Fitting…' : 'Fit and show'}</Button>
        </div>
      </form>
      <UploadProblems error={analyse.error} />
      {analyse.data && file && (
        <>
          <FitView analysis={analyse.data} timeZone={timeZone} />
          <div className="mt-3 flex flex-wrap items-end gap-3">
            <TextField label="Name of the new set" value={label} onChange={(e) => setLabel(e.target.value)} placeholder={file.name} />
            <Button disabled={save.isPending} onClick={() => save.mutate({ file, constituents, label: label || undefined, activate: true })}>
              {save.isPending ? 'Saving…' : 'Save as the active set'}
            </Button>
          </div>
          {save.data && <p role="status" className="mt-2 text-sm text-kelp-500">Stored as version {save.data.set.version} and made active.</p>}
          <UploadProblems error={save.error} />
        </>
      )}
    </section>
  );
}
