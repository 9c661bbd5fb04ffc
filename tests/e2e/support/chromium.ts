import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

const SCREENSHOTS = path.resolve(import.meta.dirname, '../../../test-results/screenshots');

export const VIEWPORTS = {
  desktop: { width: 1366, height: 900 },
  phone: { width: 390, height: 844 },
} as const;

/** Debian's Chromium driven by playwright-core (never a downloaded browser), headless, with a fresh profile. */
export async function launchChromium(): Promise<{ context: BrowserContext; close(): Promise<void> }> {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'planktide-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: VIEWPORTS.desktop,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Signs in through the app's button and the identity stand-in's page. */
export async function signInAs(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/`);
  await page.getByRole('link', { name: 'Sign in' }).first().click();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((url) => url.toString().startsWith(baseUrl) && !url.pathname.startsWith('/auth'));
}

/** Saves the page at desktop and phone sizes under test-results/screenshots/. */
export async function screenshots(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENSHOTS, { recursive: true });
  for (const [size, viewport] of Object.entries(VIEWPORTS)) {
    await page.setViewportSize(viewport);
    await page.screenshot({ path: path.join(SCREENSHOTS, `${name}-${size}.png`), fullPage: true });
  }
  await page.setViewportSize(VIEWPORTS.desktop);
}
