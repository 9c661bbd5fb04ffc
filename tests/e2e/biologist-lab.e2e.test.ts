import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../server/seed/demo-organisation.ts';
import { productEnv, removeDataDir, startProduct, type RunningProduct } from '../helpers/product.ts';
import { launchChromium, screenshots, signInAs } from './support/chromium.ts';

const SITE = 'Skerry Narrows mussel lines';
const PROFILE = 'Slow-sinking chain diatom';
const TAXON = 'Pseudo-nitzschia spp.';

/** A JSON GET from inside the page (same origin, the page's session). */
async function pageGet<T>(page: Page, path: string): Promise<{ status: number; body: T }> {
  const answer = await page.evaluate(async (p) => {
    const response = await fetch(`/api${p}`, { headers: { Accept: 'application/json' } });
    return { status: response.status, body: (await response.json().catch(() => null)) as unknown };
  }, path);
  return answer as { status: number; body: T };
}

/** The lab sheet: three samples within the first demo forecast; with `bad`, row 3 has words for its count. */
function labCsv(forecastStartMs: number, bad: boolean): string {
  const at = (hours: number) => new Date(forecastStartMs + hours * 3_600_000).toISOString().replace('.000Z', '+00:00');
  const rows = [
    ['Sample', 'Site', 'Sampled', 'Depth (m)', 'Method', 'Taxon', 'Cells/L', 'Detection limit'],
    ['E2E-1', SITE, at(2), '0-10', 'hose', TAXON, '38000', '40'],
    ['E2E-2', SITE, at(3), '5', 'bottle', TAXON, bad ? 'lots' : '41000', '40'],
    ['E2E-3', SITE, at(4), '12', 'bottle', TAXON, '45000', '40'],
  ];
  return rows.map((r) => r.join(',')).join('\r\n') + '\r\n';
}

// The whole product as `npm start` runs it: the owner subscribes (forecast output needs it), the demo
// forecasts queued at first start finish, then a biologist works through the lab screen in Chromium.
describe('the biologist\'s lab workbench in Chromium', () => {
  let product: RunningProduct;
  let browser: { context: BrowserContext; close(): Promise<void> };
  let orgId = '';

  beforeAll(async () => {
    product = await startProduct(await productEnv());
    browser = await launchChromium();
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
    await product?.stop();
    if (product) removeDataDir(product.env);
  });

  it('the owner subscribes, so that forecasts unlock', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, product.baseUrl, 'owner@gullhaven.test', DEMO_PASSWORD);
    await page.waitForURL(/\/o\/[0-9a-f-]+/);
    orgId = /\/o\/([0-9a-f-]+)/.exec(page.url())![1]!;
    await page.goto(`${product.baseUrl}/o/${orgId}/billing`);
    await page.getByRole('button', { name: 'Subscribe to Longline, monthly' }).click();
    await page.waitForURL((url) => !url.toString().startsWith(product.baseUrl));
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByRole('button', { name: 'Start trial' }).click();
    await page.waitForURL((url) => url.toString().startsWith(product.baseUrl));
    await expect.poll(() => page.getByRole('definition').filter({ hasText: /^Unlocked$/ }).isVisible(), { timeout: 15_000 }).toBe(true);
    await page.goto(`${product.baseUrl}/auth/logout`);
    await page.close();
  }, 120_000);

  it('a biologist uploads a sheet with one bad row, is told the row and column, fixes it, imports it and sees the comparison', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, product.baseUrl, 'biologist@gullhaven.test', DEMO_PASSWORD);

    // The first demo forecast of the site and profile (queued at first start).
    const sites = await pageGet<{ sites: { id: string; name: string }[] }>(page, `/orgs/${orgId}/sites`);
    const profiles = await pageGet<{ profiles: { id: string; name: string }[] }>(page, `/orgs/${orgId}/profiles`);
    const siteId = sites.body.sites.find((s) => s.name === SITE)!.id;
    const profileId = profiles.body.profiles.find((p) => p.name === PROFILE)!.id;
    let forecastStart = '';
    await expect
      .poll(
        async () => {
          const latest = await pageGet<{ forecastStart?: string }>(page, `/orgs/${orgId}/sites/${siteId}/forecasts/latest?profileId=${profileId}`);
          forecastStart = latest.body.forecastStart ?? '';
          return latest.status;
        },
        { timeout: 150_000, interval: 2000 },
      )
      .toBe(200);
    const startMs = Date.parse(forecastStart);

    await page.goto(`${product.baseUrl}/o/${orgId}/lab`);
    await expect.poll(() => page.getByRole('heading', { name: 'Lab results' }).isVisible()).toBe(true);
    const upload = page.getByRole('region', { name: 'Upload a lab\'s results (CSV)' });

    // One bad row: the error names row 3 and the column Cells/L, and nothing is imported.
    await upload.getByLabel('CSV file').setInputFiles({ name: 'week-48.csv', mimeType: 'text/csv', buffer: Buffer.from(labCsv(startMs, true)) });
    await expect.poll(() => upload.getByRole('button', { name: 'Import results' }).isVisible()).toBe(true);
    await upload.getByRole('button', { name: 'Import results' }).click();
    const problem = upload.getByRole('alert').filter({ hasText: 'nothing was stored' });
    await expect.poll(() => problem.isVisible()).toBe(true);
    expect(await problem.textContent()).toMatch(/row 3, column Cells\/L: "lots" is not a number/);
    await screenshots(page, 'lab-upload-error');
    const none = await pageGet<{ results: unknown[] }>(page, `/orgs/${orgId}/lab/results`);
    expect(none.body.results).toEqual([]);

    // The fixed file imports.
    await upload.getByLabel('CSV file').setInputFiles({ name: 'week-48-fixed.csv', mimeType: 'text/csv', buffer: Buffer.from(labCsv(startMs, false)) });
    await expect.poll(() => upload.getByRole('cell', { name: '41000' }).isVisible()).toBe(true);
    await upload.getByRole('button', { name: 'Import results' }).click();
    await expect.poll(() => upload.getByRole('status').filter({ hasText: 'Imported 3 results from week-48-fixed.csv' }).isVisible()).toBe(true);
    await expect.poll(() => page.getByRole('cell', { name: 'E2E-3' }).first().isVisible()).toBe(true);

    // Map the lab's taxon to the profile, then read the comparison.
    await page.getByLabel(`Profile for ${TAXON}`).selectOption({ label: PROFILE });
    await page.getByRole('button', { name: 'Save mapping' }).click();
    await expect.poll(() => page.getByText('Mapping saved.').isVisible()).toBe(true);
    const comparison = page.getByRole('region', { name: 'Forecasts against lab counts' });
    await comparison.getByLabel('Organism profile').selectOption({ label: PROFILE });
    const skill = comparison.getByRole('table', { name: 'Forecast skill' });
    const all = skill.getByRole('row', { name: /All versions/ });
    await expect.poll(() => all.isVisible(), { timeout: 15_000 }).toBe(true);
    const cells = await all.getByRole('cell').allTextContents();
    // Results, bias, RMSE, correlation: three matched results and numbers for each metric.
    expect(cells[0]).toBe('3');
    expect(cells[1]).toMatch(/^-?\d+\.\d\d$/);
    expect(cells[2]).toMatch(/^\d+\.\d\d$/);
    expect(cells[3]).toMatch(/^-?\d\.\d\d$/);
    expect(await comparison.getByRole('img', { name: /Forecast against observed, 3 results/ }).isVisible()).toBe(true);
    await screenshots(page, 'lab-comparison');
    await page.close();
  }, 240_000);
});
