import { DateTime } from 'luxon';
import { useState, type FormEvent } from 'react';
import { sampleInputSchema, type PlannedSample, type SampleInput } from '../../../../shared/schemas/sampling.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateSample, useUpdateSample } from '../api/save-sample.ts';

export interface SiteChoice {
  id: string;
  name: string;
  timeZone: string;
  waterDepthM: number;
}

type Draft = Record<'siteId' | 'local' | 'method' | 'depthM' | 'topM' | 'bottomM' | 'reason', string>;

const num = (text: string) => (text.trim() === '' ? null : Number(text));

function draftFrom(sites: SiteChoice[], sample?: PlannedSample, siteId?: string): Draft {
  if (sample) {
    return {
      siteId: sample.siteId,
      local: DateTime.fromISO(sample.plannedAt, { zone: 'utc' }).setZone(sample.timeZone).toFormat("yyyy-LL-dd'T'HH:mm"),
      method: sample.method,
      depthM: sample.depthM === null ? '' : String(sample.depthM),
      topM: sample.topM === null ? '' : String(sample.topM),
      bottomM: sample.bottomM === null ? '' : String(sample.bottomM),
      reason: sample.reason,
    };
  }
  const site = sites.find((s) => s.id === siteId) ?? sites[0];
  const tomorrow = DateTime.now().setZone(site?.timeZone ?? 'UTC').plus({ days: 1 }).set({ hour: 9, minute: 0 });
  return { siteId: site?.id ?? '', local: tomorrow.toFormat("yyyy-LL-dd'T'HH:mm"), method: 'hose', depthM: '', topM: '0', bottomM: String(Math.min(10, site?.waterDepthM ?? 10)), reason: '' };
}

/** Plan a sample by hand, or change a planned one; the time is typed in the site's own zone. */
export function SampleForm({ orgId, sites, sample, siteId, onDone }: { orgId: string; sites: SiteChoice[]; sample?: PlannedSample; siteId?: string; onDone: () => void }) {
  const [draft, setDraft] = useState<Draft>(() => draftFrom(sites, sample, siteId));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const create = useCreateSample(orgId);
  const update = useUpdateSample(orgId);
  const pending = create.isPending || update.isPending;
  const failure = create.error ?? update.error;
  const site = sites.find((s) => s.id === draft.siteId);
  const set = (key: keyof Draft) => (event: { target: { value: string } }) => setDraft((d) => ({ ...d, [key]: event.target.value }));

  function submit(event: FormEvent) {
    event.preventDefault();
    if (!site) return setErrors({ siteId: 'choose a site' });
    const when = DateTime.fromISO(draft.local, { zone: site.timeZone });
    const bottle = draft.method === 'bottle';
    const parsed = sampleInputSchema.safeParse({
      plannedAt: when.isValid ? when.toUTC().toISO() : '',
      method: draft.method,
      depthM: bottle ? num(draft.depthM) : null,
      topM: bottle ? null : num(draft.topM),
      bottomM: bottle ? null : num(draft.bottomM),
      reason: draft.reason,
    });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? ''), i.path[0] === 'plannedAt' ? 'give a date and time' : i.message])));
      return;
    }
    const depthErrors: Record<string, string> = {};
    for (const key of ['depthM', 'topM', 'bottomM'] as const) {
      const v = parsed.data[key];
      if (v != null && v > site.waterDepthM) depthErrors[key] = `must not be deeper than the water (${site.waterDepthM} m)`;
    }
    if (Object.keys(depthErrors).length) return setErrors(depthErrors);
    setErrors({});
    const onError = (error: Error) => {
      if (error instanceof ApiError && error.details) setErrors(Object.fromEntries(error.details.map((d) => [d.path, d.message])));
    };
    const input: SampleInput = parsed.data;
    if (sample) update.mutate({ sampleId: sample.id, changes: input }, { onSuccess: onDone, onError });
    else create.mutate({ siteId: site.id, input }, { onSuccess: onDone, onError });
  }

  return (
    <form onSubmit={submit} noValidate className="grid gap-3 rounded-lg border border-line bg-white p-4 sm:grid-cols-2" aria-label={sample ? 'Change planned sample' : 'Plan a sample'}>
      <SelectField label="Site" value={draft.siteId} onChange={set('siteId')} error={errors.siteId} disabled={Boolean(sample)}>
        {sites.map((s) => (
          <option key={s.id} value={s.id}>
            {s.name}
          </option>
        ))}
      </SelectField>
      <TextField label={`Date and time (${site?.timeZone ?? 'site time'})`} type="datetime-local" value={draft.local} onChange={set('local')} error={errors.plannedAt} />
      <SelectField label="Method" value={draft.method} onChange={set('method')} error={errors.method}>
        <option value="hose">Hose over a depth range</option>
        <option value="bottle">Bottle at one depth</option>
      </SelectField>
      {draft.method === 'bottle' ? (
        <TextField label="Bottle depth (m below surface)" inputMode="decimal" value={draft.depthM} onChange={set('depthM')} error={errors.depthM} />
      ) : (
        <div className="grid grid-cols-2 gap-2">
          <TextField label="Hose top (m below surface)" inputMode="decimal" value={draft.topM} onChange={set('topM')} error={errors.topM} />
          <TextField label="Hose bottom (m below surface)" inputMode="decimal" value={draft.bottomM} onChange={set('bottomM')} error={errors.bottomM} />
        </div>
      )}
      <div className="sm:col-span-2">
        <TextField label="Reason" value={draft.reason} onChange={set('reason')} error={errors.reason} />
      </div>
      {failure && !(failure instanceof ApiError && failure.details) && (
        <p role="alert" className="text-sm font-semibold text-alarm-600 sm:col-span-2">
          {failure.message}
        </p>
      )}
      <div className="flex gap-2 sm:col-span-2">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : sample ? 'Save changes' : 'Plan sample'}
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
