import { DateTime } from 'luxon';
import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import type { PlannedSample } from '../../../shared/schemas/sampling.schema.ts';
import { Button } from '../../components/ui/button.tsx';
import { SelectField } from '../../components/ui/field.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { calendarUrl, csvUrl, useSamples } from '../../features/sampling/api/get-samples.ts';
import { DaySheet } from '../../features/sampling/components/day-sheet.tsx';
import { localDay } from '../../features/sampling/components/format.ts';
import { SampleForm } from '../../features/sampling/components/sample-form.tsx';
import { SampleTable } from '../../features/sampling/components/sample-table.tsx';
import { useSites } from '../../features/sites/api/get-sites.ts';
import { canManage, useOrg } from '../org-context.ts';

const RANGES = { upcoming: 'Yesterday to two weeks ahead', past: 'The last 30 days', all: 'Everything' } as const;

function rangeFilter(range: keyof typeof RANGES, nowMs: number): { from?: string; to?: string } {
  const day = DateTime.fromMillis(nowMs).toUTC().startOf('day');
  if (range === 'upcoming') return { from: day.minus({ days: 1 }).toISO() ?? undefined, to: day.plus({ days: 15 }).toISO() ?? undefined };
  if (range === 'past') return { from: day.minus({ days: 30 }).toISO() ?? undefined, to: day.plus({ days: 1 }).toISO() ?? undefined };
  return {};
}

export default function PlanRoute() {
  const { orgId, role } = useOrg();
  const editor = canManage(role);
  const [params, setParams] = useSearchParams();
  const siteId = params.get('site') ?? '';
  const sheetDate = params.get('sheet');
  const range = (params.get('range') as keyof typeof RANGES | null) ?? 'upcoming';
  const [nowMs] = useState(() => Date.now());
  const filters = { siteId: siteId || undefined, ...(sheetDate ? {} : rangeFilter(range in RANGES ? range : 'upcoming', nowMs)) };
  const sites = useSites(orgId);
  const samples = useSamples(orgId, filters);
  const [editing, setEditing] = useState<PlannedSample | 'new' | null>(null);
  const update = (key: string, value: string | null) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next);
  };

  if (sheetDate) {
    const site = sites.data?.sites.find((s) => s.id === siteId);
    return (
      <div className="space-y-3">
        <div className="flex flex-wrap gap-2 print:hidden">
          <Button onClick={() => window.print()}>Print day sheet</Button>
          <Button variant="secondary" onClick={() => update('sheet', null)}>
            Back to the plan
          </Button>
        </div>
        <QueryState query={samples}>
          {(data) => (
            <DaySheet
              date={sheetDate}
              siteName={site?.name ?? 'all sites'}
              timeZone={site?.timeZone ?? data.samples[0]?.timeZone ?? 'UTC'}
              samples={data.samples.filter((s) => localDay(s.plannedAt, s.timeZone) === sheetDate)}
            />
          )}
        </QueryState>
      </div>
    );
  }

  const siteChoices = (sites.data?.sites ?? []).map((s) => ({ id: s.id, name: s.name, timeZone: s.timeZone, waterDepthM: s.waterDepthM }));
  const todayAtSite = siteId ? DateTime.now().setZone(siteChoices.find((s) => s.id === siteId)?.timeZone ?? 'UTC').toISODate() : null;
  return (
    <div className="space-y-5">
      <PageHeader title="Sampling plan">
        {editor && editing === null && <Button onClick={() => setEditing('new')}>Plan a sample</Button>}
      </PageHeader>
      <div className="flex flex-wrap items-end gap-4">
        <SelectField label="Site" value={siteId} onChange={(e) => update('site', e.target.value || null)}>
          <option value="">All sites</option>
          {siteChoices.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Period" value={range} onChange={(e) => update('range', e.target.value)}>
          {Object.entries(RANGES).map(([key, text]) => (
            <option key={key} value={key}>
              {text}
            </option>
          ))}
        </SelectField>
        <div className="flex flex-wrap gap-3 pb-2 text-sm">
          <a className="font-semibold text-tide-700 underline" href={calendarUrl(orgId, filters)} download="sampling-plan.ics">
            Calendar file (.ics)
          </a>
          <a className="font-semibold text-tide-700 underline" href={csvUrl(orgId, filters)} download="sampling-plan.csv">
            CSV
          </a>
          {siteId && todayAtSite ? (
            <Link className="font-semibold text-tide-700 underline" to={`?site=${siteId}&sheet=${todayAtSite}`}>
              Today's day sheet
            </Link>
          ) : (
            <span className="text-ink-soft">Choose a site for its printable day sheet.</span>
          )}
        </div>
      </div>
      {editing !== null && siteChoices.length > 0 && (
        <SampleForm key={editing === 'new' ? 'new' : editing.id} orgId={orgId} sites={siteChoices} siteId={siteId || undefined} sample={editing === 'new' ? undefined : editing} onDone={() => setEditing(null)} />
      )}
      <QueryState query={samples}>
        {(data) => (
          <>
            <SampleTable orgId={orgId} samples={data.samples} canEdit={editor} onEdit={(s) => setEditing(s)} />
            {siteId && data.samples.length > 0 && (
              <p className="text-sm">
                Day sheets:{' '}
                {[...new Set(data.samples.map((s) => localDay(s.plannedAt, s.timeZone)))].map((d) => (
                  <Link key={d} className="mr-3 text-tide-700 underline" to={`?site=${siteId}&sheet=${d}`}>
                    {d}
                  </Link>
                ))}
              </p>
            )}
          </>
        )}
      </QueryState>
      <SafetyNotice />
    </div>
  );
}
