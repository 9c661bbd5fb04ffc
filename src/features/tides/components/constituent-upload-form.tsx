import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { useUploadConstituentTable } from '../api/upload-constituent-table.ts';
import { UploadProblems } from '../../../components/ui/upload-problems.tsx';

/** Upload a constituent table (CSV: name, amplitude, phase_deg; for currents also minor, inclination_deg). */
export function ConstituentUploadForm({ orgId, siteId }: { orgId: string; siteId: string }) {
  const upload = useUploadConstituentTable(orgId, siteId);
  const [file, setFile] = useState<File | null>(null);
  const [kind, setKind] = useState<'current' | 'level'>('current');
  const [datumM, setDatumM] = useState('');
  const [activate, setActivate] = useState(true);

  function submit(event: FormEvent) {
    event.preventDefault();
    if (file) upload.mutate({ file, kind, datumM: kind === 'level' ? datumM : undefined, activate });
  }

  return (
    <section aria-labelledby="table-heading" className="rounded-lg border border-line bg-white p-4">
      <h3 id="table-heading" className="font-semibold">Upload a constituent table</h3>
      <p className="mt-1 text-xs text-ink-soft">CSV with columns name, amplitude (m/s for a current, m for a level), phase_deg; for a current also minor and inclination_deg. A kind column (current or level) may mix both.</p>
      <form onSubmit={submit} className="mt-3 grid gap-3 sm:grid-cols-2">
        <TextField label="CSV file" type="file" accept=".csv,text/csv" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
        <SelectField label="Table of" value={kind} onChange={(e) => setKind(e.target.value as 'current' | 'level')}>
          <option value="current">Depth-mean current (m/s)</option>
          <option value="level">Water level (m)</option>
        </SelectField>
        {kind === 'level' && <TextField label="Mean level above chart datum (m)" inputMode="decimal" value={datumM} onChange={(e) => setDatumM(e.target.value)} />}
        <label className="flex items-center gap-2 self-end text-sm">
          <input type="checkbox" checked={activate} onChange={(e) => setActivate(e.target.checked)} /> Make it the active set
        </label>
        <div className="sm:col-span-2">
          <Button type="submit" disabled={!file || upload.isPending}>{upload.isPending ? 'Uploading…' : 'Upload table'}</Button>
        </div>
      </form>
      {upload.data && <p role="status" className="mt-2 text-sm text-kelp-500">Stored as version {upload.data.version}.</p>}
      <UploadProblems error={upload.error} />
    </section>
  );
}
