import { useState } from 'react';
import type { PlannedSample } from '../../../../shared/schemas/sampling.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { useDeleteSample, useMarkTaken } from '../api/save-sample.ts';
import { dayTitle, depthLabel, localClock, localDay } from './format.ts';

function TakenForm({ orgId, sample, onDone }: { orgId: string; sample: PlannedSample; onDone: () => void }) {
  const [notes, setNotes] = useState('');
  const taken = useMarkTaken(orgId);
  return (
    <form
      className="mt-2 flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        taken.mutate({ sampleId: sample.id, notes }, { onSuccess: onDone });
      }}
    >
      <label className="flex flex-col text-xs font-semibold">
        Notes (optional)
        <input className="rounded-md border border-line px-2 py-1 text-sm font-normal" value={notes} onChange={(e) => setNotes(e.target.value)} />
      </label>
      <Button type="submit" disabled={taken.isPending}>
        Confirm taken now
      </Button>
      <Button variant="secondary" onClick={onDone}>
        Cancel
      </Button>
      {taken.error && <p role="alert" className="w-full text-sm text-alarm-600">{taken.error.message}</p>}
    </form>
  );
}

/** The plan, by site-local day: crew mark samples taken; managers change or delete planned ones. */
export function SampleTable({ orgId, samples, canEdit, onEdit }: { orgId: string; samples: PlannedSample[]; canEdit: boolean; onEdit: (sample: PlannedSample) => void }) {
  const [taking, setTaking] = useState<string | null>(null);
  const remove = useDeleteSample(orgId);
  if (samples.length === 0) return <p className="text-ink-soft">No samples planned in this period.{canEdit ? ' Plan one, or add the advice of a forecast from its site screen.' : ''}</p>;
  const days = new Map<string, PlannedSample[]>();
  for (const s of samples) {
    const key = localDay(s.plannedAt, s.timeZone);
    days.set(key, [...(days.get(key) ?? []), s]);
  }
  return (
    <div className="space-y-4">
      {[...days.entries()].map(([day, list]) => (
        <section key={day} aria-label={dayTitle(day)}>
          <h3 className="mb-1 font-bold text-tide-900">{dayTitle(day)}</h3>
          <ul className="divide-y divide-line rounded-lg border border-line bg-white">
            {list.map((s) => (
              <li key={s.id} className="p-3 text-sm" data-testid="planned-sample">
                <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                  <time dateTime={s.plannedAt} className="font-semibold">
                    {localClock(s.plannedAt, s.timeZone)}
                  </time>
                  <span>{s.siteName}</span>
                  <span className="font-semibold">{depthLabel(s)}</span>
                  {s.adviceKind && <span className="rounded bg-tide-50 px-1 text-xs">from forecast advice ({s.adviceKind.replace('_', ' ')})</span>}
                  <span className="ml-auto">
                    {s.takenAt ? (
                      <span className="rounded bg-kelp-500/15 px-2 py-0.5 text-xs font-semibold">
                        Taken {localClock(s.takenAt, s.timeZone)}
                        {s.takenBy ? ` by ${s.takenBy.displayName}` : ''}
                      </span>
                    ) : (
                      <span className="rounded bg-ember-100 px-2 py-0.5 text-xs font-semibold">Planned</span>
                    )}
                  </span>
                </div>
                {s.reason && <p className="mt-1 text-ink-soft">{s.reason}</p>}
                {s.notes && <p className="mt-1">Notes: {s.notes}</p>}
                {!s.takenAt && (
                  <div className="mt-2 flex flex-wrap gap-2">
                    {taking !== s.id && (
                      <Button variant="secondary" onClick={() => setTaking(s.id)} aria-label={`Mark taken: ${depthLabel(s)} at ${localClock(s.plannedAt, s.timeZone)}`}>
                        Mark taken
                      </Button>
                    )}
                    {canEdit && taking !== s.id && (
                      <>
                        <Button variant="secondary" onClick={() => onEdit(s)}>
                          Edit
                        </Button>
                        <Button variant="secondary" onClick={() => window.confirm('Delete this planned sample?') && remove.mutate(s.id)}>
                          Delete
                        </Button>
                      </>
                    )}
                  </div>
                )}
                {taking === s.id && <TakenForm orgId={orgId} sample={s} onDone={() => setTaking(null)} />}
              </li>
            ))}
          </ul>
        </section>
      ))}
      {remove.error && <p role="alert" className="text-sm text-alarm-600">{remove.error.message}</p>}
    </div>
  );
}
