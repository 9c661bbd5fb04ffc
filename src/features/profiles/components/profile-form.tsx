import { useState, type FormEvent, type ReactNode } from 'react';
import { profileInputSchema, type OrganismParams, type ProfileDetail, type VersionChange } from '../../../../shared/schemas/organism.schema.ts';
import { parameterInfo, type ParameterKey } from '../../../../shared/schemas/organism-parameters.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateProfile } from '../api/create-profile.ts';
import { useUpdateProfile } from '../api/update-profile.ts';
import { EppleyHelper, StokesHelper } from './helpers.tsx';

type ValueKey = Exclude<ParameterKey, 'swimming.schedule'> | 'swimming.upHour' | 'swimming.downHour';

interface Draft {
  name: string;
  taxon: string;
  note: string;
  values: Record<ValueKey, string>;
  swimming: boolean;
  schedule: 'sun' | 'clock';
  growth: boolean;
  bedExchange: boolean;
}

const text = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

function draftFrom(profile?: ProfileDetail): Draft {
  const p = profile?.latest.params;
  const s = p?.swimming;
  const g = p?.growth;
  const b = p?.bedExchange;
  return {
    name: profile?.name ?? '',
    taxon: profile?.taxon ?? '',
    // The note belongs to a version: an unused latest keeps its note, a used one gets a new version with a new note.
    note: profile && !profile.latest.used ? profile.latest.note : '',
    values: {
      settlingVelocityMPerDay: text(p?.settlingVelocityMPerDay ?? 0.5),
      'swimming.speedMPerHour': text(s?.speedMPerHour ?? 1),
      'swimming.upHour': text(s?.schedule.type === 'clock' ? s.schedule.upHour : 6),
      'swimming.downHour': text(s?.schedule.type === 'clock' ? s.schedule.downHour : 18),
      'swimming.minDepthM': text(s?.minDepthM ?? 0),
      'swimming.maxDepthM': text(s?.maxDepthM),
      'growth.maxRatePerDay': text(g?.maxRatePerDay),
      'growth.temperatureC': text(g?.temperatureC ?? 12),
      'growth.lightAttenuationPerM': text(g?.lightAttenuationPerM ?? 0.25),
      'growth.lightSaturationUmol': text(g?.lightSaturationUmol),
      mortalityPerDay: text(p?.mortalityPerDay ?? 0),
      'bedExchange.criticalStressPa': text(b?.criticalStressPa ?? 0.2),
      'bedExchange.erosionRate': text(b?.erosionRate ?? 0),
      initialCellsPerL: text(p?.initialCellsPerL ?? 1000),
      triggerCellsPerL: text(p?.triggerCellsPerL ?? 1000),
      schmidtNumber: text(p?.schmidtNumber ?? 1),
    },
    swimming: Boolean(s),
    schedule: s?.schedule.type ?? 'sun',
    growth: Boolean(g),
    bedExchange: Boolean(b),
  };
}

const num = (value: string) => (value.trim() === '' ? Number.NaN : Number(value));
const optional = (value: string) => (value.trim() === '' ? null : Number(value));

function paramsFrom(d: Draft): unknown {
  const v = d.values;
  return {
    settlingVelocityMPerDay: num(v.settlingVelocityMPerDay),
    swimming: d.swimming
      ? {
          speedMPerHour: num(v['swimming.speedMPerHour']),
          schedule: d.schedule === 'sun' ? { type: 'sun' } : { type: 'clock', upHour: num(v['swimming.upHour']), downHour: num(v['swimming.downHour']) },
          minDepthM: num(v['swimming.minDepthM']),
          maxDepthM: optional(v['swimming.maxDepthM']),
        }
      : null,
    growth: d.growth
      ? {
          maxRatePerDay: optional(v['growth.maxRatePerDay']),
          temperatureC: num(v['growth.temperatureC']),
          lightAttenuationPerM: num(v['growth.lightAttenuationPerM']),
          lightSaturationUmol: num(v['growth.lightSaturationUmol']),
        }
      : null,
    mortalityPerDay: num(v.mortalityPerDay),
    bedExchange: d.bedExchange ? { criticalStressPa: num(v['bedExchange.criticalStressPa']), erosionRate: num(v['bedExchange.erosionRate']) } : null,
    initialCellsPerL: num(v.initialCellsPerL),
    triggerCellsPerL: num(v.triggerCellsPerL),
    schmidtNumber: num(v.schmidtNumber),
  };
}

/** Error paths as the schema and the server name them, e.g. "params.swimming.speedMPerHour"; the clock hours sit under the schedule. */
const errorKey = (key: ValueKey) => (key === 'swimming.upHour' || key === 'swimming.downHour' ? `params.swimming.schedule.${key.split('.')[1]}` : `params.${key}`);

const CHANGE_TEXT: Record<VersionChange, (v: number) => string> = {
  updated_in_place: (v) => `Saved. Version ${v} was changed in place: no forecast has used it yet.`,
  new_version: (v) => `Saved as version ${v}. The earlier version was used by forecasts and is kept as it was.`,
  none: () => 'Saved. The parameters did not change, so no version was made.',
};

interface ProfileFormProps {
  orgId: string;
  profile?: ProfileDetail;
  onSaved: (profileId: string, message: string) => void;
}

/** Create or edit a profile: every parameter with its unit, a plain explanation and the typical range; helpers fill values. */
export function ProfileForm({ orgId, profile, onSaved }: ProfileFormProps) {
  const [draft, setDraft] = useState<Draft>(() => draftFrom(profile));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const create = useCreateProfile(orgId);
  const update = useUpdateProfile(orgId, profile?.id ?? '');
  const pending = create.isPending || update.isPending;
  const failure = create.error ?? update.error;

  const setTop = (key: 'name' | 'taxon' | 'note') => (e: { target: { value: string } }) => setDraft((d) => ({ ...d, [key]: e.target.value }));
  const setValue = (key: ValueKey, value: string) => setDraft((d) => ({ ...d, values: { ...d.values, [key]: value } }));
  /** A helper's value goes into the field, and how it was worked out into the version's note. */
  const fill = (key: ValueKey, value: number, how: string) =>
    setDraft((d) => ({ ...d, values: { ...d.values, [key]: String(value) }, note: (d.note ? `${d.note}; ${how}` : how).slice(0, 500) }));

  const field = (key: ValueKey, extra?: ReactNode) => {
    const info = parameterInfo(key === 'swimming.upHour' || key === 'swimming.downHour' ? 'swimming.schedule' : key);
    const label = key === 'swimming.upHour' ? 'Swim-up hour (local clock, h)' : key === 'swimming.downHour' ? 'Swim-down hour (local clock, h)' : `${info.label}${info.unit ? ` (${info.unit})` : ''}`;
    return (
      <div className="space-y-2">
        <TextField
          label={label}
          inputMode="decimal"
          value={draft.values[key]}
          onChange={(e) => setValue(key, e.target.value)}
          error={errors[errorKey(key)]}
          hint={
            <>
              {info.explanation} <span className="block">Typical: {info.typical}</span>
            </>
          }
        />
        {extra}
      </div>
    );
  };

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = profileInputSchema.safeParse({ name: draft.name, taxon: draft.taxon, note: draft.note, params: paramsFrom(draft) });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [i.path.map(String).join('.'), i.message])));
      return;
    }
    setErrors({});
    const onError = (error: Error) => {
      if (error instanceof ApiError && error.details) setErrors(Object.fromEntries(error.details.map((d) => [d.path, d.message])));
    };
    const input = parsed.data as { name: string; taxon: string; note: string; params: OrganismParams };
    if (profile) {
      update.mutate(input, { onSuccess: (result) => result && onSaved(result.profile.id, CHANGE_TEXT[result.versionChange](result.profile.latest.version)), onError });
    } else {
      create.mutate(input, { onSuccess: (created) => created && onSaved(created.id, 'Profile created as version 1.'), onError });
    }
  }

  const section = 'space-y-4 rounded-lg border border-line bg-white p-4';
  return (
    <form onSubmit={submit} noValidate className="max-w-4xl space-y-6">
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Profile name" value={draft.name} onChange={setTop('name')} error={errors.name} />
        <TextField label="Taxon" value={draft.taxon} onChange={setTop('taxon')} error={errors.taxon} hint="The organism this profile describes, e.g. Dinophysis acuta." />
      </div>

      <fieldset className={section}>
        <legend className="px-1 font-bold text-tide-900">Settling</legend>
        {field('settlingVelocityMPerDay', <StokesHelper temperatureC={draft.values['growth.temperatureC']} onUse={(v, how) => fill('settlingVelocityMPerDay', v, how)} />)}
      </fieldset>

      <fieldset className={section}>
        <legend className="px-1 font-bold text-tide-900">Swimming</legend>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={draft.swimming} onChange={(e) => setDraft((d) => ({ ...d, swimming: e.target.checked }))} /> This organism swims (diel vertical migration)
        </label>
        {draft.swimming && (
          <div className="grid gap-4 sm:grid-cols-2">
            {field('swimming.speedMPerHour')}
            <SelectField label="Swimming schedule" value={draft.schedule} onChange={(e) => setDraft((d) => ({ ...d, schedule: e.target.value as Draft['schedule'] }))} hint={parameterInfo('swimming.schedule').explanation}>
              <option value="sun">Sun: up while the sun is up</option>
              <option value="clock">Clock: set hours</option>
            </SelectField>
            {draft.schedule === 'clock' && field('swimming.upHour')}
            {draft.schedule === 'clock' && field('swimming.downHour')}
            {field('swimming.minDepthM')}
            {field('swimming.maxDepthM')}
          </div>
        )}
      </fieldset>

      <fieldset className={section}>
        <legend className="px-1 font-bold text-tide-900">Growth</legend>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={draft.growth} onChange={(e) => setDraft((d) => ({ ...d, growth: e.target.checked }))} /> Model growth in the light
        </label>
        {draft.growth && (
          <div className="grid gap-4 sm:grid-cols-2">
            {field('growth.temperatureC')}
            {field('growth.maxRatePerDay', <EppleyHelper temperatureC={draft.values['growth.temperatureC']} onUse={(v, how) => fill('growth.maxRatePerDay', v, how)} />)}
            {field('growth.lightAttenuationPerM')}
            {field('growth.lightSaturationUmol')}
          </div>
        )}
        {field('mortalityPerDay')}
      </fieldset>

      <fieldset className={section}>
        <legend className="px-1 font-bold text-tide-900">Bed</legend>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={draft.bedExchange} onChange={(e) => setDraft((d) => ({ ...d, bedExchange: e.target.checked }))} /> Cells settle onto the bed and can be lifted again
        </label>
        {draft.bedExchange && (
          <div className="grid gap-4 sm:grid-cols-2">
            {field('bedExchange.criticalStressPa')}
            {field('bedExchange.erosionRate')}
          </div>
        )}
      </fieldset>

      <fieldset className={section}>
        <legend className="px-1 font-bold text-tide-900">Counts and mixing</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          {field('initialCellsPerL')}
          {field('triggerCellsPerL')}
          {field('schmidtNumber')}
        </div>
      </fieldset>

      <TextField
        label="Note for this version"
        value={draft.note}
        onChange={setTop('note')}
        error={errors.note}
        hint={profile?.latest.used ? `Version ${profile.latest.version} has been used by forecasts: changed parameters are saved as version ${profile.latest.version + 1}.` : 'What the values are based on.'}
      />
      {Object.keys(errors).length > 0 && (
        <p role="alert" className="text-sm font-semibold text-alarm-600">
          Some values need correcting: {Object.values(errors).join('; ')}.
        </p>
      )}
      {failure && !(failure instanceof ApiError && failure.details) && (
        <p role="alert" className="text-sm font-semibold text-alarm-600">
          {failure.message}
        </p>
      )}
      <Button type="submit" disabled={pending}>
        {pending ? 'Saving…' : profile ? 'Save changes' : 'Create profile'}
      </Button>
    </form>
  );
}
