import { useSearchParams } from 'react-router-dom';
import { ErrorPanel } from '../../components/ui/error-panel.tsx';
import { Button } from '../../components/ui/button.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useBillingStatus } from '../../features/billing/api/get-billing-status.ts';
import { useOpenPortal } from '../../features/billing/api/open-portal.ts';
import { useStartCheckout } from '../../features/billing/api/start-checkout.ts';
import { InvoiceTable } from '../../features/billing/components/invoice-table.tsx';
import { PlanPicker } from '../../features/billing/components/plan-picker.tsx';
import { SubscriptionSummary } from '../../features/billing/components/subscription-summary.tsx';
import { useOrg } from '../org-context.ts';

const CURRENT = ['trialing', 'active', 'past_due', 'unpaid', 'paused', 'incomplete'];

/** Sends the browser to the payments service's page (checkout or portal). */
const go = (answer: { url: string } | null) => {
  if (answer) window.location.assign(answer.url);
};

export default function BillingRoute() {
  const { orgId, orgName, role } = useOrg();
  const [search] = useSearchParams();
  const returned = search.get('checkout');
  const status = useBillingStatus(orgId, returned === 'complete');
  const checkout = useStartCheckout(orgId);
  const portal = useOpenPortal(orgId);

  if (role !== 'owner') {
    return (
      <div className="space-y-4">
        <PageHeader title="Billing" />
        <ErrorPanel title="Billing is for owners" message={`Only an owner of ${orgName} can subscribe or change the plan. Ask your owner if forecasts are locked.`} />
        <QueryState query={status}>{(data) => <p className="text-sm">Forecasts are {data.forecastsUnlocked ? 'unlocked' : 'locked'} for {orgName}.</p>}</QueryState>
      </div>
    );
  }

  const failure = checkout.error ?? portal.error;
  return (
    <div className="space-y-8">
      <PageHeader title="Billing" />
      {returned === 'complete' && (
        <p role="status" className="rounded-lg border border-kelp-500/40 bg-white p-3 text-sm">
          {status.data?.detail?.status === 'none' ? 'Thank you. The payments service is confirming your subscription; this page updates when it has.' : 'Thank you: your subscription is confirmed.'}
        </p>
      )}
      {returned === 'cancelled' && <p role="status" className="rounded-lg border border-line bg-white p-3 text-sm">Checkout was cancelled; nothing was charged.</p>}
      {failure && <ErrorPanel title="The payments service could not be reached" message={failure.message} />}
      <QueryState query={status}>
        {(data) => {
          const detail = data.detail!;
          const current = CURRENT.includes(detail.status);
          return (
            <>
              <section aria-labelledby="subscription" className="space-y-3">
                <h2 id="subscription" className="text-lg font-bold">Subscription</h2>
                <SubscriptionSummary detail={detail} forecastsUnlocked={data.forecastsUnlocked} />
                {detail.canManage && (
                  <div>
                    <Button variant="secondary" disabled={portal.isPending} onClick={() => portal.mutate(undefined, { onSuccess: go })}>
                      Manage subscription
                    </Button>
                    <p className="mt-1 text-xs text-ink-soft">Change plan, cancel, or update the card on the payments service’s page.</p>
                  </div>
                )}
              </section>
              {!current && (
                <section aria-labelledby="plans" className="space-y-3">
                  <h2 id="plans" className="text-lg font-bold">Choose a plan</h2>
                  <p className="text-sm text-ink-soft">Forecasts, sampling plans and alerts need a subscription. Plans differ by the number of sites.</p>
                  <PlanPicker plans={detail.plans} trialAvailable={detail.trialAvailable} busy={checkout.isPending} onChoose={(plan, interval) => checkout.mutate({ plan, interval }, { onSuccess: go })} />
                </section>
              )}
              <section aria-labelledby="invoices" className="space-y-3">
                <h2 id="invoices" className="text-lg font-bold">Invoices</h2>
                {detail.invoicesUnavailable ? <p className="text-sm text-ink-soft">The invoices could not be fetched just now; try again later.</p> : <InvoiceTable invoices={detail.invoices} />}
              </section>
            </>
          );
        }}
      </QueryState>
    </div>
  );
}
