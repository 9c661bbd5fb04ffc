/**
 * Tidal constituents known to the model: the standard list of shared/tides (IHO TWCWG 2017,
 * speeds derived from Doodson numbers), so a site's constituent set always runs in the model.
 */
import { constituentSpeedDegPerH, findConstituent, STANDARD_CONSTITUENT_NAMES } from '../tides/constituents.ts';

export const CONSTITUENT_NAMES: readonly string[] = STANDARD_CONSTITUENT_NAMES;

export function isConstituentName(name: string): boolean {
  return findConstituent(name) !== undefined;
}

function speedDegPerH(name: string): number {
  const definition = findConstituent(name);
  if (!definition) throw new Error(`unknown constituent ${name}`);
  return constituentSpeedDegPerH(definition);
}

/** Angular speed in radians per second. */
export function constituentOmega(name: string): number {
  return (speedDegPerH(name) * Math.PI) / 180 / 3600;
}

/** Period in seconds. */
export function constituentPeriodS(name: string): number {
  return (360 / speedDegPerH(name)) * 3600;
}
