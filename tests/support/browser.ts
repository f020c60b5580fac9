import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { startServer, type RunningServer } from './server.js';

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/**
 * Launches Debian's Chromium. Outside CI a missing browser skips the browser suite with one loud
 * line; with CI=true it is a failure.
 */
export function chromiumAvailable(): boolean {
  if (fs.existsSync(CHROMIUM)) return true;
  if (process.env.CI === 'true') throw new Error(`Chromium not found at ${CHROMIUM}; CI requires the browser suite`);
  console.warn(
    `\n!!! BROWSER SUITE SKIPPED: no Chromium at ${CHROMIUM} (set CHROMIUM_PATH or apt-get install chromium) !!!\n`,
  );
  return false;
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
    ],
  });
}

/** Signs in through the form and waits for the landing page (generous: CI machines are shared). */
export async function signInThroughForm(
  page: Page,
  baseUrl: string,
  email = 'researcher@example.com',
  password = 'driftgrid-demo',
): Promise<void> {
  await page.goto(baseUrl + '/sign-in');
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  try {
    await page.getByTestId('whoami').waitFor({ timeout: 30000 });
  } catch (err) {
    console.log('sign-in did not finish; at', page.url(), (await page.textContent('body'))?.slice(0, 300));
    throw err;
  }
}

/** Starts the app and a browser for a suite, and stops both after it. */
export function browserSuite(env: Record<string, string> = {}): {
  server: () => RunningServer;
  browser: () => Browser;
} {
  let server: RunningServer | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    server = await startServer(env);
    if (!fs.existsSync(path.join(server.config.uiDist, 'index.html')))
      throw new Error('ui is not built: run npm run build first');
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });
  return { server: () => server!, browser: () => browser! };
}
