import { CSRF_HEADER } from '../../server/auth/csrf.ts';
import type { Browser } from '../helpers/browser.ts';

/** A multipart upload as the client's apiUpload sends it: the CSV in field "file", with the anti-forgery header. */
export async function uploadCsv(
  browser: Browser,
  baseUrl: string,
  path: string,
  csv: string,
  fields: Record<string, string> = {},
  fileName = 'upload.csv',
): Promise<{ status: number; json: unknown }> {
  const form = new FormData();
  for (const [name, value] of Object.entries(fields)) form.set(name, value);
  form.set('file', new Blob([csv], { type: 'text/csv' }), fileName);
  const response = await browser.request(`${baseUrl}/api${path}`, { method: 'POST', headers: { accept: 'application/json', [CSRF_HEADER]: '1' }, body: form });
  const text = await response.text();
  return { status: response.status, json: text ? JSON.parse(text) : null };
}

/** A small deterministic pseudo-random generator (Park–Miller minimal standard), for reproducible noise. */
export function seededRandom(seed: number): () => number {
  let state = seed % 2147483647;
  if (state <= 0) state += 2147483646;
  return () => {
    state = (state * 16807) % 2147483647;
    return (state - 1) / 2147483646;
  };
}

/** Standard normal deviates by Box–Muller from a uniform generator. */
export function gaussian(uniform: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(uniform() || 1e-12)) * Math.cos(2 * Math.PI * uniform());
}

/** Zero crossings of a sampled series by linear interpolation between neighbouring samples. */
export function crossings(times: number[], values: number[]): number[] {
  const out: number[] = [];
  for (let i = 1; i < values.length; i++) {
    const a = values[i - 1]!;
    const b = values[i]!;
    if ((a < 0 && b >= 0) || (a > 0 && b <= 0)) out.push(times[i - 1]! + ((times[i]! - times[i - 1]!) * a) / (a - b));
  }
  return out;
}
