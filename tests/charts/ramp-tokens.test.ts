import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { RAMP_OKLCH } from '../../src/components/charts/ramp.ts';

describe('the heatmap colour ramp', () => {
  it('uses the OKLCH values of the --color-ramp tokens in src/styles.css', () => {
    const css = readFileSync(path.resolve(import.meta.dirname, '../../src/styles.css'), 'utf8');
    const tokens = [...css.matchAll(/--color-ramp-(\d): oklch\(([\d.]+) ([\d.]+) ([\d.]+)\)/g)].map((m) => [Number(m[2]), Number(m[3]), Number(m[4])]);
    expect(tokens).toHaveLength(9);
    expect(tokens).toEqual(RAMP_OKLCH.map((stop) => [...stop]));
  });
});
