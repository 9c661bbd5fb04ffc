import { useId, useState } from 'react';
import type { ParameterInfo } from '../../../../shared/schemas/organism-parameters.ts';

/** A what-if parameter: a slider and a number box moving together, with unit and typical range. */
export function ParamSlider({ info, value, onChange }: { info: ParameterInfo; value: number; onChange: (value: number) => void }) {
  const id = useId();
  const [text, setText] = useState(String(value));
  const [seen, setSeen] = useState(value);
  // The slider or a reset moved the value: the box follows (the box's own typing is left alone).
  if (value !== seen) {
    setSeen(value);
    setText(String(value));
  }
  const span = info.slider ?? { min: 0, max: Math.max(1, value * 2), step: 0.01 };
  const unit = info.unit ? ` (${info.unit})` : '';
  const valid = text.trim() !== '' && Number.isFinite(Number(text));
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="text-sm font-semibold">
        {info.label}
        {unit}
      </label>
      <div className="flex items-center gap-3">
        <input
          type="range"
          aria-label={`${info.label} slider`}
          min={Math.min(span.min, value)}
          max={Math.max(span.max, value)}
          step={span.step}
          value={value}
          onChange={(e) => onChange(Number(e.target.value))}
          className="w-full accent-tide-700"
        />
        <input
          id={id}
          inputMode="decimal"
          value={text}
          aria-invalid={!valid}
          onChange={(e) => {
            setText(e.target.value);
            const next = Number(e.target.value);
            if (e.target.value.trim() !== '' && Number.isFinite(next)) {
              setSeen(next);
              onChange(next);
            }
          }}
          className="w-24 rounded-md border border-line bg-white px-2 py-1 text-sm aria-[invalid=true]:border-alarm-600"
        />
      </div>
      <p className="text-xs text-ink-soft">Typical: {info.typical}</p>
    </div>
  );
}
