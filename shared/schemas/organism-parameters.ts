/**
 * What each organism parameter means, for people: label, unit, a plain explanation and the published
 * typical range with its source (docs/organisms.md has the full list and references). Used by the
 * profile form, the version comparison and the what-if sliders, so all three say the same thing.
 */
import type { OrganismParams } from './organism.schema.ts';

export type ParameterKey =
  | 'settlingVelocityMPerDay'
  | 'swimming.speedMPerHour'
  | 'swimming.schedule'
  | 'swimming.minDepthM'
  | 'swimming.maxDepthM'
  | 'growth.maxRatePerDay'
  | 'growth.temperatureC'
  | 'growth.lightAttenuationPerM'
  | 'growth.lightSaturationUmol'
  | 'mortalityPerDay'
  | 'bedExchange.criticalStressPa'
  | 'bedExchange.erosionRate'
  | 'initialCellsPerL'
  | 'triggerCellsPerL'
  | 'schmidtNumber';

export interface ParameterInfo {
  key: ParameterKey;
  label: string;
  unit: string;
  explanation: string;
  /** The typical range in words, with its source; or why there is none. */
  typical: string;
  /** Slider bounds for the what-if (a sensible span, not a validation limit). */
  slider?: { min: number; max: number; step: number };
}

export const PARAMETERS: readonly ParameterInfo[] = [
  {
    key: 'settlingVelocityMPerDay',
    label: 'Settling velocity',
    unit: 'm/day',
    explanation: 'How fast a cell sinks in still water; positive sinks, negative rises.',
    typical: 'Living cells 0–30 m/day, most below 1–2 m/day (Smayda 1970); natural assemblages 0–0.9 m/day (Pitcher et al. 1989); resting cysts a few to ~10 m/day (Stokes, 40 µm at 1100–1200 kg/m³).',
    slider: { min: 0, max: 30, step: 0.05 },
  },
  {
    key: 'swimming.speedMPerHour',
    label: 'Swimming speed',
    unit: 'm/h',
    explanation: 'Speed of directed swimming, up by day and down by night (or on the clock).',
    typical: 'Dinoflagellates 0.5–2 m/h; 1.15 m/h mean at 20 °C (Hand et al. 1965); 0.6 m/h mean, 4 m/h at most for Protoceratium (Erga et al. 2015).',
    slider: { min: 0, max: 4, step: 0.05 },
  },
  { key: 'swimming.schedule', label: 'Swimming schedule', unit: '', explanation: 'Sun: up while the sun is above the horizon. Clock: up and down at set local hours.', typical: 'Diel vertical migration follows daylight in most dinoflagellates (Smayda 2010).' },
  { key: 'swimming.minDepthM', label: 'Shallowest swimming depth', unit: 'm below surface', explanation: 'Cells stop swimming up at this depth.', typical: 'A property of the species and site; no general range.' },
  { key: 'swimming.maxDepthM', label: 'Deepest swimming depth', unit: 'm below surface', explanation: 'Cells stop swimming down at this depth; blank means the bed.', typical: 'A property of the species and site; no general range.' },
  {
    key: 'growth.maxRatePerDay',
    label: 'Maximum growth rate',
    unit: 'per day',
    explanation: 'Specific growth rate in saturating light (natural-log rate). Blank uses Eppley (1972) at the temperature.',
    typical: 'Eppley (1972) upper envelope: 1.11 per day at 10 °C, 1.53 at 15 °C, 2.09 at 20 °C; single species usually grow more slowly.',
    slider: { min: 0, max: 4, step: 0.01 },
  },
  { key: 'growth.temperatureC', label: 'Water temperature', unit: '°C', explanation: 'Temperature used for the growth rate (and by Eppley).', typical: 'Use the site’s own measurement (CTD cast or sensor buoy).', slider: { min: 0, max: 30, step: 0.5 } },
  {
    key: 'growth.lightAttenuationPerM',
    label: 'Light attenuation (Kd)',
    unit: 'per m',
    explanation: 'How quickly daylight fades with depth: I(z) = I₀ e^(−Kd z). Roughly 1.7 / Secchi depth.',
    typical: 'Clear ocean 0.03–0.05, coastal and shelf 0.1–0.5, turbid estuaries 1–10 per m (Kirk 2011); Kd ≈ 1.7/Secchi depth (Poole & Atkins 1929).',
    slider: { min: 0.02, max: 2, step: 0.01 },
  },
  {
    key: 'growth.lightSaturationUmol',
    label: 'Light saturation (Ik)',
    unit: 'µmol photons/m²/s',
    explanation: 'Light above which growth no longer rises much: Ik = Pmax/α of the P–I curve, growth ∝ tanh(I/Ik).',
    typical: 'Species-specific; measure it from a P–I curve (Jassby & Platt 1976).',
  },
  { key: 'mortalityPerDay', label: 'Loss rate', unit: 'per day', explanation: 'Mortality and grazing together, taken off the growth rate.', typical: 'No general published range; set from the site’s own counts or by calibration.', slider: { min: 0, max: 2, step: 0.01 } },
  {
    key: 'bedExchange.criticalStressPa',
    label: 'Critical bed stress',
    unit: 'Pa',
    explanation: 'Bed shear stress above which settled cells are lifted back into the water.',
    typical: 'Muds 0.1–0.5 Pa (Winterwerp & van Kesteren 2004).',
    slider: { min: 0.01, max: 1, step: 0.01 },
  },
  { key: 'bedExchange.erosionRate', label: 'Erosion rate (M)', unit: 'cells/L × m/s', explanation: 'Resuspension at twice the critical stress: E = M(τ/τc − 1) (Partheniades 1965).', typical: 'No published range for cells; calibrate to the site.' },
  { key: 'initialCellsPerL', label: 'Starting concentration', unit: 'cells/L', explanation: 'Concentration at the start of each forecast, the same at every depth.', typical: 'Blooms range from 10³ to over 10⁷ cells/L depending on the organism.' },
  {
    key: 'triggerCellsPerL',
    label: 'Trigger level',
    unit: 'cells/L',
    explanation: 'Concentration at the gear that you want to be warned about. Your own setting, not a legal limit.',
    typical: 'Monitoring triggers (verify the current rules): 100 cells/L for Dinophysis; 50,000–150,000 cells/L for Pseudo-nitzschia (UK agencies).',
  },
  { key: 'schmidtNumber', label: 'Turbulent Schmidt number', unit: '', explanation: 'Eddy viscosity divided by the eddy diffusivity of cells; larger mixes cells less.', typical: 'Usually 1.0 in marine models; about 0.5 in free shear flows and 0.9 near walls (Rodi 1993).' },
];

export const parameterInfo = (key: ParameterKey): ParameterInfo => PARAMETERS.find((p) => p.key === key)!;

/** The value of one parameter, as shown in tables ('—' when its group is off). */
export function parameterValue(params: OrganismParams, key: ParameterKey): string {
  const fmt = (v: number) => (Math.abs(v) >= 1e12 ? v.toExponential(3) : Number(v.toPrecision(6)).toLocaleString('en-GB', { maximumFractionDigits: 6 }));
  switch (key) {
    case 'settlingVelocityMPerDay':
      return fmt(params.settlingVelocityMPerDay);
    case 'mortalityPerDay':
      return fmt(params.mortalityPerDay);
    case 'initialCellsPerL':
      return fmt(params.initialCellsPerL);
    case 'triggerCellsPerL':
      return fmt(params.triggerCellsPerL);
    case 'schmidtNumber':
      return fmt(params.schmidtNumber);
    case 'swimming.speedMPerHour':
      return params.swimming ? fmt(params.swimming.speedMPerHour) : '—';
    case 'swimming.schedule':
      if (!params.swimming) return '—';
      return params.swimming.schedule.type === 'sun' ? 'sun' : `clock, up ${params.swimming.schedule.upHour} h, down ${params.swimming.schedule.downHour} h`;
    case 'swimming.minDepthM':
      return params.swimming ? fmt(params.swimming.minDepthM) : '—';
    case 'swimming.maxDepthM':
      return params.swimming ? (params.swimming.maxDepthM === null ? 'bed' : fmt(params.swimming.maxDepthM)) : '—';
    case 'growth.maxRatePerDay':
      return params.growth ? (params.growth.maxRatePerDay === null ? 'Eppley (1972)' : fmt(params.growth.maxRatePerDay)) : '—';
    case 'growth.temperatureC':
      return params.growth ? fmt(params.growth.temperatureC) : '—';
    case 'growth.lightAttenuationPerM':
      return params.growth ? fmt(params.growth.lightAttenuationPerM) : '—';
    case 'growth.lightSaturationUmol':
      return params.growth ? fmt(params.growth.lightSaturationUmol) : '—';
    case 'bedExchange.criticalStressPa':
      return params.bedExchange ? fmt(params.bedExchange.criticalStressPa) : '—';
    case 'bedExchange.erosionRate':
      return params.bedExchange ? fmt(params.bedExchange.erosionRate) : '—';
  }
}

/** The parameters whose shown value differs between two versions. */
export function changedParameters(a: OrganismParams, b: OrganismParams): ParameterKey[] {
  return PARAMETERS.filter((p) => parameterValue(a, p.key) !== parameterValue(b, p.key)).map((p) => p.key);
}
