import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { DEMO_PASSWORD, DEMO_SITES } from '../../server/seed/demo-organisation.ts';
import { productEnv, removeDataDir, startProduct, type RunningProduct } from '../helpers/product.ts';
import { launchChromium, screenshots, signInAs } from './support/chromium.ts';

describe('teams and sites in Chromium', () => {
  let product: RunningProduct;
  let browser: { context: BrowserContext; close(): Promise<void> };

  beforeAll(async () => {
    product = await startProduct(await productEnv());
    browser = await launchChromium();
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
    await product?.stop();
    if (product) removeDataDir(product.env);
  });

  it('a manager signs in, sees the demo organisation and its sites, and creates a site through the form', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, product.baseUrl, 'manager@gullhaven.test', DEMO_PASSWORD);
    await expect.poll(() => page.getByRole('heading', { name: 'Gullhaven Shellfish (demo)' }).isVisible()).toBe(true);
    for (const site of DEMO_SITES) await expect.poll(() => page.getByText(site.name).isVisible()).toBe(true);
    await screenshots(page, 'overview');

    await page.getByRole('link', { name: 'Sites', exact: true }).click();
    await page.getByRole('link', { name: 'New site' }).click();
    await page.getByLabel('Site name').fill('Gannet Reef lines');
    await page.getByLabel('Latitude (°, north positive)').fill('56.5');
    await page.getByLabel('Longitude (°, east positive)').fill('-5.9');
    await page.getByLabel('Time zone').fill('Europe/London');
    await page.getByLabel('Water depth (m, at mean level)').fill('16');
    await page.getByLabel('Gear top (m below surface)').fill('2');
    await page.getByLabel('Gear bottom (m below surface)').fill('30');
    await page.getByRole('button', { name: 'Create site' }).click();
    // Client-side check names the field and sends nothing.
    await expect.poll(() => page.getByText('gear bottom must not be deeper than the water depth').isVisible()).toBe(true);
    await screenshots(page, 'site-form-error');
    await page.getByLabel('Gear bottom (m below surface)').fill('9');
    await page.getByRole('button', { name: 'Create site' }).click();
    await page.waitForURL(/\/sites$/);
    await expect.poll(() => page.getByRole('link', { name: 'Gannet Reef lines', exact: true }).isVisible()).toBe(true);
    await screenshots(page, 'sites');
    await page.close();
  }, 120_000);

  it('crew see the sites but neither the team screen nor the new-site button', async () => {
    const crewBrowser = await launchChromium();
    const page = await crewBrowser.context.newPage();
    await signInAs(page, product.baseUrl, 'crew@gullhaven.test', DEMO_PASSWORD);
    await expect.poll(() => page.getByRole('heading', { name: 'Gullhaven Shellfish (demo)' }).isVisible()).toBe(true);
    expect(await page.getByRole('link', { name: 'Team' }).count()).toBe(0);
    await page.getByRole('link', { name: 'Sites', exact: true }).click();
    await expect.poll(() => page.getByRole('heading', { name: 'Sites' }).isVisible()).toBe(true);
    expect(await page.getByRole('link', { name: 'New site' }).count()).toBe(0);
    await crewBrowser.close();
  }, 120_000);
});
