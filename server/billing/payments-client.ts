import Stripe from 'stripe';

/**
 * The payments SDK client. With a URL (the local stand-in, or any stand-in) it is pointed there by host,
 * port and protocol; without one it talks to the hosted service.
 */
export function createPaymentsClient(options: { secretKey: string; url?: string; timeoutMs?: number }): Stripe {
  const settings: Stripe.StripeConfig = { maxNetworkRetries: 1, timeout: options.timeoutMs ?? 15_000, appInfo: { name: 'Planktide' } };
  if (options.url) {
    const url = new URL(options.url);
    const protocol = url.protocol === 'http:' ? 'http' : 'https';
    settings.host = url.hostname;
    settings.port = url.port || (protocol === 'http' ? 80 : 443);
    settings.protocol = protocol;
  }
  return new Stripe(options.secretKey, settings);
}
