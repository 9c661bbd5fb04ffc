import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import ICAL from 'ical.js';
import { DateTime } from 'luxon';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/seed/demo-organisation.ts';
import { productEnv, removeDataDir, startProduct, type RunningProduct } from '../helpers/product.ts';
import { launchChromium, screenshots, signInAs } from './support/chromium.ts';

const SITE = 'Skerry Narrows mussel lines';
const ROOT = path.resolve(import.meta.dirname, '../..');

/** The heatmap's measures (performance.measure in the page): grid decoded → cells drawn, and → next frame. */
async function heatmapTimings(page: Page): Promise<{ drawn: number[]; painted: number[] }> {
  return page.evaluate(() => ({
    drawn: performance.getEntriesByName('planktide:grid-to-heatmap-drawn').map((e) => e.duration),
    painted: performance.getEntriesByName('planktide:grid-to-heatmap-painted').map((e) => e.duration),
  }));
}

// The whole product as `npm start` runs it (forecasts at 100 layers), in Debian's Chromium.
describe("the manager's screens in Chromium", () => {
  let product: RunningProduct;
  let browser: { context: BrowserContext; close(): Promise<void> };
  let orgPath = '';

  beforeAll(async () => {
    product = await startProduct({ ...(await productEnv()), FORECAST_LAYERS: '100' });
    browser = await launchChromium();
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
    await product?.stop();
    if (product) removeDataDir(product.env);
  });

  it('an owner subscribes, which unlocks the forecasts', async () => {
    const owner = await launchChromium();
    const page = await owner.context.newPage();
    await signInAs(page, product.baseUrl, 'owner@gullhaven.test', DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Billing' }).click();
    await page.waitForURL(/\/o\/[0-9a-f-]+\/billing$/);
    orgPath = new URL(page.url()).pathname.replace(/\/billing$/, '');
    await page.getByRole('button', { name: 'Subscribe to Longline, monthly' }).click();
    await page.waitForURL((url) => !url.toString().startsWith(product.baseUrl));
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByRole('button', { name: 'Start trial' }).click();
    await page.waitForURL((url) => url.toString().startsWith(product.baseUrl));
    await expect.poll(() => page.getByRole('definition').filter({ hasText: /^Unlocked$/ }).isVisible(), { timeout: 15_000 }).toBe(true);
    await owner.close();
  }, 120_000);

  it('a manager sees the overview, the forecast heatmap with legend and windows, changes organism and range, runs a 7-day forecast and plans from the advice', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, product.baseUrl, 'manager@gullhaven.test', DEMO_PASSWORD);
    // The demo forecasts were queued at first start: wait until the overview shows one for the site.
    await expect
      .poll(
        async () => {
          await page.goto(`${product.baseUrl}${orgPath}`);
          await page.getByRole('heading', { name: 'Sites today and tomorrow' }).waitFor();
          return page.getByRole('listitem').filter({ hasText: SITE }).getByText('Next slack').isVisible();
        },
        { timeout: 240_000, interval: 3000 },
      )
      .toBe(true);
    await expect.poll(() => page.getByRole('group', { name: new RegExp(`Windows today and tomorrow at ${SITE}`) }).isVisible()).toBe(true);
    await screenshots(page, 'manager-overview');

    await page.getByRole('link', { name: SITE }).click();
    await page.waitForURL(/\/sites\/[0-9a-f-]+\/forecast/);
    const heatmap = page.getByRole('group', { name: /Concentration of .* cells\/L, by depth below surface/ });
    await expect.poll(() => heatmap.isVisible(), { timeout: 30_000 }).toBe(true);
    await expect.poll(() => page.getByText('Concentration (cells/L), log scale').isVisible()).toBe(true);
    expect(await page.getByText('Depth below surface (m)').count()).toBeGreaterThan(0);
    // Windows: drawn as bands under the heatmap, and listed.
    expect(await heatmap.locator('svg title').count()).toBeGreaterThan(0);
    await expect.poll(() => page.getByText(/Windows as a list \([1-9]\d*\)/).isVisible()).toBe(true);
    await expect.poll(() => page.getByText('Forecast inputs and age').isVisible()).toBe(true);
    await expect.poll(() => page.getByRole('complementary', { name: 'Cautions' }).first().isVisible()).toBe(true);

    // Keyboard: the chart takes focus and the arrow keys move a cursor that updates the readout.
    await heatmap.focus();
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowDown');
    await expect.poll(() => page.getByTestId('heatmap-readout').textContent()).toMatch(/\(UTC[+-]\d\d:\d\d\) · [\d.]+ m below surface · [\d,.]+ cells\/L/);
    await screenshots(page, 'site-forecast');

    // Another organism, then current speed on a linear scale.
    const organism = page.getByLabel('Organism');
    const options = await organism.locator('option').allTextContents();
    expect(options.length).toBeGreaterThan(1);
    await organism.selectOption({ label: options[1]! });
    await expect.poll(() => page.getByRole('group', { name: new RegExp(`Concentration of ${options[1]!}`) }).isVisible(), { timeout: 30_000 }).toBe(true);
    await page.getByLabel('Show', { exact: true }).selectOption('speed');
    await expect.poll(() => page.getByText('Current speed (m/s), linear scale').isVisible()).toBe(true);
    await page.getByLabel('Show', { exact: true }).selectOption('concentration');

    // Range: 7 days; the demo forecast covers 3, so run one for 7 days and watch its progress.
    await page.getByLabel('Days shown').selectOption('7');
    await expect.poll(() => page.getByText(/This forecast covers 3 days/).isVisible()).toBe(true);
    await page.evaluate(() => performance.clearMeasures());
    await page.getByLabel('Days ahead', { exact: true }).selectOption('7');
    await page.getByRole('button', { name: 'Run now' }).click();
    await expect.poll(() => page.getByRole('progressbar').count(), { timeout: 15_000 }).toBeGreaterThan(0);
    await expect.poll(() => page.getByText(/This forecast covers 3 days/).isVisible(), { timeout: 240_000, interval: 1000 }).toBe(false);
    await expect.poll(() => page.getByText(/7 days from/).isVisible(), { timeout: 30_000 }).toBe(true);
    await expect.poll(() => page.getByText(/100 layers/).isVisible()).toBe(true);
    // Time from the grid's arrival to the heatmap drawn, for a 7-day, 100-layer grid: first while the
    // worker still computes the other organisms' runs on this machine, then on a fresh page once it is idle.
    await expect.poll(async () => (await heatmapTimings(page)).painted.length, { timeout: 10_000 }).toBeGreaterThan(0);
    const busy = await heatmapTimings(page);
    const runsPath = `/api${new URL(page.url()).pathname.replace(/^\/o\//, '/orgs/').replace(/\/forecast$/, '/runs')}`;
    await expect
      .poll(async () => page.evaluate(async (path) => ((await (await fetch(path)).json()) as { runs: { status: string }[] }).runs.filter((r) => r.status === 'queued' || r.status === 'running').length, runsPath), { timeout: 240_000, interval: 2000 })
      .toBe(0);
    // Fresh pages once the worker is idle, twice: the client as the product serves it here (built
    // under NODE_ENV=development by the product, so React's development build), and a production build.
    const fresh = async (target: Page) => {
      const out: { drawn: number[]; painted: number[]; steps: string[] } = { drawn: [], painted: [], steps: [] };
      for (let attempt = 0; attempt < 3; attempt++) {
        await target.goto(page.url());
        await expect.poll(async () => (await heatmapTimings(target)).painted.length, { timeout: 30_000 }).toBeGreaterThan(0);
        const t = await heatmapTimings(target);
        out.drawn.push(...t.drawn);
        out.painted.push(...t.painted);
        out.steps.push(
          await target.evaluate(() => {
            const start = performance.getEntriesByName('planktide:grid-to-heatmap-drawn')[0]?.startTime ?? 0;
            return performance
              .getEntriesByType('mark')
              .filter((m) => m.name.startsWith('planktide:heatmap-'))
              .map((m) => `${m.name.replace('planktide:heatmap-', '')} +${(m.startTime - start).toFixed(1)}`)
              .join(', ');
          }),
        );
      }
      return out;
    };
    const served = await fresh(page);
    const prodDir = mkdtempSync(path.join(os.tmpdir(), 'planktide-client-'));
    execFileSync(process.execPath, [path.join(ROOT, 'node_modules/vite/bin/vite.js'), 'build', '--outDir', prodDir, '--emptyOutDir', '--logLevel', 'warn'], { cwd: ROOT, env: { ...process.env, NODE_ENV: 'production' } });
    const prodPage = await browser.context.newPage();
    await prodPage.route(`${product.baseUrl}/**`, async (route) => {
      const url = new URL(route.request().url());
      if (url.pathname.startsWith('/api/') || url.pathname.startsWith('/auth/')) return route.fallback();
      const file = path.join(prodDir, url.pathname.startsWith('/assets/') || url.pathname === '/favicon.svg' ? url.pathname : 'index.html');
      return existsSync(file) ? route.fulfill({ path: file }) : route.fallback();
    });
    const production = await fresh(prodPage);
    await prodPage.close();
    rmSync(prodDir, { recursive: true, force: true });
    const show = (xs: number[]) => xs.map((d) => d.toFixed(1)).join(', ');
    console.log(
      'heatmap 7 days x 100 layers, grid arrival to cells drawn / to the next frame (ms):\n' +
        `  while the worker computes (served client): ${show(busy.drawn)} / ${show(busy.painted)}\n` +
        `  fresh pages, served client (served by the product): ${show(served.drawn)} / ${show(served.painted)}\n    steps: ${served.steps.join(' | ')}\n` +
        `  fresh pages, production build: ${show(production.drawn)} / ${show(production.painted)}\n    steps: ${production.steps.join(' | ')}`,
    );
    // The speed target (150 ms) is a benchmark figure, printed above and quoted in the notes; the test
    // checks that every measurement completed, i.e. the heatmap was drawn each time.
    expect(production.drawn.every((ms) => Number.isFinite(ms) && ms > 0)).toBe(true);
    await screenshots(page, 'site-forecast-7-days');

    await page.getByRole('button', { name: 'Add advice to the plan' }).click();
    await expect.poll(() => page.getByText(/\d+ sample\(s\) added to the plan/).isVisible(), { timeout: 15_000 }).toBe(true);
    await page.close();
  }, 600_000);

  it('a manager creates a site, plans a sample, downloads the calendar file and opens the day sheet', async () => {
    const page = await browser.context.newPage();
    await page.goto(`${product.baseUrl}${orgPath}/sites/new`);
    await page.getByLabel('Site name').fill('Gannet Reef lines');
    await page.getByLabel('Latitude (°, north positive)').fill('56.5');
    await page.getByLabel('Longitude (°, east positive)').fill('-5.9');
    await page.getByLabel('Time zone').fill('Europe/London');
    await page.getByLabel('Water depth (m, at mean level)').fill('16');
    await page.getByLabel('Gear top (m below surface)').fill('2');
    await page.getByLabel('Gear bottom (m below surface)').fill('9');
    await page.getByRole('button', { name: 'Create site' }).click();
    await page.waitForURL(/\/sites$/);
    await expect.poll(() => page.getByRole('link', { name: 'Gannet Reef lines', exact: true }).isVisible()).toBe(true);

    await page.getByRole('link', { name: 'Sampling plan', exact: true }).first().click();
    await page.getByRole('button', { name: 'Plan a sample' }).click();
    const form = page.getByRole('form', { name: 'Plan a sample' });
    await form.getByLabel('Site').selectOption({ label: 'Gannet Reef lines' });
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    await form.getByLabel(/Date and time/).fill(`${tomorrow}T10:30`);
    await form.getByLabel('Method').selectOption('bottle');
    await form.getByLabel('Bottle depth (m below surface)').fill('30');
    await form.getByRole('button', { name: 'Plan sample' }).click();
    // Checked before sending: deeper than the water.
    await expect.poll(() => form.getByText('must not be deeper than the water (16 m)').isVisible()).toBe(true);
    await form.getByLabel('Bottle depth (m below surface)').fill('12');
    await form.getByLabel('Reason').fill('Check the reef bottom after the spring tide');
    await form.getByRole('button', { name: 'Plan sample' }).click();
    const planned = page.getByTestId('planned-sample').filter({ hasText: 'Check the reef bottom after the spring tide' });
    await expect.poll(() => planned.isVisible()).toBe(true);
    await expect.poll(() => planned.getByText('Bottle at 12 m below surface').isVisible()).toBe(true);
    await screenshots(page, 'sampling-plan');

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Calendar file (.ics)' }).click()]);
    const ics = readFileSync((await download.path())!, 'utf8');
    // Parsed by ical.js, a general-purpose iCalendar library.
    const events = new ICAL.Component(ICAL.parse(ics)).getAllSubcomponents('vevent').map((v) => new ICAL.Event(v));
    const reef = events.find((e) => e.description.includes('Check the reef bottom after the spring tide'));
    expect(reef).toBeDefined();
    // 10:30 typed at a Europe/London site is stored and exported in UTC.
    expect(reef!.startDate.toJSDate().toISOString()).toBe(DateTime.fromISO(`${tomorrow}T10:30`, { zone: 'Europe/London' }).toUTC().toISO());
    expect(reef!.location).toBe('Gannet Reef lines');
    expect(reef!.description).toContain('Site time zone: Europe/London');

    await page.getByLabel('Site', { exact: true }).first().selectOption({ label: 'Gannet Reef lines' });
    await page.getByRole('link', { name: tomorrow }).click();
    await expect.poll(() => page.getByRole('heading', { name: 'Sampling day sheet: Gannet Reef lines' }).isVisible()).toBe(true);
    await expect.poll(() => page.getByText('Bottle at 12 m below surface').isVisible()).toBe(true);
    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
    await screenshots(page, 'day-sheet-print');
    await page.emulateMedia({ media: 'screen' });

    await page.getByRole('link', { name: 'Alerts', exact: true }).click();
    await expect.poll(() => page.getByRole('heading', { name: 'Alerts' }).isVisible()).toBe(true);
    const open = page.getByRole('button', { name: /^Acknowledge alert/ });
    if ((await open.count()) > 0) {
      await open.first().click();
      await expect.poll(() => page.getByText(/Acknowledged .* by manager@gullhaven.test/).first().isVisible()).toBe(true);
    }
    await screenshots(page, 'alerts');
    await page.close();
  }, 180_000);

  it('crew mark the planned sample taken, and the plan shows who and when', async () => {
    const crew = await launchChromium();
    const page = await crew.context.newPage();
    await signInAs(page, product.baseUrl, 'crew@gullhaven.test', DEMO_PASSWORD);
    await page.goto(`${product.baseUrl}${orgPath}/plan`);
    expect(await page.getByRole('button', { name: 'Plan a sample' }).count()).toBe(0);
    const planned = page.getByTestId('planned-sample').filter({ hasText: 'Check the reef bottom after the spring tide' });
    await expect.poll(() => planned.isVisible()).toBe(true);
    await planned.getByRole('button', { name: /^Mark taken/ }).click();
    await planned.getByLabel('Notes (optional)').fill('Bottle at 12 m, water clear');
    await planned.getByRole('button', { name: 'Confirm taken now' }).click();
    await expect.poll(() => planned.getByText(/Taken \d\d:\d\d .* by Tomas Rey/).isVisible()).toBe(true);
    await screenshots(page, 'sampling-plan-crew');
    await crew.close();
  }, 120_000);
});
