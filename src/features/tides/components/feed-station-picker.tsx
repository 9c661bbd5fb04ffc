import { useState } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { useFeedRefreshes } from '../api/get-feed-refreshes.ts';
import { useFeedStations } from '../api/get-feed-stations.ts';
import { useFetchFromFeed } from '../api/fetch-from-feed.ts';
import { siteDate } from './format.ts';

/** Choose a station of the tide feed near the site and fetch its constituents as a new version. */
export function FeedStationPicker({ orgId, siteId, timeZone }: { orgId: string; siteId: string; timeZone: string }) {
  const [open, setOpen] = useState(false);
  const stations = useFeedStations(orgId, siteId, open);
  const refreshes = useFeedRefreshes(orgId, siteId);
  const fetchFeed = useFetchFromFeed(orgId, siteId);
  const [chosen, setChosen] = useState<string | null>(null);
  const lastFailure = refreshes.data?.refreshes.find((r) => !r.ok);
  const lastSuccess = refreshes.data?.refreshes.find((r) => r.ok);
  const selected = chosen ?? stations.data?.chosenStationId ?? stations.data?.stations[0]?.id ?? null;

  return (
    <section aria-labelledby="feed-heading" className="rounded-lg border border-line bg-white p-4">
      <h3 id="feed-heading" className="font-semibold">From the tide feed</h3>
      <p className="mt-1 text-sm text-ink-soft">
        {lastSuccess ? `Last fetched ${siteDate(lastSuccess.attemptedAt, timeZone)} from ${lastSuccess.stationId}.` : 'Not fetched yet.'}
        {lastFailure && (!lastSuccess || lastFailure.attemptedAt > lastSuccess.attemptedAt) && (
          <span className="block text-alarm-600">Last attempt failed ({siteDate(lastFailure.attemptedAt, timeZone)}): {lastFailure.errorMessage}</span>
        )}
      </p>
      {!open ? (
        <Button variant="secondary" className="mt-3" onClick={() => setOpen(true)}>
          Choose a feed station
        </Button>
      ) : stations.isPending ? (
        <p className="mt-3 text-sm text-ink-soft">Looking for stations near the site…</p>
      ) : stations.error ? (
        <p role="alert" className="mt-3 text-sm font-semibold text-alarm-600">{stations.error.message}</p>
      ) : (
        <fieldset className="mt-3">
          <legend className="text-sm font-semibold">Stations near the site</legend>
          {stations.data.stations.length === 0 && <p className="text-sm text-ink-soft">The feed has no station within 150 km.</p>}
          <ul className="mt-1 space-y-1">
            {stations.data.stations.map((s) => (
              <li key={s.id}>
                <label className="flex items-center gap-2 text-sm">
                  <input type="radio" name="feed-station" value={s.id} checked={selected === s.id} onChange={() => setChosen(s.id)} />
                  <span>
                    {s.name} ({s.id}), {s.distanceKm === null ? '' : `${s.distanceKm.toFixed(1)} km away, `}
                    {[s.hasCurrent && 'current', s.hasLevel && 'level'].filter(Boolean).join(' and ')}
                  </span>
                </label>
              </li>
            ))}
          </ul>
          <Button className="mt-3" disabled={!selected || fetchFeed.isPending} onClick={() => selected && fetchFeed.mutate({ stationId: selected })}>
            {fetchFeed.isPending ? 'Fetching (up to 3 tries)…' : 'Fetch constituents'}
          </Button>
        </fieldset>
      )}
      {fetchFeed.data && (
        <p role="status" className="mt-2 text-sm text-kelp-500">
          {fetchFeed.data.outcome === 'created' ? `Stored as version ${fetchFeed.data.set.version}${fetchFeed.data.activated ? ' and made active' : ''}.` : `No change since version ${fetchFeed.data.set.version}.`}
        </p>
      )}
      {fetchFeed.error && <p role="alert" className="mt-2 text-sm font-semibold text-alarm-600">{fetchFeed.error.message}</p>}
    </section>
  );
}
