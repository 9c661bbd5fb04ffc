import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { ServiceStatus } from '../../features/status/components/service-status.tsx';

export function OverviewRoute() {
  return (
    <div className="space-y-6">
      <section>
        <h1 className="text-2xl font-bold text-tide-900">Overview</h1>
        <p className="mt-2 max-w-prose text-ink-soft">
          Planktide forecasts where the cells of the organisms you watch sit in the water column at each of your sites,
          hour by hour over the coming days, driven by each site&apos;s own tides.
        </p>
        <div className="mt-3">
          <ServiceStatus />
        </div>
      </section>
      <SafetyNotice />
    </div>
  );
}
