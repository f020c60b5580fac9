import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO } from '../support/app.js';
import { chromiumAvailable, launchBrowser } from '../support/browser.js';
import { startServer, type RunningServer } from '../support/server.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

const run = chromiumAvailable();

async function signIn(page: Page, baseUrl: string, email: string) {
  await page.goto(baseUrl + '/sign-in');
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill('driftgrid-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('whoami').waitFor({ timeout: 15000 });
}

// The sweep page does not render ExportActions yet (its owner wires it in), so the owner archives
// through the api here and the browser part checks the reviewer's Downloads page and its component.
describe.runIf(run)('archived sweeps on the Downloads page', () => {
  let server: RunningServer;
  let browser: Browser;
  let sweepId: number;
  let sha256: string;

  beforeAll(async () => {
    server = await startServer();
    if (!fs.existsSync(path.join(server.config.uiDist, 'index.html')))
      throw new Error('ui is not built: run npm run build first');
    browser = await launchBrowser();
    const token = await server.login(DEMO.researcher);
    const created = await server.http
      .post('/api/sweeps')
      .set('authorization', `Bearer ${token}`)
      .send(smallSweep({ name: 'Argon column archive for review' }));
    sweepId = created.body.id;
    expect((await waitForSweep(server, token, sweepId)).status).toBe('completed');
    const archived = await server.http.post(`/api/sweeps/${sweepId}/archive`).set('authorization', `Bearer ${token}`);
    expect(archived.status).toBe(200);
    sha256 = archived.body.archive.sha256;
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('a reviewer finds the archive, downloads it, and the page shows the same SHA-256', async () => {
    const context = await browser.newContext({ acceptDownloads: true });
    const page = await context.newPage();
    await signIn(page, server.baseUrl, DEMO.reviewer);
    await page.getByRole('link', { name: 'Downloads' }).click();
    const row = page.getByTestId(`download-row-${sweepId}`);
    await row.waitFor({ timeout: 15000 });
    expect(await row.textContent()).toContain('Argon column archive for review');
    const shown = row.getByTestId('archive-sha256');
    await shown.waitFor({ timeout: 15000 });
    expect((await shown.textContent())?.trim()).toBe(sha256);

    const [download] = await Promise.all([page.waitForEvent('download'), row.getByTestId('download-archive').click()]);
    expect(download.suggestedFilename()).toBe(`argon-column-archive-for-review-${sweepId}.zip`);
    const file = await download.path();
    const bytes = fs.readFileSync(file!);
    // The file the browser saved is the frozen archive, byte for byte.
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(sha256);
    // …and the page computed the same digest from what it received.
    const verified = row.getByTestId('download-verified');
    await verified.waitFor({ timeout: 15000 });
    expect(await verified.textContent()).toContain('SHA-256 matches');
    await context.close();
  });
});
