/**
 * Issue 15 through the ui: a researcher uploads the shipped example probe trace
 * (examples/datasets/argon-probe-iv.csv, invented argon-column scenario: Te = 3 eV, V_f = −11 V,
 * n = 5e16 m⁻³, 2 mm² tip, 2 % noise), the dataset page offers the probe models because the columns
 * look like V and I, the single-probe fit runs with the tip area, and Te and n are read with their
 * uncertainties. Physics (Hutchinson, electric probes chapter; Stangeby, Bohm flux — from memory): the
 * fit must put the invented truth within 3 standard errors. Then a second fit of the same data (with
 * the sheath-expansion slope) is compared with the first side by side.
 */
import fs from 'node:fs';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';
import { ARGON_PROBE_TRACE as TRACE } from '../fixtures/datasets/probe-trace.js';

const WAIT = 30_000;
const SHOTS = process.env.DRIFTGRID_SHOTS; // a folder: also save screenshots for a look by eye

async function shot(page: Page, name: string) {
  if (!SHOTS) return;
  for (const width of [1024, 1440]) {
    for (const scheme of ['light', 'dark'] as const) {
      await page.setViewportSize({ width, height: 1000 });
      await page.emulateMedia({ colorScheme: scheme });
      await page.waitForTimeout(300);
      await page.screenshot({ path: `${SHOTS}/${name}-${width}-${scheme}.png`, fullPage: true });
    }
  }
  await page.setViewportSize({ width: 1400, height: 1000 });
  await page.emulateMedia({ colorScheme: 'light' });
}

async function readRow(page: Page, testId: string) {
  const row = page.getByTestId(testId);
  await row.waitFor({ timeout: WAIT });
  return {
    value: Number(await row.getAttribute('data-value')),
    stdError: Number(await row.getAttribute('data-stderr')),
    text: (await row.textContent()) ?? '',
  };
}

describe.runIf(chromiumAvailable())('probe trace fit through the ui (issue 15 §2)', () => {
  const suite = browserSuite();

  it('uploads the example trace, fits the single-probe model and reads Te and n with uncertainties', async () => {
    const page = await suite.browser().newPage({ viewport: { width: 1400, height: 1000 } });
    const base = suite.server().baseUrl;
    await signInThroughForm(page, base);
    await page.goto(base + '/datasets');
    await page.getByTestId('dataset-upload-open').first().click();
    await page.getByTestId('dataset-dropzone').waitFor({ timeout: WAIT });
    const csv = fs.readFileSync(new URL('../../examples/datasets/argon-probe-iv.csv', import.meta.url));
    await page
      .getByTestId('dataset-dropzone')
      .locator('input[type="file"]')
      .setInputFiles({ name: 'argon-probe-iv.csv', mimeType: 'text/csv', buffer: csv });
    await page.getByTestId('dataset-preview').waitFor({ timeout: WAIT });
    await page.getByLabel('Name', { exact: true }).fill('Argon probe I–V trace');
    await page.getByLabel('Unit of V').fill('V');
    await page.getByLabel('Unit of I').fill('A');
    await page.getByRole('button', { name: 'Upload dataset' }).click();
    await page.waitForURL(/\/datasets\/\d+$/, { timeout: WAIT });

    await page.getByRole('tab', { name: 'Fits' }).click();
    await page.getByTestId('fit-probe-offer').waitFor({ timeout: WAIT });
    await page.getByTestId('fit-probe-use-single').click();
    await page.getByTestId('fit-probe-area').fill(String(TRACE.areaM2 * 1e6));
    await page.getByTestId('fit-run').click();

    const result = page.getByTestId('fit-result');
    await result.waitFor({ timeout: WAIT });
    await expect.poll(() => result.getAttribute('data-status'), { timeout: WAIT }).toBe('completed');
    const te = await readRow(page, 'fit-param-Te_eV');
    const n = await readRow(page, 'fit-derived-n_m3');
    expect(Math.abs(te.value - TRACE.teEv)).toBeLessThan(3 * te.stdError);
    expect(Math.abs(n.value - TRACE.nM3)).toBeLessThan(3 * n.stdError);
    expect(te.stdError).toBeGreaterThan(0);
    expect(n.stdError).toBeGreaterThan(0);
    expect(te.text).toContain('±');
    expect(te.text).toContain('eV');
    expect(n.text).toContain('±');
    expect(n.text).toMatch(/m(⁻³|\^-3)/);
    // RMSE carries y's unit; the window came from the trace; the correlations are shown.
    expect(await page.getByTestId('fit-rmse').textContent()).toMatch(/A/);
    expect(await page.getByTestId('fit-region').textContent()).toMatch(/below the knee/);
    await page.getByTestId('fit-correlation').waitFor({ timeout: WAIT });
    await shot(page, 'probe-fit');

    // A second fit of the same data with the sheath-expansion slope, then both side by side.
    const firstId = Number(await result.getAttribute('data-fit-id'));
    await page.getByText('Sheath-expansion slope', { exact: true }).click();
    expect(await page.getByTestId('fit-probe-slope').isChecked()).toBe(true);
    await page.getByTestId('fit-run').click();
    await expect
      .poll(async () => Number(await page.getByTestId('fit-result').getAttribute('data-fit-id')), { timeout: WAIT })
      .not.toBe(firstId);
    const secondId = Number(await page.getByTestId('fit-result').getAttribute('data-fit-id'));
    await page.getByTestId(`compare-pick-${firstId}`).check();
    await page.getByTestId(`compare-pick-${secondId}`).check();
    await page.getByTestId('compare-fits').click();
    await page.waitForURL(/\/fits\/compare\?ids=/, { timeout: WAIT });
    await page.getByTestId('fit-compare').waitFor({ timeout: WAIT });
    expect(await page.getByTestId('compare-residuals').getAttribute('data-series')).toBe('2');
    await page.getByTestId(`compare-col-${secondId}`).waitFor({ timeout: WAIT });
    expect(await page.getByTestId('compare-aic').textContent()).toContain('lowest');
    await shot(page, 'compare');
  });
});
