/**
 * The load generator of `npm run bench:load`, run as its own process: autocannon against one URL with
 * a session cookie; prints one JSON line with requests per second, errors and p50/p95/p99 latency
 * (computed from every response time, since autocannon's own summary has no p95).
 */
import autocannon from 'autocannon';

const [url, cookie, connections = '50', seconds = '15', extraHeaders = '{}'] = process.argv.slice(2);
if (!url || !cookie) {
  console.error('usage: load-client URL COOKIE [CONNECTIONS] [SECONDS] [HEADERS-JSON]');
  process.exit(2);
}
const times: number[] = [];
const result = await new Promise<autocannon.Result>((resolve, reject) => {
  const instance = autocannon({ url, connections: Number(connections), duration: Number(seconds), headers: { cookie, accept: 'application/json', ...(JSON.parse(extraHeaders) as Record<string, string>) } }, (error, done) =>
    error ? reject(error) : resolve(done),
  );
  instance.on('response', (_client, _status, _bytes, responseTime) => times.push(responseTime));
});
times.sort((a, b) => a - b);
const pct = (p: number) => Math.round(times[Math.min(times.length - 1, Math.floor((p / 100) * times.length))] ?? Number.NaN);
console.log(
  JSON.stringify({
    url,
    connections: Number(connections),
    seconds: Number(seconds),
    requests: result.requests.total,
    rps: result.requests.average,
    non2xx: result.non2xx,
    statuses: Object.fromEntries(Object.entries(result.statusCodeStats ?? {}).map(([code, stat]) => [code, stat.count])),
    errors: result.errors,
    timeouts: result.timeouts,
    p50: pct(50),
    p95: pct(95),
    p99: pct(99),
  }),
);
