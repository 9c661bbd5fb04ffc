/**
 * Barotropic forcing, compiled once per run into flat arrays and evaluated
 * per step without allocation. Time t is seconds since the run start.
 */
import type { ModelCase } from './case-schema.ts';
import { constituentOmega } from './constituents.ts';

const DEG = Math.PI / 180;

export const FORCING_SLOPE = 0;
export const FORCING_DEPTH_MEAN = 1;

export interface Forcing {
  kind: number;
  /** Surface slope: mean slope (m/m) along x. Depth-mean: mean u, v (m/s). */
  meanX: number;
  meanY: number;
  /** Angular speeds (rad/s), phases (rad) and amplitudes of the harmonic terms. */
  omega: Float64Array;
  phase: Float64Array;
  /** Slope amplitude (m/m), or the major-axis current amplitude (m/s). */
  major: Float64Array;
  /** Minor-axis current amplitude (m/s, positive = anticlockwise); 0 for slopes. */
  minor: Float64Array;
  cosInc: Float64Array;
  sinInc: Float64Array;
  /** Wind stress series: times (s), x and y stress (Pa). */
  windTime: Float64Array;
  windX: Float64Array;
  windY: Float64Array;
}

export function compileForcing(c: ModelCase): Forcing {
  const f = c.forcing;
  if (f.type === 'surface_slope') {
    const n = f.components.length;
    const omega = new Float64Array(n);
    const phase = new Float64Array(n);
    const major = new Float64Array(n);
    f.components.forEach((k, i) => {
      omega[i] = k.constituent !== undefined ? constituentOmega(k.constituent) : (2 * Math.PI) / (k.period_s ?? 1);
      phase[i] = k.phase_deg * DEG;
      major[i] = k.amplitude;
    });
    return {
      kind: FORCING_SLOPE,
      meanX: f.mean,
      meanY: 0,
      omega,
      phase,
      major,
      minor: new Float64Array(n),
      cosInc: new Float64Array(n).fill(1),
      sinInc: new Float64Array(n),
      ...compileWind(c),
    };
  }
  const n = f.constituents.length;
  const omega = new Float64Array(n);
  const phase = new Float64Array(n);
  const major = new Float64Array(n);
  const minor = new Float64Array(n);
  const cosInc = new Float64Array(n);
  const sinInc = new Float64Array(n);
  f.constituents.forEach((k, i) => {
    // The schema has already refused unknown names.
    omega[i] = constituentOmega(k.name);
    phase[i] = k.phase_deg * DEG;
    major[i] = k.amplitude_m_s;
    minor[i] = k.minor_amplitude_m_s;
    cosInc[i] = Math.cos(k.inclination_deg * DEG);
    sinInc[i] = Math.sin(k.inclination_deg * DEG);
  });
  return {
    kind: FORCING_DEPTH_MEAN,
    meanX: f.mean_u_m_s,
    meanY: f.mean_v_m_s,
    omega,
    phase,
    major,
    minor,
    cosInc,
    sinInc,
    ...compileWind(c),
  };
}

function compileWind(c: ModelCase): Pick<Forcing, 'windTime' | 'windX' | 'windY'> {
  const n = c.wind_stress.length;
  const windTime = new Float64Array(n);
  const windX = new Float64Array(n);
  const windY = new Float64Array(n);
  c.wind_stress.forEach((p, i) => {
    windTime[i] = p.time_s;
    windX[i] = p.x_pa;
    windY[i] = p.y_pa;
  });
  return { windTime, windX, windY };
}

/** Surface slope along x at time t (m/m): mean + Σ a cos(ω t − φ). */
export function surfaceSlopeAt(f: Forcing, t: number): number {
  let s = f.meanX;
  const n = f.omega.length;
  for (let i = 0; i < n; i++) s += f.major[i]! * Math.cos(f.omega[i]! * t - f.phase[i]!);
  return s;
}

/**
 * Target depth-mean current at time t, written into out[0] (u) and out[1] (v).
 * Each constituent is a tidal ellipse: A cos(ω t − φ) along its major axis and
 * a sin(ω t − φ) along its minor axis, the major axis turned by the inclination
 * anticlockwise from +x.
 */
export function depthMeanTargetAt(f: Forcing, t: number, out: Float64Array): void {
  let u = f.meanX;
  let v = f.meanY;
  const n = f.omega.length;
  for (let i = 0; i < n; i++) {
    const arg = f.omega[i]! * t - f.phase[i]!;
    const along = f.major[i]! * Math.cos(arg);
    const across = f.minor[i]! * Math.sin(arg);
    u += along * f.cosInc[i]! - across * f.sinInc[i]!;
    v += along * f.sinInc[i]! + across * f.cosInc[i]!;
  }
  out[0] = u;
  out[1] = v;
}

/**
 * Wind stress at time t (Pa), linear between points and held constant beyond
 * the ends; zero without a series. Writes out[0] (x) and out[1] (y).
 * `hint` is the index found last time (the search walks forward from it).
 */
export function windStressAt(f: Forcing, t: number, hint: number, out: Float64Array): number {
  const n = f.windTime.length;
  if (n === 0) {
    out[0] = 0;
    out[1] = 0;
    return 0;
  }
  if (t <= f.windTime[0]!) {
    out[0] = f.windX[0]!;
    out[1] = f.windY[0]!;
    return 0;
  }
  if (t >= f.windTime[n - 1]!) {
    out[0] = f.windX[n - 1]!;
    out[1] = f.windY[n - 1]!;
    return n - 1;
  }
  let i = hint > 0 && hint < n && f.windTime[hint]! <= t ? hint : 0;
  while (i < n - 2 && f.windTime[i + 1]! <= t) i++;
  const t0 = f.windTime[i]!;
  const w = (t - t0) / (f.windTime[i + 1]! - t0);
  out[0] = f.windX[i]! + w * (f.windX[i + 1]! - f.windX[i]!);
  out[1] = f.windY[i]! + w * (f.windY[i + 1]! - f.windY[i]!);
  return i;
}
