// SPEC §13.4 through the sweep page: the owner archives a completed sweep from its Export tab and
// sees the SHA-256; a reviewer downloads the frozen zip from the Downloads page and the digest of
// the bytes received equals what the owner saw and what the api reports.
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
// The machine running the suite is shared; waits are generous, nothing here measures time.
const WAIT = 30_000;
const SHA256_HEX = /^[0-9a-f]{64}$/;

async function signIn(page: Page, baseUrl: string, email: string) {
  await page.goto(baseUrl + '/sign-in');
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill('driftgrid-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('whoami').waitFor({ timeout: WAIT });
}

describe.runIf(run)('archive journey: owner archives on the sweep page, reviewer downloads the same bytes', () => {
  let server: RunningServer;
  let browser: Browser;
  let sweepId: number;
  let ownerToken: string;
  let shownToOwner: string;

  beforeAll(async () => {
    server = await startServer();
    if (!fs.existsSync(path.join(server.config.uiDist, 'index.html')))
      throw new Error('ui is not built: run npm run build -w ui first');
    browser = await launchBrowser();
    ownerToken = await server.login(DEMO.researcher);
    const created = await server.http
      .post('/api/sweeps')
      .set('authorization', `Bearer ${ownerToken}`)
      .send(smallSweep({ name: 'Argon column journey to the archive' }));
    expect(created.status).toBe(201);
    sweepId = created.body.id;
    expect((await waitForSweep(server, ownerToken, sweepId, 120_000)).status).toBe('completed');
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('the owner archives from the Export tab after confirming, and sees the SHA-256', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, server.baseUrl, DEMO.researcher);
    await page.goto(`${server.baseUrl}/sweeps/${sweepId}`);
    await page.getByRole('tab', { name: 'Export and archive' }).click({ timeout: WAIT });

    // Before archiving there is no digest on the page.
    await page.getByTestId('archive-open').click({ timeout: WAIT });
    const dialog = page.getByRole('dialog', { name: 'Archive this sweep?' });
    await dialog.waitFor({ timeout: WAIT });
    expect(await page.getByTestId('archive-sha256').count()).toBe(0);
    await dialog.getByTestId('archive-confirm').click();

    const digest = page.getByTestId('archive-sha256');
    await digest.waitFor({ timeout: WAIT });
    expect(await digest.count()).toBe(1); // one digest on the page, from ExportActions
    shownToOwner = ((await digest.textContent()) ?? '').trim();
    expect(shownToOwner).toMatch(SHA256_HEX);
    // Archived: the archive button is gone and the status says so.
    expect(await page.getByTestId('archive-open').count()).toBe(0);
    await page
      .getByTestId('sweep-status')
      .filter({ hasText: /archived/i })
      .waitFor({ timeout: WAIT });

    // The api agrees with the page.
    const api = await server.http.get(`/api/sweeps/${sweepId}`).set('authorization', `Bearer ${ownerToken}`);
    expect(api.body.status).toBe('archived');
    expect(api.body.archive.sha256).toBe(shownToOwner);
    await context.close();
  });

  it('a download made before archiving is not compared with the frozen zip; one made after is, and matches', async () => {
    const created = await server.http
      .post('/api/sweeps')
      .set('authorization', `Bearer ${ownerToken}`)
      .send(smallSweep({ name: 'Argon column downloaded then archived' }));
    const id = created.body.id as number;
    expect((await waitForSweep(server, ownerToken, id, 120_000)).status).toBe('completed');
    const context = await browser.newContext({ acceptDownloads: true });
    const page = await context.newPage();
    await signIn(page, server.baseUrl, DEMO.researcher);
    await page.goto(`${server.baseUrl}/sweeps/${id}`);
    await page.getByRole('tab', { name: 'Export and archive' }).click({ timeout: WAIT });
    // Download while the sweep is open: that zip is built afresh and will differ from the frozen one.
    await Promise.all([page.waitForEvent('download', { timeout: WAIT }), page.getByTestId('export-download').click()]);
    await page.getByTestId('download-result').waitFor({ timeout: WAIT });
    await page.getByTestId('archive-open').click({ timeout: WAIT });
    await page.getByRole('dialog', { name: 'Archive this sweep?' }).getByTestId('archive-confirm').click();
    await page.getByTestId('archive-sha256').waitFor({ timeout: WAIT });
    const result = page.getByTestId('download-result');
    await expect.poll(async () => (await result.textContent()) ?? '', { timeout: WAIT }).toMatch(/before archiving/);
    expect(await page.getByTestId('download-mismatch').count()).toBe(0);
    expect(await page.getByTestId('export-actions').textContent()).not.toMatch(/differs/);

    // Downloading again fetches the frozen archive, and its digest is checked against the archive's.
    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: WAIT }),
      page.getByTestId('export-download').click(),
    ]);
    const bytes = fs.readFileSync((await download.path())!);
    const sha = ((await page.getByTestId('archive-sha256').textContent()) ?? '').trim();
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(sha);
    await page.getByTestId('download-verified').waitFor({ timeout: WAIT });
    expect(await page.getByTestId('download-mismatch').count()).toBe(0);
    await context.close();
  });

  it('a reviewer finds it on the Downloads page and downloads the very bytes the owner saw the digest of', async () => {
    expect(shownToOwner).toMatch(SHA256_HEX);
    const context = await browser.newContext({ acceptDownloads: true });
    const page = await context.newPage();
    await signIn(page, server.baseUrl, DEMO.reviewer);
    await page.getByRole('link', { name: 'Downloads' }).click({ timeout: WAIT });
    const row = page.getByTestId(`download-row-${sweepId}`);
    await row.waitFor({ timeout: WAIT });
    expect(await row.textContent()).toContain('Argon column journey to the archive');
    const listed = row.getByTestId('archive-sha256');
    await listed.waitFor({ timeout: WAIT });
    expect((await listed.textContent())?.trim()).toBe(shownToOwner);

    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: WAIT }),
      row.getByTestId('download-archive').click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/\.zip$/);
    const file = await download.path();
    const bytes = fs.readFileSync(file!);
    expect(bytes.subarray(0, 4).toString('latin1')).toBe('PK\u0003\u0004'); // a zip (local file header signature, PKWARE APPNOTE)
    const received = createHash('sha256').update(bytes).digest('hex');
    expect(received).toBe(shownToOwner);

    // The reviewer's own view of the sweep reports the same digest.
    const reviewerToken = await server.login(DEMO.reviewer);
    const asReviewer = await server.http.get(`/api/sweeps/${sweepId}`).set('authorization', `Bearer ${reviewerToken}`);
    expect(asReviewer.status).toBe(200);
    expect(asReviewer.body.archive.sha256).toBe(received);
    const verified = row.getByTestId('download-verified');
    await verified.waitFor({ timeout: WAIT });
    expect(await verified.textContent()).toContain('SHA-256 matches');
    await context.close();
  });
});
