/**
 * Skill of a forecast against lab counts, on log10 cells/L: bias (mean of log10 F − log10 O), root
 * mean square error and Pearson's correlation coefficient of the log values.
 *
 * Counts below the detection limit: a result under its limit (a zero count included) is replaced by
 * half the limit before taking logs, a common practice for left-censored data (e.g. US EPA,
 * "Guidance for Data Quality Assessment", QA/G-9, 2000: substitution of DL/2 when few values are
 * censored). The forecast value is censored at the same limit, so that the model is not judged on
 * differences the lab could not have seen: a forecast under the limit counts as half the limit too.
 */

export interface SkillPair {
  /** Forecast concentration at the sample, cells/L. */
  forecast: number;
  /** Counted concentration, cells/L. */
  observed: number;
  /** The sample's detection limit, cells/L (> 0). */
  detectionLimit: number;
}

export interface Skill {
  n: number;
  /** Mean of log10 F − log10 O (positive: the forecast is too high); null without pairs. */
  bias: number | null;
  /** √ mean (log10 F − log10 O)²; null without pairs. */
  rmse: number | null;
  /** Pearson's r of log10 F and log10 O; null with fewer than 2 pairs or no spread in either. */
  correlation: number | null;
}

/** log10 of a value, with values under the detection limit replaced by half the limit. */
export function censoredLog10(value: number, detectionLimit: number): number {
  return Math.log10(value < detectionLimit ? detectionLimit / 2 : value);
}

/** Whether a value counts as below detection. */
export const belowDetection = (value: number, detectionLimit: number): boolean => value < detectionLimit;

export function skill(pairs: readonly SkillPair[]): Skill {
  const n = pairs.length;
  if (n === 0) return { n, bias: null, rmse: null, correlation: null };
  let sumF = 0;
  let sumO = 0;
  let sumD = 0;
  let sumD2 = 0;
  for (const p of pairs) {
    const f = censoredLog10(p.forecast, p.detectionLimit);
    const o = censoredLog10(p.observed, p.detectionLimit);
    sumF += f;
    sumO += o;
    sumD += f - o;
    sumD2 += (f - o) ** 2;
  }
  const meanF = sumF / n;
  const meanO = sumO / n;
  let sff = 0;
  let soo = 0;
  let sfo = 0;
  for (const p of pairs) {
    const f = censoredLog10(p.forecast, p.detectionLimit) - meanF;
    const o = censoredLog10(p.observed, p.detectionLimit) - meanO;
    sff += f * f;
    soo += o * o;
    sfo += f * o;
  }
  const spread = Math.sqrt(sff * soo);
  const correlation = n >= 2 && spread > 1e-300 ? Math.max(-1, Math.min(1, sfo / spread)) : null;
  return { n, bias: sumD / n, rmse: Math.sqrt(sumD2 / n), correlation };
}

/** Sum of squared log10 differences: the calibration's objective (censored as in `skill`). */
export function sumSquaredLogError(pairs: readonly SkillPair[]): number {
  let sum = 0;
  for (const p of pairs) sum += (censoredLog10(p.forecast, p.detectionLimit) - censoredLog10(p.observed, p.detectionLimit)) ** 2;
  return sum;
}
