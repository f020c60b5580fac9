/**
 * Reviewers read fits but may not run them (SPEC §6 roles; the api refuses POST /api/fits with 403).
 * On the sweep's and the dataset's Fits tabs a reviewer gets the saved fits and one sentence saying
 * why there is no form, never the form itself; the Fits page lists the fits without a form.
 */
import type { Browser, Page } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { DEMO } from '../support/app.js';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';
import type { RunningServer } from '../support/server.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

const run = chromiumAvailable();
const WAIT = 30_000;

async function expectReadOnly(page: Page) {
  const panel = page.getByTestId('fits-panel');
  await panel.waitFor({ timeout: WAIT });
  await page.getByTestId('fits-read-only').waitFor({ timeout: WAIT });
  expect(await page.getByTestId('fit-builder').count()).toBe(0);
  expect(await page.getByTestId('fit-run').count()).toBe(0);
  // The reason is given once on the page.
  expect(await page.getByText(/running a new fit is for researchers/).count()).toBe(1);
}

describe.runIf(run)('a reviewer sees fits read-only', () => {
  const suite = browserSuite();
  let server: RunningServer;
  let browser: Browser;
  beforeEach(() => {
    server = suite.server();
    browser = suite.browser();
  });

  it('offers no fit form on the sweep’s Fits tab, the dataset’s Fits tab or the Fits page', async () => {
    const owner = await server.login(DEMO.researcher);
    const created = await server.http
      .post('/api/sweeps')
      .set('authorization', `Bearer ${owner}`)
      .send(smallSweep({ name: 'Argon column for review', visibility: 'group' }));
    expect(created.status).toBe(201);
    const sweepId = created.body.id as number;
    expect((await waitForSweep(server, owner, sweepId, 120_000)).status).toBe('completed');
    // A small probe profile shared with the group (invented argon column values; n = n0·exp(φ/Te)).
    const csv = 'r,phi,n\n0,0,1e12\n0.5,-0.075,9.75e11\n1,-0.3,9.05e11\n1.5,-0.675,7.99e11\n2,-1.2,6.70e11\n';
    const uploaded = await server.http
      .post('/api/datasets')
      .set('authorization', `Bearer ${owner}`)
      .field('name', 'Argon probe profile for review')
      .field('units', JSON.stringify({ r: 'cm', phi: 'V', n: 'cm^-3' }))
      .field('visibility', 'group')
      .attach('file', Buffer.from(csv), 'probe.csv');
    expect(uploaded.status).toBe(201);
    const datasetId = uploaded.body.id as number;
    const fit = await server.http
      .post('/api/fits')
      .set('authorization', `Bearer ${owner}`)
      .send({ source: { kind: 'dataset', id: datasetId }, model: 'exponential', y: 'n', x: 'phi' });
    expect(fit.status).toBeLessThan(300);
    const reviewer = await server.login(DEMO.reviewer);
    // The server agrees: a reviewer's fit is refused.
    const refused = await server.http
      .post('/api/fits')
      .set('authorization', `Bearer ${reviewer}`)
      .send({ source: { kind: 'dataset', id: datasetId }, model: 'exponential', y: 'n', x: 'phi' });
    expect(refused.status).toBe(403);

    const page = await browser.newPage();
    await signInThroughForm(page, server.baseUrl, DEMO.reviewer);
    await page.goto(`${server.baseUrl}/sweeps/${sweepId}`);
    await page.getByRole('tab', { name: 'Fits' }).click({ timeout: WAIT });
    await expectReadOnly(page);

    await page.goto(`${server.baseUrl}/datasets/${datasetId}`);
    await page.getByRole('tab', { name: 'Fits' }).click({ timeout: WAIT });
    await expectReadOnly(page);
    // The demo dataset's saved fit is there to read.
    await page.locator('[data-testid^="saved-fit-"]').first().waitFor({ timeout: WAIT });

    // The Fits page lists the fits a reviewer can see and has no "New fit" form for them.
    await page.goto(`${server.baseUrl}/fits?sourceKind=dataset&sourceId=${datasetId}`);
    await page.locator('[data-testid^="saved-fit-"]').first().waitFor({ timeout: WAIT });
    expect(await page.getByTestId('fit-builder').count()).toBe(0);
    expect(await page.getByText('New fit', { exact: true }).count()).toBe(0);

    // A researcher on the same tab still gets the form.
    const researcher = await browser.newPage();
    await signInThroughForm(researcher, server.baseUrl, DEMO.researcher);
    await researcher.goto(`${server.baseUrl}/datasets/${datasetId}`);
    await researcher.getByRole('tab', { name: 'Fits' }).click({ timeout: WAIT });
    await researcher.getByTestId('fit-builder').waitFor({ timeout: WAIT });
    expect(await researcher.getByTestId('fits-read-only').count()).toBe(0);
    await page.close();
    await researcher.close();
  });
});
