import { useState, type FormEvent } from 'react';
import { forecastSettingsSchema, type ForecastSettings } from '../../../../shared/schemas/sampling.schema.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useSaveForecastSettings } from '../api/forecast-settings.ts';

const WINDOW_FIELDS: { key: keyof ForecastSettings['windowSettings']; label: string }[] = [
  { key: 'slackSpeedMPerS', label: 'Slack: depth-mean current below (m/s)' },
  { key: 'slumpRatio', label: 'Slump: near-bed mean at least × depth mean' },
  { key: 'slumpNearBedM', label: 'Slump: near-bed band (m above bed)' },
  { key: 'mixedCv', label: 'Mixed: variation over depth below (CV)' },
  { key: 'subsurfacePeakRatio', label: 'Layer: peak at least × depth mean' },
  { key: 'subsurfaceMarginM', label: 'Layer: margin from surface and bed (m)' },
  { key: 'minWindowMinutes', label: 'Shortest window kept (min)' },
];

/** The site's daily forecast time, horizon and window definitions (owners and managers). */
export function ForecastSettingsForm({ orgId, siteId, settings, timeZone }: { orgId: string; siteId: string; settings: ForecastSettings; timeZone: string }) {
  const [draft, setDraft] = useState(() => ({
    forecastLocalTime: settings.forecastLocalTime,
    forecastHorizonDays: String(settings.forecastHorizonDays),
    ...Object.fromEntries(WINDOW_FIELDS.map((f) => [f.key, String(settings.windowSettings[f.key])])),
  }) as Record<string, string>);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const save = useSaveForecastSettings(orgId, siteId);
  const set = (key: string) => (e: { target: { value: string } }) => setDraft((d) => ({ ...d, [key]: e.target.value }));

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = forecastSettingsSchema.safeParse({
      forecastLocalTime: draft.forecastLocalTime,
      forecastHorizonDays: Number(draft.forecastHorizonDays),
      windowSettings: Object.fromEntries(WINDOW_FIELDS.map((f) => [f.key, Number(draft[f.key])])),
    });
    if (!parsed.success) return setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path.at(-1) ?? ''), i.message])));
    setErrors({});
    save.mutate(parsed.data, {
      onError: (error) => error instanceof ApiError && error.details && setErrors(Object.fromEntries(error.details.map((d) => [d.path.split('.').at(-1) ?? d.path, d.message]))),
    });
  }

  return (
    <form onSubmit={submit} noValidate className="grid gap-3 sm:grid-cols-2" aria-label="Forecast settings">
      <TextField label={`Daily forecast time (${timeZone}, HH:MM)`} value={draft.forecastLocalTime} onChange={set('forecastLocalTime')} error={errors.forecastLocalTime} />
      <TextField label="Days ahead (3 to 7)" inputMode="numeric" value={draft.forecastHorizonDays} onChange={set('forecastHorizonDays')} error={errors.forecastHorizonDays} />
      {WINDOW_FIELDS.map((f) => (
        <TextField key={f.key} label={f.label} inputMode="decimal" value={draft[f.key] ?? ''} onChange={set(f.key)} error={errors[f.key]} />
      ))}
      <div className="flex items-center gap-3 sm:col-span-2">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save forecast settings'}
        </Button>
        {save.isSuccess && <span role="status" className="text-sm">Saved. The next forecast uses them.</span>}
        {save.error && !(save.error instanceof ApiError && save.error.details) && <span role="alert" className="text-sm text-alarm-600">{save.error.message}</span>}
      </div>
    </form>
  );
}
