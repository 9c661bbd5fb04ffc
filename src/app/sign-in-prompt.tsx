import { SafetyNotice } from '../components/ui/safety-notice.tsx';
import { signInUrl } from '../lib/api-client.ts';
import { ServiceStatus } from '../features/status/components/service-status.tsx';

export function SignInPrompt() {
  return (
    <div className="max-w-xl space-y-5">
      <h1 className="text-2xl font-bold text-tide-900">Sign in to Planktide</h1>
      <p className="text-ink-soft">
        Planktide forecasts where the cells of the organisms you watch sit in the water column at each of your sites, hour by hour over
        the coming days, driven by each site&apos;s own tides.
      </p>
      <a href={signInUrl()} className="inline-block rounded-md bg-tide-700 px-4 py-2 font-semibold text-white hover:bg-tide-900">
        Sign in
      </a>
      <ServiceStatus />
      <SafetyNotice compact />
    </div>
  );
}
