import type { BillingDetail } from '../../../../shared/schemas/billing.schema.ts';
import { formatDate, formatMoney, STATUS_LABELS } from './format.ts';

/** Plan, status, trial end, renewal or end date, next invoice, and the overdue warning. */
export function SubscriptionSummary({ detail, forecastsUnlocked }: { detail: BillingDetail; forecastsUnlocked: boolean }) {
  const rows: [string, string][] = [
    ['Plan', detail.plan ? `${detail.plan.name} (${detail.plan.sites === 1 ? '1 site' : `up to ${detail.plan.sites} sites`}), ${detail.interval === 'year' ? 'yearly' : 'monthly'}` : 'None'],
    ['Status', STATUS_LABELS[detail.status] ?? detail.status],
    ['Forecasts', forecastsUnlocked ? 'Unlocked' : 'Locked'],
  ];
  if (detail.trialEnd) rows.push(['Trial ends', formatDate(detail.trialEnd)]);
  if (detail.currentPeriodEnd && detail.status !== 'canceled') rows.push([detail.cancelAtPeriodEnd ? 'Ends on' : 'Renews on', formatDate(detail.currentPeriodEnd)]);
  if (detail.nextInvoice) rows.push(['Next invoice', `${formatMoney(detail.nextInvoice.amount, detail.nextInvoice.currency)} on ${formatDate(detail.nextInvoice.date)}`]);
  return (
    <div className="space-y-3">
      {detail.status === 'past_due' && (
        <p role="alert" className="rounded-lg border border-alarm-600/40 bg-ember-100 p-3 text-sm">
          The last payment failed. {detail.locksAt && forecastsUnlocked ? `Forecasts stay unlocked until ${formatDate(detail.locksAt)}; ` : 'Forecasts are locked; '}
          update the card through “Manage subscription” to pay.
        </p>
      )}
      <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 rounded-lg border border-line bg-white p-4 text-sm">
        {rows.map(([term, value]) => (
          <div key={term} className="contents">
            <dt className="text-ink-soft">{term}</dt>
            <dd className="font-semibold">{value}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
