/**
 * Bounded minimisation for calibration: golden-section search on one parameter (Kiefer 1953; Press
 * et al., Numerical Recipes, 3rd ed., §10.2), started from the best point of a coarse scan so that a
 * second dip elsewhere in the bounds is not missed; for two parameters, cyclic coordinate search
 * (each coordinate in turn by golden section, the other held), a few sweeps.
 * The objective is asynchronous so that a caller can run the model and report progress between calls.
 */

export type Objective = (x: readonly number[]) => Promise<number>;

export interface Bounds {
  lower: number;
  upper: number;
}

export interface FitOptions {
  /** Points of the coarse scan of each parameter (default 9, at least 3). */
  scanPoints?: number;
  /** Stop when the bracket is narrower than this, in the parameter's units (one value, or one per parameter). */
  tolerance: number | readonly number[];
  /** Most golden-section steps per search (default 40). */
  maxIterations?: number;
  /** Coordinate sweeps for two or more parameters (default 2). */
  sweeps?: number;
  /** Called after each evaluation. */
  onEvaluation?: (x: readonly number[], value: number, evaluations: number) => void | Promise<void>;
}

export interface FitResult {
  x: number[];
  value: number;
  evaluations: number;
  /** A parameter that ended within a tolerance of a bound (the best fit may lie outside the bounds). */
  atBound: boolean[];
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/** Minimises over x[index] within the bounds, the other coordinates held; returns the best point seen. */
async function searchCoordinate(f: (t: number) => Promise<number>, bounds: Bounds, start: { t: number; value: number } | null, options: FitOptions, tolerance: number) {
  const n = Math.max(3, options.scanPoints ?? 9);
  const ts: number[] = [];
  const values: number[] = [];
  for (let k = 0; k < n; k++) {
    const t = bounds.lower + ((bounds.upper - bounds.lower) * k) / (n - 1);
    ts.push(t);
    values.push(await f(t));
  }
  let best = 0;
  for (let k = 1; k < n; k++) if (values[k]! < values[best]!) best = k;
  let bestT = ts[best]!;
  let bestValue = values[best]!;
  if (start && start.value < bestValue) {
    bestT = start.t;
    bestValue = start.value;
  }
  // Golden section in the bracket around the best scan point.
  let a = ts[Math.max(best - 1, 0)]!;
  let b = ts[Math.min(best + 1, n - 1)]!;
  let c = b - GOLDEN * (b - a);
  let d = a + GOLDEN * (b - a);
  let fc = await f(c);
  let fd = await f(d);
  const maxIterations = options.maxIterations ?? 40;
  for (let i = 0; i < maxIterations && b - a > tolerance; i++) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - GOLDEN * (b - a);
      fc = await f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + GOLDEN * (b - a);
      fd = await f(d);
    }
  }
  for (const [t, value] of [[c, fc], [d, fd]] as const) {
    if (value < bestValue) {
      bestT = t;
      bestValue = value;
    }
  }
  return { t: bestT, value: bestValue };
}

/** Minimises the objective within the bounds (one bound pair per parameter). */
export async function fitBounded(objective: Objective, bounds: readonly Bounds[], start: readonly number[], options: FitOptions): Promise<FitResult> {
  let evaluations = 0;
  const tolerance = (i: number) => (typeof options.tolerance === 'number' ? options.tolerance : (options.tolerance[i] ?? options.tolerance[0]!));
  const x = start.map((v, i) => Math.min(Math.max(v, bounds[i]!.lower), bounds[i]!.upper));
  const evaluate = async (point: number[]) => {
    const value = await objective(point);
    evaluations++;
    await options.onEvaluation?.(point, value, evaluations);
    return Number.isFinite(value) ? value : Number.POSITIVE_INFINITY;
  };
  let current = bounds.length > 1 ? { value: await evaluate([...x]) } : { value: Number.POSITIVE_INFINITY };
  const sweeps = bounds.length > 1 ? Math.max(1, options.sweeps ?? 2) : 1;
  for (let s = 0; s < sweeps; s++) {
    for (let i = 0; i < bounds.length; i++) {
      const found = await searchCoordinate(
        (t) => {
          const point = [...x];
          point[i] = t;
          return evaluate(point);
        },
        bounds[i]!,
        Number.isFinite(current.value) ? { t: x[i]!, value: current.value } : null,
        options,
        tolerance(i),
      );
      x[i] = found.t;
      current = { value: found.value };
    }
  }
  const atBound = x.map((v, i) => v - bounds[i]!.lower <= tolerance(i) || bounds[i]!.upper - v <= tolerance(i));
  return { x, value: current.value, evaluations, atBound };
}
