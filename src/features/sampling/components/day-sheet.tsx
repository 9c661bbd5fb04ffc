import type { PlannedSample } from '../../../../shared/schemas/sampling.schema.ts';
import { SafetyNotice } from '../../../components/ui/safety-notice.tsx';
import { dayTitle, depthLabel, localClock } from './format.ts';

/** The boat's sheet for one site-local day: times in the site's zone, depths in metres below the surface, room to write. */
export function DaySheet({ date, siteName, timeZone, samples }: { date: string; siteName: string; timeZone: string; samples: PlannedSample[] }) {
  return (
    <article className="day-sheet space-y-4 bg-white p-4 text-ink print:p-0" aria-label={`Day sheet ${siteName} ${date}`}>
      <header className="border-b-2 border-ink pb-2">
        <h2 className="text-xl font-bold">Sampling day sheet: {siteName}</h2>
        <p>
          {dayTitle(date)}. Times are local ({timeZone}); depths are metres below the surface.
        </p>
      </header>
      {samples.length === 0 ? (
        <p>No samples planned at this site on this day.</p>
      ) : (
        <table className="w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-ink text-left">
              <th scope="col" className="py-1 pr-2">Time</th>
              <th scope="col" className="py-1 pr-2">Method and depth</th>
              <th scope="col" className="py-1 pr-2">Why</th>
              <th scope="col" className="py-1 pr-2">Taken at</th>
              <th scope="col" className="py-1">Notes / sample id</th>
            </tr>
          </thead>
          <tbody>
            {samples.map((s) => (
              <tr key={s.id} className="break-inside-avoid border-b border-line align-top">
                <td className="py-2 pr-2 font-semibold whitespace-nowrap">{localClock(s.plannedAt, s.timeZone)}</td>
                <td className="py-2 pr-2 font-semibold">{depthLabel(s)}</td>
                <td className="py-2 pr-2 text-xs">{s.reason}</td>
                <td className="py-2 pr-2">{s.takenAt ? localClock(s.takenAt, s.timeZone) : '________'}</td>
                <td className="py-2 text-xs">
                  {s.notes ?? ''}
                  <div className="mt-4 border-b border-dotted border-ink-soft" />
                  <span className="text-ink-soft">{s.id.slice(0, 8)}</span>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <SafetyNotice />
    </article>
  );
}
