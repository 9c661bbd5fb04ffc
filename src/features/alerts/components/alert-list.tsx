import { DateTime } from 'luxon';
import type { z } from 'zod';
import type { alertSchema } from '../../../../shared/schemas/forecast.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { useAcknowledgeAlert } from '../api/alerts.ts';

type Alert = z.infer<typeof alertSchema>;
const when = (iso: string) => DateTime.fromISO(iso).setLocale('en-GB').toFormat('ccc d LLL yyyy HH:mm ZZZZ');
const KIND_LABELS: Record<string, string> = { gear_trigger: 'Gear band above trigger', official_sample_phase: 'Official sample in an unrepresentative phase' };

/** Alerts, newest first; owners and managers acknowledge, and who and when is shown to everyone. */
export function AlertList({ orgId, alerts, canAcknowledge }: { orgId: string; alerts: Alert[]; canAcknowledge: boolean }) {
  const ack = useAcknowledgeAlert(orgId);
  if (alerts.length === 0) return <p className="text-ink-soft">No alerts.</p>;
  return (
    <ul className="divide-y divide-line rounded-lg border border-line bg-white">
      {alerts.map((a) => (
        <li key={a.id} className="flex flex-wrap items-start gap-3 p-3 text-sm" data-testid="alert">
          <div className="min-w-0 flex-1">
            <p className="font-semibold">
              {a.siteName}: {KIND_LABELS[a.kind] ?? a.kind}
            </p>
            <p>{a.message}</p>
            <p className="text-xs text-ink-soft">
              Raised {when(a.createdAt)}
              {a.startsAt ? `; from ${when(a.startsAt)}` : ''}
            </p>
          </div>
          {a.acknowledgedAt ? (
            <p className="rounded bg-kelp-500/15 px-2 py-1 text-xs">
              Acknowledged {when(a.acknowledgedAt)}
              {a.acknowledgedBy ? ` by ${a.acknowledgedBy}` : ''}
            </p>
          ) : canAcknowledge ? (
            <Button variant="secondary" onClick={() => ack.mutate(a.id)} disabled={ack.isPending} aria-label={`Acknowledge alert at ${a.siteName}: ${a.message}`}>
              Acknowledge
            </Button>
          ) : (
            <p className="rounded bg-ember-100 px-2 py-1 text-xs">Open</p>
          )}
        </li>
      ))}
      {ack.error && <li role="alert" className="p-3 text-sm text-alarm-600">{ack.error.message}</li>}
    </ul>
  );
}
