import { DateTime } from 'luxon';
import { useState } from 'react';
import type { Forecast } from '../../../../shared/schemas/forecast.schema.ts';

const ago = (iso: string) => DateTime.fromISO(iso).toRelative({ locale: 'en-GB' }) ?? iso;
const local = (iso: string, zone: string) => DateTime.fromISO(iso, { zone: 'utc' }).setZone(zone).setLocale('en-GB').toFormat('ccc d LLL yyyy HH:mm ZZZZ');

/** What went into the forecast, and how old it is: shown beside every forecast. */
export function ForecastInputs({ forecast }: { forecast: Forecast }) {
  const { inputs } = forecast;
  const zone = inputs.site.timeZone;
  const [nowMs] = useState(() => Date.now());
  const ageHours = (nowMs - Date.parse(forecast.createdAt)) / 3_600_000;
  return (
    <section aria-labelledby="inputs-heading" className="rounded-lg border border-line bg-white p-4 text-sm">
      <h2 id="inputs-heading" className="font-bold text-tide-900">Forecast inputs and age</h2>
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
        <dt className="text-ink-soft">Made</dt>
        <dd>
          {local(forecast.createdAt, zone)} ({ago(forecast.createdAt)}){ageHours > 30 && <strong className="ml-1 text-alarm-600">older than a day</strong>}
        </dd>
        <dt className="text-ink-soft">Covers</dt>
        <dd>
          {forecast.horizonDays} days from {local(forecast.forecastStart, zone)}
        </dd>
        <dt className="text-ink-soft">Organism</dt>
        <dd>
          {inputs.profile.name} ({inputs.profile.taxon}), profile version {inputs.profile.version}; trigger {inputs.profile.triggerCellsPerL.toLocaleString('en-GB')} cells/L
        </dd>
        <dt className="text-ink-soft">Site</dt>
        <dd>
          {inputs.site.waterDepthM} m deep, gear {inputs.site.gearTopM}–{inputs.site.gearBottomM} m below surface, bed roughness {inputs.site.bedRoughnessM * 1000} mm
        </dd>
        <dt className="text-ink-soft">Tides</dt>
        <dd>
          {inputs.tides.version !== null ? `constituent set version ${inputs.tides.version}` : 'no constituent set'} ({inputs.tides.source}
          {inputs.tides.madeAt ? `, made ${local(inputs.tides.madeAt, zone)}` : ''}){inputs.tides.note ? `. ${inputs.tides.note}` : ''}
        </dd>
        <dt className="text-ink-soft">Model</dt>
        <dd>
          engine {inputs.engineVersion}, {inputs.layers} layers, time step {inputs.timeStepS} s
        </dd>
      </dl>
      {forecast.tideNote && (
        <p role="note" className="mt-2 rounded bg-ember-100 p-2">
          {forecast.tideNote}
        </p>
      )}
    </section>
  );
}
