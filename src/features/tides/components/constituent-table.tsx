import type { ConstituentSet } from '../../../../shared/schemas/tides.schema.ts';
import { bearingOf, num } from './format.ts';

const TH = 'px-3 py-2';
const TD = 'px-3 py-1.5 tabular-nums';

/** The constituents of a set: the depth-mean current (tidal ellipses) and the water level, with units. */
export function ConstituentTable({ set }: { set: ConstituentSet }) {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      {set.current && (
        <div className="overflow-x-auto rounded-lg border border-line bg-white">
          <table className="w-full text-left text-sm">
            <caption className="px-3 py-2 text-left font-semibold">
              Depth-mean current
              {set.current.axisDeg !== null && (
                <span className="ml-2 font-normal text-ink-soft">
                  main axis {num(set.current.axisDeg, 0)}° anticlockwise from east (bearing {bearingOf(set.current.axisDeg)}°), flood positive
                </span>
              )}
            </caption>
            <thead className="bg-tide-50 text-ink-soft">
              <tr>
                <th scope="col" className={TH}>Constituent</th>
                <th scope="col" className={TH}>Major axis (m/s)</th>
                <th scope="col" className={TH}>Minor axis (m/s)</th>
                <th scope="col" className={TH}>Inclination (°)</th>
                <th scope="col" className={TH}>Phase g (°)</th>
              </tr>
            </thead>
            <tbody>
              {set.current.constituents.map((c) => (
                <tr key={c.name} className="border-t border-line">
                  <th scope="row" className={`${TD} font-semibold`}>{c.name}</th>
                  <td className={TD}>{num(c.major)}</td>
                  <td className={TD}>{c.minor === undefined ? '–' : num(c.minor)}</td>
                  <td className={TD}>{c.inclinationDeg === undefined ? '–' : num(c.inclinationDeg, 1)}</td>
                  <td className={TD}>{num(c.phaseDeg, 1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {set.level && (
        <div className="overflow-x-auto rounded-lg border border-line bg-white">
          <table className="w-full text-left text-sm">
            <caption className="px-3 py-2 text-left font-semibold">
              Water level <span className="ml-2 font-normal text-ink-soft">mean level {num(set.level.datumM, 2)} m above chart datum</span>
            </caption>
            <thead className="bg-tide-50 text-ink-soft">
              <tr>
                <th scope="col" className={TH}>Constituent</th>
                <th scope="col" className={TH}>Amplitude (m)</th>
                <th scope="col" className={TH}>Phase g (°)</th>
              </tr>
            </thead>
            <tbody>
              {set.level.constituents.map((c) => (
                <tr key={c.name} className="border-t border-line">
                  <th scope="row" className={`${TD} font-semibold`}>{c.name}</th>
                  <td className={TD}>{num(c.amplitude)}</td>
                  <td className={TD}>{num(c.phaseDeg, 1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <p className="text-xs text-ink-soft lg:col-span-2">Phases are Greenwich phase lags (UTC). Inclination is the direction of the major axis, anticlockwise from east.</p>
    </div>
  );
}
