/**
 * Catalogue journey in a real browser: sign in, filter the catalogue by model and tag, open a sweep,
 * sort its results by an output, switch the plot to log axes. (Archiving and the SHA-256 check belong
 * to the export suite, with the archive action.)
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO } from '../support/app.js';
import { chromiumAvailable, launchBrowser } from '../support/browser.js';
import { startServer, type RunningServer } from '../support/server.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

const run = chromiumAvailable();

describe.runIf(run)('catalogue, sweep page and plots', () => {
  let server: RunningServer;
  let browser: Browser;
  let argonId = 0;

  beforeAll(async () => {
    server = await startServer();
    if (!fs.existsSync(path.join(server.config.uiDist, 'index.html')))
      throw new Error('ui is not built: run npm run build first');
    const token = await server.login(DEMO.researcher);
    const submit = async (body: Record<string, unknown>) => {
      const res = await server.http.post('/api/sweeps').set('authorization', `Bearer ${token}`).send(smallSweep(body));
      expect(res.status).toBe(201);
      await waitForSweep(server, token, res.body.id);
      return res.body.id as number;
    };
    argonId = await submit({ name: 'Argon column browser scan', tags: ['argon', 'browser'] });
    await submit({ name: 'Deuterium edge browser scan', tags: ['deuterium'], fixed: { ...smallSweep().fixed, mu: 2 } });
    browser = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('filters by model and tag, opens the sweep, sorts by an output and plots on log axes', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
    const crashes: string[] = [];
    page.on('pageerror', (e) => crashes.push(e.message));
    await page.goto(server.baseUrl + '/sign-in');
    await page.getByLabel('Email').fill(DEMO.researcher);
    await page.getByLabel('Password').fill('driftgrid-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByTestId('whoami').waitFor({ timeout: 15000 });

    await page.goto(server.baseUrl + '/catalogue');
    const rows = page.getByTestId('catalogue-row-link');
    await rows.first().waitFor({ timeout: 15000 });
    expect(await rows.count()).toBe(2);

    await page.getByRole('textbox', { name: 'Model' }).click();
    await page.getByRole('option', { name: /cross-field/ }).click();
    await page.waitForURL(/model=cross-field/);
    const tags = page.getByRole('textbox', { name: 'Tags' });
    await tags.fill('argon');
    await tags.press('Enter');
    await page.waitForURL(/tag=argon/);
    await expect.poll(async () => rows.count(), { timeout: 10000 }).toBe(1);
    expect(await rows.first().textContent()).toBe('Argon column browser scan');

    // The filtered view is in the address: a reload shows the same single row.
    await page.reload();
    await rows.first().waitFor({ timeout: 15000 });
    expect(await rows.count()).toBe(1);

    await rows.first().click();
    await page.waitForURL(new RegExp(`/sweeps/${argonId}$`));
    await page.getByTestId('flags-summary').waitFor({ timeout: 15000 });

    await page.getByRole('tab', { name: 'Results' }).click();
    await page.getByTestId('results-total').filter({ hasText: '35 rows' }).waitFor({ timeout: 15000 });
    const sorted = page.waitForResponse(
      (r) =>
        r.url().includes(`/api/sweeps/${argonId}/results`) && r.url().includes('sort=vDi_ms') && r.status() === 200,
    );
    await page
      // Headers show the symbol over its unit (v_Di, m/s); the column name is in the title.
      .getByRole('columnheader', { name: /^v_Di/ })
      .getByText(/^v_Di$/)
      .first()
      .click();
    const body = (await (await sorted).json()) as { rows: { vDi_ms: number }[] };
    const values = body.rows.map((r) => r.vDi_ms);
    expect(values.length).toBeGreaterThan(1);
    const asc = [...values].sort((a, b) => a - b);
    const desc = [...asc].reverse();
    expect([JSON.stringify(asc), JSON.stringify(desc)]).toContain(JSON.stringify(values));

    await page.getByRole('tab', { name: 'Plots' }).click();
    const plot = page.getByTestId('sweep-plot');
    await plot.locator('canvas').first().waitFor({ timeout: 20000 });
    expect(await plot.getAttribute('data-log-x')).toBe('true'); // Te is swept on a log axis
    expect(await plot.getAttribute('data-log-y')).toBe('false');
    await page.getByText('Log y').click();
    await expect.poll(async () => plot.getAttribute('data-log-y')).toBe('true');
    expect(await page.getByTestId('log-y').isChecked()).toBe(true);
    if (process.env.SHOT_DIR) await page.screenshot({ path: path.join(process.env.SHOT_DIR, 'sweep-plot.png') });
    expect(crashes).toEqual([]);
    await page.close();
  }, 90_000);
});
