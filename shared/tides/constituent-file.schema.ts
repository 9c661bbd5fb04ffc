/**
 * The zod contract of a constituent file (snake_case keys), as read by the
 * command line and, later, by uploads. Documented in docs/tides.md.
 *
 * Either a bare list of constituents (a water level), or an object:
 *   { "kind": "level" | "current", "datum": number?, "axis_deg": number?, "constituents": [...] }
 * Each constituent: { "name", "amplitude", "phase_deg", "minor"?, "inclination_deg"? };
 * for a current, amplitude is the semi-major axis (m/s), minor the signed
 * semi-minor axis (positive anticlockwise), inclination_deg the direction of
 * the major axis anticlockwise from east.
 */
import { z } from 'zod';
import { constituentIndex, STANDARD_CONSTITUENT_NAMES } from './constituents.ts';
import type { CurrentConstituent, LevelConstituent } from './predict.ts';

const constituentEntry = z.strictObject({
  name: z.string().refine((n) => constituentIndex(n) >= 0, {
    error: (issue) => `unknown constituent ${JSON.stringify(issue.input)}; known: ${STANDARD_CONSTITUENT_NAMES.join(' ')}`,
  }),
  amplitude: z.number().nonnegative(),
  phase_deg: z.number(),
  minor: z.number().optional(),
  inclination_deg: z.number().optional(),
});

const constituentList = z.array(constituentEntry).min(1, { error: 'give at least one constituent' });

const constituentObject = z.strictObject({
  kind: z.enum(['level', 'current']).default('level'),
  datum: z.number().optional(),
  axis_deg: z.number().optional(),
  constituents: constituentList,
});

export const constituentFileSchema = z.union([constituentList, constituentObject]);

export type ConstituentFileInput = z.input<typeof constituentFileSchema>;

export type ConstituentFile =
  | { kind: 'level'; datum: number; constituents: LevelConstituent[] }
  | { kind: 'current'; axisDeg: number | undefined; constituents: CurrentConstituent[] };

/** A zod issue path as written in JavaScript: constituents[1].name, or [1].name for a bare list. */
function formatPath(path: readonly PropertyKey[]): string {
  if (path.length === 0) return '(file)';
  return path.map((k, i) => (typeof k === 'number' ? `[${k}]` : `${i > 0 ? '.' : ''}${String(k)}`)).join('');
}

/** Parses a constituent file; on failure returns one message per problem, each naming its path. */
export function parseConstituentFile(input: unknown): { ok: true; file: ConstituentFile } | { ok: false; problems: string[] } {
  // Parsed by shape, so the messages come from the matching form rather than from a union.
  const parsed = Array.isArray(input)
    ? constituentList.transform((constituents) => ({ kind: 'level' as const, constituents })).safeParse(input)
    : constituentObject.safeParse(input);
  if (!parsed.success) {
    return {
      ok: false,
      problems: parsed.error.issues.map((i) => `${formatPath(i.path)}: ${i.message}`),
    };
  }
  const data = parsed.data;
  if (data.kind === 'level') {
    const extra = data.constituents.findIndex((c) => c.minor !== undefined || c.inclination_deg !== undefined);
    if (extra >= 0) return { ok: false, problems: [`constituents[${extra}]: minor and inclination_deg belong to a current (set "kind": "current")`] };
    return {
      ok: true,
      file: {
        kind: 'level',
        datum: 'datum' in data ? (data.datum ?? 0) : 0,
        constituents: data.constituents.map((c) => ({ name: c.name, amplitude: c.amplitude, phaseDeg: c.phase_deg })),
      },
    };
  }
  if (data.datum !== undefined) return { ok: false, problems: ['datum: a datum belongs to a water level, not a current'] };
  return {
    ok: true,
    file: {
      kind: 'current',
      axisDeg: data.axis_deg,
      constituents: data.constituents.map((c) => ({
        name: c.name,
        major: c.amplitude,
        phaseDeg: c.phase_deg,
        ...(c.minor !== undefined ? { minor: c.minor } : {}),
        ...(c.inclination_deg !== undefined ? { inclinationDeg: c.inclination_deg } : {}),
      })),
    },
  };
}
