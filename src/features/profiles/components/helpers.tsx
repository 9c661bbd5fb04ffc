import { useState } from 'react';
import { growthFromTemperature, settlingFromCell } from '../../../../shared/schemas/organism-helpers.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { figure } from './format.ts';

const num = (text: string) => (text.trim() === '' ? Number.NaN : Number(text));

/** Stokes' law for a cell: fills the settling velocity from size, density, temperature, salinity and form resistance. */
export function StokesHelper({ temperatureC, onUse }: { temperatureC: string; onUse: (mPerDay: number, how: string) => void }) {
  const [d, setD] = useState({ diameterUm: '20', cellDensity: '1100', temperatureC: temperatureC || '12', salinity: '35', formResistance: '1' });
  const set = (key: keyof typeof d) => (e: { target: { value: string } }) => setD((v) => ({ ...v, [key]: e.target.value }));
  const result = settlingFromCell({ diameterUm: num(d.diameterUm), cellDensity: num(d.cellDensity), temperatureC: num(d.temperatureC), salinity: num(d.salinity), formResistance: num(d.formResistance) });
  const errors = result.ok ? {} : Object.fromEntries(result.issues.map((i) => [i.path, i.message]));
  const value = result.ok ? Number(result.value.settlingVelocityMPerDay.toPrecision(3)) : null;
  return (
    <details className="rounded-md border border-line bg-tide-50 p-3 text-sm">
      <summary className="cursor-pointer font-semibold">Work it out from cell size and density (Stokes)</summary>
      <div className="mt-3 grid gap-3 sm:grid-cols-3">
        <TextField label="Cell diameter (µm)" inputMode="decimal" value={d.diameterUm} onChange={set('diameterUm')} error={errors.diameterUm} hint="Equivalent spherical diameter." />
        <TextField label="Cell density (kg/m³)" inputMode="decimal" value={d.cellDensity} onChange={set('cellDensity')} error={errors.cellDensity} hint="Cells about 1030–1200." />
        <TextField label="Temperature for Stokes (°C)" inputMode="decimal" value={d.temperatureC} onChange={set('temperatureC')} error={errors.temperatureC} />
        <TextField label="Salinity" inputMode="decimal" value={d.salinity} onChange={set('salinity')} error={errors.salinity} hint="Practical scale; seawater about 35." />
        <TextField label="Form resistance φr" inputMode="decimal" value={d.formResistance} onChange={set('formResistance')} error={errors.formResistance} hint="1 for a sphere; larger for chains and spines (Reynolds 2006)." />
      </div>
      <p className="mt-2 text-xs text-ink-soft">ws = g d² (ρcell − ρwater) / (18 μ φr); seawater density EOS-80, viscosity Sharqawy et al. (2010).</p>
      {result.ok && (
        <div className="mt-2 flex flex-wrap items-center gap-3">
          <p data-testid="stokes-result">
            <strong>{figure(result.value.settlingVelocityMPerDay)} m/day</strong>
            {result.value.stokesValid ? '' : ` — particle Reynolds number ${figure(result.value.reynolds)} is above 0.5, where Stokes' law overestimates.`}
          </p>
          <Button variant="secondary" className="px-2 py-1 text-xs" onClick={() => value !== null && onUse(value, `Stokes: ${d.diameterUm} µm, ${d.cellDensity} kg/m³, ${d.temperatureC} °C, S ${d.salinity}, φr ${d.formResistance}`)}>
            Use {figure(value ?? Number.NaN)} m/day
          </Button>
        </div>
      )}
    </details>
  );
}

/** Eppley (1972): fills the maximum growth rate from the temperature field. */
export function EppleyHelper({ temperatureC, onUse }: { temperatureC: string; onUse: (perDay: number, how: string) => void }) {
  const result = growthFromTemperature({ temperatureC: num(temperatureC) });
  if (!result.ok) return <p className="text-xs text-ink-soft">Give the water temperature to use Eppley (1972).</p>;
  const value = Number(result.value.maxRatePerDay.toPrecision(3));
  return (
    <div className="flex flex-wrap items-center gap-3 rounded-md border border-line bg-tide-50 p-3 text-sm">
      <p>
        Eppley (1972) at {temperatureC} °C: <strong>{figure(result.value.maxRatePerDay)} per day</strong> ({figure(result.value.doublingsPerDay)} doublings per day), an upper envelope.
      </p>
      <Button variant="secondary" className="px-2 py-1 text-xs" onClick={() => onUse(value, `Eppley (1972) at ${temperatureC} °C`)}>
        Use {figure(value)} per day
      </Button>
    </div>
  );
}
