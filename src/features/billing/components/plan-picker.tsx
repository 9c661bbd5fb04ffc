import { useState } from 'react';
import type { BillingInterval, Plan } from '../../../../shared/schemas/billing.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { formatMoney } from './format.ts';

interface Props {
  plans: Plan[];
  trialAvailable: boolean;
  busy: boolean;
  onChoose(plan: string, interval: BillingInterval): void;
}

/** The plans side by side, monthly or yearly, each with its subscribe button. */
export function PlanPicker({ plans, trialAvailable, busy, onChoose }: Props) {
  const [interval, setBillingInterval] = useState<BillingInterval>('month');
  return (
    <div className="space-y-4">
      <fieldset className="flex gap-4 text-sm">
        <legend className="mb-1 font-semibold">Billing</legend>
        {(['month', 'year'] as const).map((value) => (
          <label key={value} className="flex items-center gap-2">
            <input type="radio" name="interval" value={value} checked={interval === value} onChange={() => setBillingInterval(value)} />
            {value === 'month' ? 'Monthly' : 'Yearly'}
          </label>
        ))}
      </fieldset>
      <ul className="grid gap-4 sm:grid-cols-3">
        {plans.map((plan) => (
          <li key={plan.id} className="flex flex-col rounded-lg border border-line bg-white p-4">
            <h3 className="text-lg font-bold text-tide-900">{plan.name}</h3>
            <p className="text-sm text-ink-soft">{plan.sites === 1 ? '1 site' : `Up to ${plan.sites} sites`}</p>
            <p className="mt-2 text-xl font-semibold">
              {formatMoney(plan.prices[interval], plan.currency)}
              <span className="text-sm font-normal text-ink-soft"> per {interval}</span>
            </p>
            <p className="mt-2 flex-1 text-sm">{plan.description}</p>
            <Button className="mt-4" disabled={busy} onClick={() => onChoose(plan.id, interval)} aria-label={`Subscribe to ${plan.name}, ${interval === 'month' ? 'monthly' : 'yearly'}`}>
              {trialAvailable ? `Start ${plan.trialDays}-day trial` : 'Subscribe'}
            </Button>
          </li>
        ))}
      </ul>
      {trialAvailable && <p className="text-sm text-ink-soft">The trial is free; the first payment is taken when it ends unless you cancel before.</p>}
    </div>
  );
}
