import fs from 'node:fs';
import { chromium, type Browser } from 'playwright-core';

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/**
 * Launches Debian's Chromium. Outside CI a missing browser skips the browser suite with one loud
 * line; with CI=true it is a failure.
 */
export function chromiumAvailable(): boolean {
  if (fs.existsSync(CHROMIUM)) return true;
  if (process.env.CI === 'true') throw new Error(`Chromium not found at ${CHROMIUM}; CI requires the browser suite`);
  console.warn(`\n!!! BROWSER SUITE SKIPPED: no Chromium at ${CHROMIUM} (set CHROMIUM_PATH or apt-get install chromium) !!!\n`);
  return false;
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  });
}
