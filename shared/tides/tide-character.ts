/**
 * The character of a tide: the form factor and its class, and where a time
 * sits in the spring–neap cycle.
 *
 * Form factor F = (K1 + O1) / (M2 + S2) from amplitudes (Courtier 1938; Pugh
 * 1987 §4.2): < 0.25 semidiurnal; 0.25–1.5 mixed, mainly semidiurnal;
 * 1.5–3.0 mixed, mainly diurnal; > 3.0 diurnal. A value on a boundary takes
 * the class above it (F = 1.5 is mixed, mainly diurnal). For currents the
 * major semi-axes are used as amplitudes.
 *
 * Spring–neap indicator: the semidiurnal envelope of M2 and S2,
 * E(t) = |f_M2 H_M2 e^{iφ_M2(t)} + f_S2 H_S2 e^{iφ_S2(t)}|, where φ is each
 * constituent's argument ω t + V0 + u − g. The MSf phase Δ = φ_S2 − φ_M2 is 0°
 * at springs (E = a + b) and 180° at neaps (E = |a − b|); it advances at the
 * MSf speed, one cycle in 14.77 days. The index (E − |a − b|)/(2 min(a, b))
 * runs from 0 at neaps to 1 at springs; E / a is the envelope relative to the
 * M2 amplitude.
 */

import { STANDARD_CONSTITUENTS, constituentIndex, constituentSpeedDegPerH } from './constituents.ts';
import { createTerms, updateTerms, type TermOptions } from './harmonic-sum.ts';
import type { TideFailure } from './predict.ts';

export type TideType = 'semidiurnal' | 'mixed, mainly semidiurnal' | 'mixed, mainly diurnal' | 'diurnal';

export interface AmplitudeEntry {
  name: string;
  amplitude: number;
}

function amplitudeOf(entries: readonly AmplitudeEntry[], name: string): number {
  const target = constituentIndex(name);
  let total = 0;
  for (const e of entries) if (constituentIndex(e.name) === target) total += e.amplitude;
  return total;
}

/** Class of a form factor value (Courtier 1938 boundaries). */
export function classifyFormFactor(F: number): TideType {
  if (F < 0.25) return 'semidiurnal';
  if (F < 1.5) return 'mixed, mainly semidiurnal';
  if (F <= 3.0) return 'mixed, mainly diurnal';
  return 'diurnal';
}

/** F = (K1 + O1)/(M2 + S2) from a list of constituents; missing ones count as zero amplitude. */
export function formFactor(
  entries: readonly AmplitudeEntry[],
): { ok: true; F: number; type: TideType } | TideFailure {
  const semidiurnal = amplitudeOf(entries, 'M2') + amplitudeOf(entries, 'S2');
  const diurnal = amplitudeOf(entries, 'K1') + amplitudeOf(entries, 'O1');
  if (!(semidiurnal > 0)) {
    return { ok: false, code: 'invalid-input', message: 'the form factor needs M2 or S2 with a positive amplitude' };
  }
  const F = diurnal / semidiurnal;
  return { ok: true, F, type: classifyFormFactor(F) };
}

export interface SpringNeapState {
  /** 0 at neaps, 1 at springs. */
  index: number;
  /** Semidiurnal envelope amplitude E(t). */
  envelope: number;
  /** E(t) / (f H) of M2. */
  envelopeRatio: number;
  /** MSf phase Δ in [0, 360): 0 at springs, 180 at neaps. */
  msfPhaseDeg: number;
  daysToNextSpring: number;
  daysToNextNeap: number;
}

export interface PhaseEntry extends AmplitudeEntry {
  phaseDeg: number;
}

/** Where timeMs sits in the spring–neap cycle of the given M2 and S2. */
export function springNeapState(
  entries: readonly PhaseEntry[],
  timeMs: number,
  options: TermOptions = {},
): { ok: true; state: SpringNeapState } | TideFailure {
  const m2 = entries.find((e) => constituentIndex(e.name) === constituentIndex('M2'));
  const s2 = entries.find((e) => constituentIndex(e.name) === constituentIndex('S2'));
  if (!m2 || !s2 || !(m2.amplitude > 0) || !(s2.amplitude > 0)) {
    return { ok: false, code: 'invalid-input', message: 'the spring–neap indicator needs M2 and S2 with positive amplitudes' };
  }
  if (!Number.isFinite(timeMs)) return { ok: false, code: 'invalid-input', message: 'time must be finite' };
  const index = Int32Array.of(constituentIndex('M2'), constituentIndex('S2'));
  const terms = createTerms(index, [m2.amplitude, s2.amplitude], [m2.phaseDeg, s2.phaseDeg], null, null, options);
  updateTerms(terms, timeMs);
  const hours = (timeMs - terms.chunkStartMs) / 3_600_000;
  const phiM2 = terms.omega[0]! * hours + terms.arg0[0]!;
  const phiS2 = terms.omega[1]! * hours + terms.arg0[1]!;
  const a = terms.fa[0]!;
  const b = terms.fa[1]!;
  const delta = phiS2 - phiM2;
  const envelope = Math.sqrt(a * a + b * b + 2 * a * b * Math.cos(delta));
  const deltaDeg = (((delta * 180) / Math.PI) % 360 + 360) % 360;
  const msfSpeed = constituentSpeedDegPerH(STANDARD_CONSTITUENTS[index[1]!]!) - constituentSpeedDegPerH(STANDARD_CONSTITUENTS[index[0]!]!);
  const toSpringH = ((360 - deltaDeg) % 360) / msfSpeed;
  const toNeapH = ((540 - deltaDeg) % 360) / msfSpeed;
  return {
    ok: true,
    state: {
      index: (envelope - Math.abs(a - b)) / (2 * Math.min(a, b)),
      envelope,
      envelopeRatio: envelope / a,
      msfPhaseDeg: deltaDeg,
      daysToNextSpring: toSpringH / 24,
      daysToNextNeap: toNeapH / 24,
    },
  };
}
