import { useHealth } from '../api/get-health.ts';

export function ServiceStatus() {
  const health = useHealth();
  if (health.isPending) return <p className="text-sm text-ink-soft">Checking the service…</p>;
  if (health.isError) {
    return (
      <p role="status" className="text-sm text-alarm-600">
        The Planktide service cannot be reached: {health.error.message}
      </p>
    );
  }
  const { database, version } = health.data;
  return (
    <p role="status" className="text-sm text-ink-soft">
      Service version {version}.{' '}
      {database === 'ok' ? (
        <span className="text-kelp-500 font-semibold">Database connected.</span>
      ) : (
        <span className="text-alarm-600 font-semibold">Database unavailable: forecasts and plans cannot load right now.</span>
      )}
    </p>
  );
}
