import type { BillingDeps } from './billing.routes.ts';
import { createPaymentsClient } from './payments-client.ts';
import { startPaymentsStandIn, STANDIN_SECRET_KEY, type RunningPaymentsStandIn } from './payments-standin/start.ts';
import { ensurePrices } from './prices.ts';
import { DEFAULT_GRACE_DAYS } from './subscription-gate.ts';

// Development-only webhook secret of the local stand-in.
export const STANDIN_WEBHOOK_SECRET = 'whsec_planktide_local_standin';

export interface BillingSettings {
  /** The payments API's URL; unset starts the local stand-in (unset with a secret key: the hosted service, see below). */
  paymentsUrl?: string;
  /** The payments secret key; with no paymentsUrl and a key, the SDK's default hosted service is used. */
  secretKey?: string;
  webhookSecret?: string;
  standInPort: number;
  host: string;
  appBaseUrl: string;
  graceDays?: number;
}

export interface RunningBilling {
  deps: Omit<BillingDeps, 'db'>;
  standIn?: RunningPaymentsStandIn;
  /** One line for the start-up banner. */
  describe: string;
  close(): Promise<void>;
}

/**
 * Starts what billing needs: the local payments stand-in when no payments service is configured
 * (delivering its webhooks to APP_BASE_URL/api/billing/webhook), the SDK client, and the plans' prices.
 */
export async function startBilling(settings: BillingSettings): Promise<RunningBilling> {
  const useStandIn = !settings.paymentsUrl && !settings.secretKey;
  let standIn: RunningPaymentsStandIn | undefined;
  let paymentsUrl = settings.paymentsUrl;
  let secretKey = settings.secretKey ?? STANDIN_SECRET_KEY;
  const webhookSecret = settings.webhookSecret ?? STANDIN_WEBHOOK_SECRET;
  if (useStandIn) {
    standIn = await startPaymentsStandIn({ port: settings.standInPort, host: settings.host, webhookUrl: `${settings.appBaseUrl}/api/billing/webhook`, webhookSecret, secretKey });
    paymentsUrl = standIn.url;
    secretKey = standIn.secretKey;
  }
  const stripe = createPaymentsClient({ secretKey, url: paymentsUrl });
  try {
    const prices = await ensurePrices(stripe);
    return {
      deps: { stripe, webhookSecret, appBaseUrl: settings.appBaseUrl, graceDays: settings.graceDays ?? DEFAULT_GRACE_DAYS, prices },
      standIn,
      describe: standIn ? `local payments stand-in at ${standIn.url}` : (paymentsUrl ?? 'hosted payments service'),
      close: async () => {
        await standIn?.close();
      },
    };
  } catch (error) {
    await standIn?.close();
    throw error;
  }
}
