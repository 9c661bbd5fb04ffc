import { useState } from 'react';
import { LAB_FIELD_LABELS, LAB_FIELDS, type ColumnMapping, type LabField, type UploadPreview } from '../../../../shared/schemas/lab.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { usePreviewUpload } from '../api/preview-upload.ts';
import { useUploadResults } from '../api/upload-results.ts';
import { UploadProblems } from '../../../components/ui/upload-problems.tsx';

const REQUIRED: LabField[] = ['sampleId', 'site', 'sampledAt', 'method', 'taxon', 'cellsPerL', 'detectionLimit'];

function MappingEditor({ preview, mapping, onChange }: { preview: UploadPreview; mapping: ColumnMapping; onChange: (m: ColumnMapping) => void }) {
  return (
    <fieldset className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
      <legend className="mb-1 text-sm font-semibold">Columns of the file</legend>
      {LAB_FIELDS.map((field) => (
        <label key={field} className="flex flex-col gap-1 text-sm">
          <span>
            {LAB_FIELD_LABELS[field]}
            {REQUIRED.includes(field) ? ' *' : ''}
          </span>
          <select
            className="rounded-md border border-line bg-white px-2 py-1"
            value={mapping[field] ?? ''}
            onChange={(e) => {
              const next = { ...mapping };
              if (e.target.value) next[field] = e.target.value;
              else delete next[field];
              onChange(next);
            }}
          >
            <option value="">— not in the file —</option>
            {preview.columns.map((c) => (
              <option key={c} value={c}>
                {c}
              </option>
            ))}
          </select>
        </label>
      ))}
    </fieldset>
  );
}

function PreviewTable({ preview }: { preview: UploadPreview }) {
  const fields = LAB_FIELDS.filter((f) => preview.mapping[f]);
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-xs">
        <caption className="py-1 text-left text-sm text-ink-soft">
          First {preview.rows.length} of {preview.rowCount} rows. {preview.rowsWithProblems ? `${preview.rowsWithProblems} row${preview.rowsWithProblems > 1 ? 's have' : ' has'} problems.` : 'No row problems found.'}
        </caption>
        <thead>
          <tr className="border-b border-line">
            <th className="px-1 py-1">Row</th>
            {fields.map((f) => (
              <th key={f} className="px-1 py-1">{preview.mapping[f]}</th>
            ))}
            <th className="px-1 py-1">Problems</th>
          </tr>
        </thead>
        <tbody>
          {preview.rows.map((r) => (
            <tr key={r.row} className={`border-b border-line ${r.problems.length ? 'bg-ember-100' : ''}`}>
              <td className="px-1 py-1">{r.row}</td>
              {fields.map((f) => (
                <td key={f} className="px-1 py-1">{r.values[f] ?? ''}</td>
              ))}
              <td className="px-1 py-1 text-alarm-600">{r.problems.map((p) => `${p.column ?? ''}: ${p.message}`).join('; ')}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Upload a lab's CSV: preview, map the columns, import all or nothing. */
export function UploadPanel({ orgId }: { orgId: string }) {
  const preview = usePreviewUpload(orgId);
  const upload = useUploadResults(orgId);
  const [file, setFile] = useState<File | null>(null);
  const [mapping, setMapping] = useState<ColumnMapping | null>(null);

  function choose(next: File | null) {
    setFile(next);
    setMapping(null);
    upload.reset();
    if (next) preview.mutate({ file: next, mapping: null }, { onSuccess: (p) => setMapping(p.mapping) });
  }

  return (
    <section aria-labelledby="upload-heading" className="rounded-lg border border-line bg-white p-4">
      <h3 id="upload-heading" className="font-semibold">Upload a lab's results (CSV)</h3>
      <p className="mt-1 text-xs text-ink-soft">
        One row per sample and taxon: sample id, site (name or id), time sampled with its zone (e.g. 2026-11-20T09:15:00+00:00, or a zone column), depth in m below the surface (5 for a bottle, 0-10 for a hose), method hose or bottle, taxon, cells per litre, detection limit. Nothing is imported unless every row is good.
      </p>
      <div className="mt-3 max-w-md">
        <TextField label="CSV file" type="file" accept=".csv,text/csv" onChange={(e) => choose(e.target.files?.[0] ?? null)} />
      </div>
      {preview.isPending && <p className="mt-2 text-sm text-ink-soft">Reading the file…</p>}
      <UploadProblems error={preview.error} />
      {preview.data && mapping && file && (
        <div className="mt-4 space-y-3">
          <MappingEditor preview={preview.data} mapping={mapping} onChange={setMapping} />
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => preview.mutate({ file, mapping })}>Check the mapping</Button>
            <Button onClick={() => upload.mutate({ file, mapping })} disabled={upload.isPending}>{upload.isPending ? 'Importing…' : 'Import results'}</Button>
          </div>
          {preview.data.fileProblems.length > 0 && (
            <ul role="alert" className="list-disc pl-5 text-sm text-alarm-600">
              {preview.data.fileProblems.map((p, i) => (
                <li key={i}>{p.path}: {p.message}</li>
              ))}
            </ul>
          )}
          <PreviewTable preview={preview.data} />
        </div>
      )}
      {upload.data && <p role="status" className="mt-3 text-sm font-semibold text-kelp-500">Imported {upload.data.imported} results from {upload.data.fileName}.</p>}
      <UploadProblems error={upload.error} />
    </section>
  );
}
