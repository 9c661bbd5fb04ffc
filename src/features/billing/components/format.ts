export const formatMoney = (minor: number, currency: string) =>
  new Intl.NumberFormat(undefined, { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);

export const formatDate = (iso: string) => new Date(iso).toLocaleDateString(undefined, { year: 'numeric', month: 'long', day: 'numeric' });

export const STATUS_LABELS: Record<string, string> = {
  none: 'No subscription',
  trialing: 'Free trial',
  active: 'Active',
  past_due: 'Payment overdue',
  canceled: 'Canceled',
  incomplete: 'Waiting for payment',
  incomplete_expired: 'Checkout expired',
  unpaid: 'Unpaid',
  paused: 'Paused',
};
