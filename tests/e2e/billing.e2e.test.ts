import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { DEMO_PASSWORD } from '../../server/seed/demo-organisation.ts';
import { productEnv, removeDataDir, startProduct, type RunningProduct } from '../helpers/product.ts';
import { launchChromium, screenshots, signInAs } from './support/chromium.ts';

// The whole product as `npm start` runs it, with its local payments stand-in and its checkout page.
describe('billing in Chromium', () => {
  let product: RunningProduct;
  let browser: { context: BrowserContext; close(): Promise<void> };
  let billingPath = '';

  beforeAll(async () => {
    product = await startProduct(await productEnv());
    browser = await launchChromium();
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
    await product?.stop();
    if (product) removeDataDir(product.env);
  });

  it('an owner subscribes through the local checkout page and the forecasts unlock', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, product.baseUrl, 'owner@gullhaven.test', DEMO_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Billing' }).click();
    await page.waitForURL(/\/o\/[0-9a-f-]+\/billing$/);
    billingPath = new URL(page.url()).pathname;
    await expect.poll(() => page.getByText('Forecasts', { exact: true }).isVisible()).toBe(true);
    expect(await page.getByRole('definition').filter({ hasText: /^Locked$/ }).count()).toBe(1);

    await page.getByRole('button', { name: 'Subscribe to Longline, monthly' }).click();
    await page.waitForURL((url) => !url.toString().startsWith(product.baseUrl));
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByRole('button', { name: 'Start trial' }).click();
    await page.waitForURL((url) => url.toString().startsWith(`${product.baseUrl}${billingPath}`));
    await expect.poll(() => page.getByText('Free trial').isVisible(), { timeout: 15_000 }).toBe(true);
    await expect.poll(() => page.getByRole('definition').filter({ hasText: /^Unlocked$/ }).isVisible()).toBe(true);
    await expect.poll(() => page.getByText('Longline (up to 5 sites), monthly').isVisible()).toBe(true);
    await screenshots(page, 'billing-owner');
    await page.close();
  }, 120_000);

  it('a crew member has no billing link, is told to ask the owner, and cannot start a checkout', async () => {
    const crewBrowser = await launchChromium();
    const page = await crewBrowser.context.newPage();
    await signInAs(page, product.baseUrl, 'crew@gullhaven.test', DEMO_PASSWORD);
    await expect.poll(() => page.getByRole('link', { name: 'Sites', exact: true }).isVisible()).toBe(true);
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Billing' }).count()).toBe(0);
    await page.goto(`${product.baseUrl}${billingPath}`);
    await expect.poll(() => page.getByText('Billing is for owners').isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: /Subscribe/ }).count()).toBe(0);
    const status = await page.evaluate(async (path) => {
      const response = await fetch(`/api${path.replace(/^\/o\//, '/orgs/')}/checkout`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-Planktide-CSRF': '1' },
        body: JSON.stringify({ plan: 'buoy', interval: 'month' }),
      });
      return response.status;
    }, billingPath);
    expect(status).toBe(403);
    await crewBrowser.close();
  }, 120_000);
});
