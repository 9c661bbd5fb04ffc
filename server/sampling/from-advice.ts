import type { DayAdvice } from '../../shared/forecast/advice.ts';
import type { AdviceKind, SampleMethod } from '../../shared/schemas/sampling.schema.ts';

export interface AdviceSample {
  adviceKind: AdviceKind;
  plannedAtMs: number;
  method: SampleMethod;
  depthM: number | null;
  topM: number | null;
  bottomM: number | null;
  reason: string;
}

/**
 * The samples a day's advice asks for: the representative hose sample and each worst-case sample
 * (bottle at a depth, or hose over the gear band), each with the advice's own reason. Exposure and
 * official-sample checks are not samples and are left out.
 */
export function samplesFromAdvice(days: DayAdvice[], dates?: string[]): AdviceSample[] {
  const chosen = dates ? days.filter((d) => dates.includes(d.date)) : days;
  const out: AdviceSample[] = [];
  for (const day of chosen) {
    const rep = day.representative;
    out.push({ adviceKind: 'representative', plannedAtMs: rep.timeMs, method: 'hose', depthM: null, topM: rep.topM, bottomM: rep.bottomM, reason: rep.reason });
    for (const worst of day.worstCase) {
      if (worst.method === 'bottle') {
        if (worst.depthM === undefined) continue;
        out.push({ adviceKind: worst.kind, plannedAtMs: worst.timeMs, method: 'bottle', depthM: worst.depthM, topM: null, bottomM: null, reason: worst.reason });
      } else {
        if (worst.topM === undefined || worst.bottomM === undefined || !(worst.bottomM > worst.topM)) continue;
        out.push({ adviceKind: worst.kind, plannedAtMs: worst.timeMs, method: 'hose', depthM: null, topM: worst.topM, bottomM: worst.bottomM, reason: worst.reason });
      }
    }
  }
  // Whole minutes: a plan is read off a watch.
  return out.map((s) => ({ ...s, plannedAtMs: Math.round(s.plannedAtMs / 60_000) * 60_000 }));
}
