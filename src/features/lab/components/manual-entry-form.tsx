import { useState, type FormEvent } from 'react';
import type { Site } from '../../../../shared/schemas/site.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useAddResult } from '../api/add-result.ts';

const EMPTY = { siteId: '', sampleId: '', sampledAt: '', depthTopM: '', depthBottomM: '', method: 'bottle', taxon: '', cellsPerL: '', detectionLimit: '', analyst: '', lab: '' };

/** Enter one result by hand; the time is read in the chosen site's zone. */
export function ManualEntryForm({ orgId, sites }: { orgId: string; sites: Site[] }) {
  const add = useAddResult(orgId);
  const [form, setForm] = useState({ ...EMPTY, siteId: sites[0]?.id ?? '' });
  const set = (key: keyof typeof EMPTY) => (e: { target: { value: string } }) => setForm((f) => ({ ...f, [key]: e.target.value }));
  const site = sites.find((s) => s.id === form.siteId);
  const fieldError = (path: string) => (add.error instanceof ApiError ? add.error.details?.find((d) => d.path === path)?.message : undefined);

  function offsetIn(zone: string, local: string): string {
    // The offset of the zone at that local time (found by formatting the instant read as UTC, then correcting once).
    const guess = new Date(`${local}:00Z`);
    const parts = new Intl.DateTimeFormat('en-GB', { timeZone: zone, timeZoneName: 'longOffset' }).formatToParts(guess);
    const name = parts.find((p) => p.type === 'timeZoneName')?.value ?? 'GMT';
    const match = /GMT([+-]\d{2}):?(\d{2})?/.exec(name);
    return match ? `${match[1]}:${match[2] ?? '00'}` : '+00:00';
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    if (!site) return;
    const number = (text: string) => (text.trim() === '' ? undefined : Number(text));
    add.mutate(
      {
        siteId: form.siteId,
        sampleId: form.sampleId,
        sampledAt: form.sampledAt ? `${form.sampledAt}:00${offsetIn(site.timeZone, form.sampledAt)}` : '',
        depthTopM: number(form.depthTopM),
        depthBottomM: form.method === 'hose' ? number(form.depthBottomM) : undefined,
        method: form.method,
        taxon: form.taxon,
        cellsPerL: number(form.cellsPerL),
        detectionLimit: number(form.detectionLimit),
        analyst: form.analyst || null,
        lab: form.lab || null,
      },
      { onSuccess: () => setForm((f) => ({ ...EMPTY, siteId: f.siteId, method: f.method, taxon: f.taxon, detectionLimit: f.detectionLimit })) },
    );
  }

  return (
    <section aria-labelledby="manual-heading" className="rounded-lg border border-line bg-white p-4">
      <h3 id="manual-heading" className="font-semibold">Enter a result by hand</h3>
      <form onSubmit={submit} className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        <SelectField label="Site" value={form.siteId} onChange={set('siteId')}>
          {sites.map((s) => (
            <option key={s.id} value={s.id}>{s.name}</option>
          ))}
        </SelectField>
        <TextField label="Sample id" value={form.sampleId} onChange={set('sampleId')} error={fieldError('sampleId')} required />
        <TextField label={`Time sampled (${site?.timeZone ?? 'site time'})`} type="datetime-local" value={form.sampledAt} onChange={set('sampledAt')} error={fieldError('sampledAt')} required />
        <SelectField label="Method" value={form.method} onChange={set('method')}>
          <option value="bottle">Bottle (one depth)</option>
          <option value="hose">Hose (depth range)</option>
        </SelectField>
        <TextField label={form.method === 'hose' ? 'Top of range (m below surface)' : 'Depth (m below surface)'} inputMode="decimal" value={form.depthTopM} onChange={set('depthTopM')} error={fieldError('depthTopM')} required />
        {form.method === 'hose' && <TextField label="Bottom of range (m below surface)" inputMode="decimal" value={form.depthBottomM} onChange={set('depthBottomM')} error={fieldError('depthBottomM')} required />}
        <TextField label="Taxon" value={form.taxon} onChange={set('taxon')} error={fieldError('taxon')} required />
        <TextField label="Cells per litre" inputMode="decimal" value={form.cellsPerL} onChange={set('cellsPerL')} error={fieldError('cellsPerL')} required />
        <TextField label="Detection limit (cells/L)" inputMode="decimal" value={form.detectionLimit} onChange={set('detectionLimit')} error={fieldError('detectionLimit')} required />
        <TextField label="Analyst (optional)" value={form.analyst} onChange={set('analyst')} />
        <TextField label="Laboratory (optional)" value={form.lab} onChange={set('lab')} />
        <div className="self-end">
          <Button type="submit" disabled={add.isPending || !site}>{add.isPending ? 'Saving…' : 'Save result'}</Button>
        </div>
      </form>
      {add.data && <p role="status" className="mt-2 text-sm text-kelp-500">Saved sample {add.data.sampleId}.</p>}
      {add.error && <p role="alert" className="mt-2 text-sm text-alarm-600">{add.error.message}</p>}
    </section>
  );
}
