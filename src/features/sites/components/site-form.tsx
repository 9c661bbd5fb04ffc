import { useState, type FormEvent } from 'react';
import { BED_TYPE_KEYS, BED_TYPES, bedTypeRoughness } from '../../../../shared/bed-types.ts';
import { siteInputSchema, type Site, type SiteInput } from '../../../../shared/schemas/site.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useSaveSite } from '../api/save-site.ts';

type Draft = Record<'name' | 'latitudeDeg' | 'longitudeDeg' | 'timeZone' | 'waterDepthM' | 'bedType' | 'bedRoughnessM' | 'gearTopM' | 'gearBottomM', string>;

const browserZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;

function draftFrom(site?: Site): Draft {
  if (!site) {
    return { name: '', latitudeDeg: '', longitudeDeg: '', timeZone: browserZone(), waterDepthM: '', bedType: 'mud', bedRoughnessM: '', gearTopM: '0', gearBottomM: '' };
  }
  return {
    name: site.name,
    latitudeDeg: String(site.latitudeDeg),
    longitudeDeg: String(site.longitudeDeg),
    timeZone: site.timeZone,
    waterDepthM: String(site.waterDepthM),
    bedType: site.bedType ?? 'custom',
    bedRoughnessM: site.bedType ? '' : String(site.bedRoughnessM),
    gearTopM: String(site.gearTopM),
    gearBottomM: String(site.gearBottomM),
  };
}

const num = (text: string) => (text.trim() === '' ? Number.NaN : Number(text));

function toInput(draft: Draft): unknown {
  const custom = draft.bedType === 'custom';
  return {
    name: draft.name,
    latitudeDeg: num(draft.latitudeDeg),
    longitudeDeg: num(draft.longitudeDeg),
    timeZone: draft.timeZone,
    waterDepthM: num(draft.waterDepthM),
    bedType: custom ? null : draft.bedType,
    bedRoughnessM: custom ? num(draft.bedRoughnessM) : null,
    gearTopM: num(draft.gearTopM),
    gearBottomM: num(draft.gearBottomM),
  };
}

export function SiteForm({ orgId, site, onSaved }: { orgId: string; site?: Site; onSaved: (site: Site) => void }) {
  const [draft, setDraft] = useState<Draft>(() => draftFrom(site));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useSaveSite(orgId, site?.id);
  const set = (key: keyof Draft) => (event: { target: { value: string } }) => setDraft((d) => ({ ...d, [key]: event.target.value }));

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = siteInputSchema.safeParse(toInput(draft));
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? ''), i.message])));
      return;
    }
    setErrors({});
    save.mutate(parsed.data as SiteInput, {
      onSuccess: (saved) => saved && onSaved(saved),
      onError: (error) => {
        if (error instanceof ApiError && error.details) setErrors(Object.fromEntries(error.details.map((d) => [d.path, d.message])));
      },
    });
  }

  return (
    <form onSubmit={submit} noValidate className="grid max-w-2xl gap-4 sm:grid-cols-2">
      <div className="sm:col-span-2">
        <TextField label="Site name" value={draft.name} onChange={set('name')} error={errors.name} required />
      </div>
      <TextField label="Latitude (°, north positive)" inputMode="decimal" value={draft.latitudeDeg} onChange={set('latitudeDeg')} error={errors.latitudeDeg} />
      <TextField label="Longitude (°, east positive)" inputMode="decimal" value={draft.longitudeDeg} onChange={set('longitudeDeg')} error={errors.longitudeDeg} />
      <TextField label="Time zone" value={draft.timeZone} onChange={set('timeZone')} error={errors.timeZone} hint="IANA name, e.g. Europe/London. Times are shown in this zone." />
      <TextField label="Water depth (m, at mean level)" inputMode="decimal" value={draft.waterDepthM} onChange={set('waterDepthM')} error={errors.waterDepthM} />
      <SelectField label="Bed type" value={draft.bedType} onChange={set('bedType')} error={errors.bedType}>
        {BED_TYPE_KEYS.map((key) => (
          <option key={key} value={key}>
            {BED_TYPES[key].label} (roughness {(bedTypeRoughness(key) * 1000).toFixed(0)} mm)
          </option>
        ))}
        <option value="custom">Other: give the roughness</option>
      </SelectField>
      {draft.bedType === 'custom' ? (
        <TextField label="Bed roughness ks (m)" inputMode="decimal" value={draft.bedRoughnessM} onChange={set('bedRoughnessM')} error={errors.bedRoughnessM} hint="Nikuradse roughness; z0 = ks/30." />
      ) : (
        <p className="self-end pb-2 text-xs text-ink-soft">Roughness from typical values by bed type (Soulsby 1997).</p>
      )}
      <TextField label="Gear top (m below surface)" inputMode="decimal" value={draft.gearTopM} onChange={set('gearTopM')} error={errors.gearTopM} />
      <TextField label="Gear bottom (m below surface)" inputMode="decimal" value={draft.gearBottomM} onChange={set('gearBottomM')} error={errors.gearBottomM} />
      {save.error && !(save.error instanceof ApiError && save.error.details) && (
        <p role="alert" className="text-sm font-semibold text-alarm-600 sm:col-span-2">
          {save.error.message}
        </p>
      )}
      <div className="sm:col-span-2">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : site ? 'Save changes' : 'Create site'}
        </Button>
      </div>
    </form>
  );
}
