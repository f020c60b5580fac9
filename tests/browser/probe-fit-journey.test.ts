/**
 * SPEC §13 journey 3 through the ui, end to end: a modeler signs in, opens Datasets, uploads a
 * probe scan (φ in V, n in cm^-3) through the upload form, maps the units, saves, and on the
 * dataset page fits the polytropic relation n = n0·[1 + ((γ−1)/γ)·φ/Te]^(1/(γ−1)) (SPEC §3.2, the
 * textbook polytropic generalisation of the Boltzmann relation) to the raw density column, then reads
 * Te and γ with ± uncertainties beside the residual plot.
 *
 * The scan is generated in the test with seeded noise (tests/fixtures/datasets/polytropic-probe.ts):
 * γ = 1.4, Te = 5 eV, n0 = 1e12 cm^-3 = 1e18 m^-3 (SI: 1 cm^-3 = 1e6 m^-3, exact). A correct fit
 * with correct errors puts each generating value within 3 standard errors.
 *
 * Hooks used (ui/src/components/DatasetUpload, FitsPanel, FitResult, FitPlot): dataset-upload-open,
 * dataset-dropzone (its file input), "Unit of <column>" inputs, dataset-preview; fit-builder, fit-run,
 * fit-result (data-status), fit-param-<name> (data-value, data-stderr), fit-plot (data-kind, data-points).
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromiumAvailable, launchBrowser } from '../support/browser.js';
import { startServer, type RunningServer } from '../support/server.js';
import { ARGON_PROBE_SCAN as SCAN, probeScanCsv } from '../fixtures/datasets/polytropic-probe.js';

const run = chromiumAvailable();
// The machine may be loaded: every wait is generous.
const WAIT = 30_000;

async function signIn(page: Page, baseUrl: string) {
  await page.goto(baseUrl + '/sign-in');
  await page.getByLabel('Email').fill('researcher@example.com');
  await page.getByLabel('Password').fill('driftgrid-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('whoami').waitFor({ timeout: WAIT });
}

/** Opens a Mantine select of the fit form by its label and picks the option whose text starts with `name`. */
async function pick(page: Page, label: string | RegExp, name: string) {
  await page.getByTestId('fit-builder').getByLabel(label).first().click();
  await page
    .getByRole('option', { name: new RegExp(`^${name}\\b`) })
    .first()
    .click();
}

async function param(page: Page, name: string) {
  const row = page.getByTestId(`fit-param-${name}`);
  await row.waitFor({ timeout: WAIT });
  return {
    value: Number(await row.getAttribute('data-value')),
    stdError: Number(await row.getAttribute('data-stderr')),
    text: (await row.textContent()) ?? '',
  };
}

describe.runIf(run)('probe-fit journey through the ui (SPEC §13.3)', () => {
  let server: RunningServer;
  let browser: Browser;

  beforeAll(async () => {
    server = await startServer();
    if (!fs.existsSync(path.join(server.config.uiDist, 'index.html')))
      throw new Error('ui is not built: run npm run build first');
    browser = await launchBrowser();
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('uploads a probe scan with units, fits the polytropic relation to n against φ and reads Te, γ and n0 with errors beside the residuals', async () => {
    const page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
    await signIn(page, server.baseUrl);

    // Open Datasets from the navigation and start an upload.
    await page.getByRole('link', { name: 'Datasets', exact: true }).first().click();
    await page.waitForURL(/\/datasets$/, { timeout: WAIT });
    await page.getByTestId('dataset-upload-open').first().click();
    await page.getByTestId('dataset-dropzone').waitFor({ timeout: WAIT });
    await page
      .getByTestId('dataset-dropzone')
      .locator('input[type="file"]')
      .setInputFiles({
        name: 'argon-probe-scan.csv',
        mimeType: 'text/csv',
        buffer: Buffer.from(probeScanCsv()),
      });

    // The browser preview shows the columns; map the units as measured.
    await page.getByTestId('dataset-preview').waitFor({ timeout: WAIT });
    await page.getByLabel('Name', { exact: true }).fill('Argon column probe scan');
    await page.getByLabel('Unit of phi').fill('V');
    await page.getByLabel('Unit of n').fill('cm^-3');
    await page.getByRole('button', { name: 'Upload dataset' }).click();

    // Saved: the dataset page opens, values stored in SI (n in m^-3).
    await page.waitForURL(/\/datasets\/\d+$/, { timeout: WAIT });
    const datasetId = Number(new URL(page.url()).pathname.split('/').pop());
    await page.getByTestId('dataset-rows').waitFor({ timeout: WAIT });
    expect(
      await page.getByTestId('dataset-rows').locator('th').filter({ hasText: /^n/ }).first().textContent(),
    ).toMatch(/m/);
    const token = await server.login('researcher@example.com');
    const stored = await server.http.get(`/api/datasets/${datasetId}`).set('authorization', `Bearer ${token}`);
    expect(stored.body.rows).toBe(SCAN.points);
    expect(stored.body.columns.find((c: { name: string }) => c.name === 'n')).toMatchObject({
      unit: 'cm^-3',
      canonicalUnit: 'm^-3',
    });

    // Fit n against φ with the polytropic model, from the dataset page's Fits tab.
    await page.getByRole('tab', { name: 'Fits' }).click();
    await page.getByTestId('fit-builder').waitFor({ timeout: WAIT });
    await pick(page, 'Model', 'Polytropic');
    await pick(page, 'y (the column to fit)', 'n');
    await pick(page, /^x$/, 'phi');
    await page.getByTestId('fit-run').click();

    const result = page.getByTestId('fit-result');
    await result.waitFor({ timeout: WAIT });
    await expect.poll(() => result.getAttribute('data-status'), { timeout: WAIT }).toBe('completed');
    expect(await page.getByTestId('fit-converged').textContent()).toContain('Yes');
    expect(await page.getByTestId('fit-n').textContent()).toContain(String(SCAN.points));

    const te = await param(page, 'Te_eV');
    const gamma = await param(page, 'gamma');
    const n0 = await param(page, 'n0');
    expect(Math.abs(te.value - SCAN.teEv)).toBeLessThan(3 * te.stdError);
    expect(Math.abs(gamma.value - SCAN.gamma)).toBeLessThan(3 * gamma.stdError);
    expect(Math.abs(n0.value - SCAN.n0Cm3 * 1e6)).toBeLessThan(3 * n0.stdError);
    // Informative errors at 1 % noise, not vacuous ones.
    expect(te.stdError / SCAN.teEv).toBeLessThan(0.05);
    expect(gamma.stdError / SCAN.gamma).toBeLessThan(0.05);
    // What the modeler reads: value ± standard error, with the unit (n0 in m⁻³, shown as m⁻³ or m^-3).
    expect(te.text).toContain('±');
    expect(te.text).toContain('eV');
    expect(gamma.text).toContain('±');
    expect(gamma.text).toContain('dimensionless');
    expect(n0.text).toContain('±');
    expect(n0.text).toMatch(/m(⁻³|\^-3)/);

    // Beside the residual plot: the data with the fitted curve and the residuals, in the same fit view.
    const plot = page.getByTestId('fit-plot');
    await plot.waitFor({ timeout: WAIT });
    expect(await plot.getAttribute('data-kind')).toBe('curve');
    expect(await plot.getAttribute('data-points')).toBe(String(SCAN.points));
    const residuals = plot.getByRole('img', { name: /^residuals against phi/ });
    await residuals.waitFor({ timeout: WAIT });
    await expect.poll(() => plot.locator('svg').count(), { timeout: WAIT }).toBeGreaterThanOrEqual(2);
    const table = await page.getByTestId('fit-parameters').boundingBox();
    const resid = await residuals.boundingBox();
    expect(table && resid).toBeTruthy();
    // The parameters sit directly above the plots in one column (within a screen height of the residuals).
    expect(resid!.y - (table!.y + table!.height)).toBeLessThan(1000);
    if (process.env.JOURNEY_SCREENSHOT) await page.screenshot({ path: process.env.JOURNEY_SCREENSHOT, fullPage: true });
    await page.close();
  });
});
