/**
 * SPEC §13.1 up to the sweep page: New sweep, cross-field, Te 1–1000 eV (log, 31), B 0.1–5 T
 * (linear, 50), Ti = Te (expression), mu 2, L_n 2 cm; the preview shows 1,550 points (31 × 50) and
 * a sample point with its flags; the draft survives a re-sign-in; Ctrl+Enter submits; the sweep
 * page opens and the sweep completes (checked through the api, which the sweep page also reads).
 *
 * Stable hooks used (ui/src/components/SweepBuilder):
 *   builder-model, sweep-name, mode-<input> (segmented: Default | Fixed | Axis), fixed-<input>,
 *   axis-kind-<input> (select: Linear | Logarithmic | List of values), axis-min-<input>,
 *   axis-max-<input>, axis-count-<input>, axis-values-<input>, sampling-kind, sampling-samples,
 *   sampling-seed, add-derived, derived-name-<i>, derived-expr-<i>, sweep-tags, sweep-visibility,
 *   load-example, example-<file>, import-json, export-json, reset-builder, submit-sweep,
 *   submit-error, draft-restored;
 *   preview: sweep-preview, preview-points (data-value), preview-chunks, preview-estimate,
 *   preview-errors, preview-sample (holds sample-<column> cells and the `flags` box),
 *   quota-verdict (data-allowed), quota-violation.
 *   The sweep page (catalogue engineer's): sweep-status (StatusBadge, data-status).
 */
import type { Browser, Page } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';
import type { RunningServer } from '../support/server.js';
import { waitForSweep } from '../support/sweeps.js';
import { DEMO } from '../support/app.js';

const run = chromiumAvailable();

const signIn = (page: Page, baseUrl: string) => signInThroughForm(page, baseUrl);

async function mode(page: Page, input: string, label: 'Default' | 'Fixed' | 'Axis') {
  await page.getByTestId(`mode-${input}`).getByText(label, { exact: true }).click();
}

async function axisKind(page: Page, input: string, label: 'Linear' | 'Logarithmic' | 'List of values') {
  await page.getByTestId(`axis-kind-${input}`).click();
  await page.getByRole('option', { name: label }).click();
}

describe.runIf(run)('sweep builder', () => {
  const suite = browserSuite();
  let server: RunningServer;
  let browser: Browser;
  beforeEach(() => {
    server = suite.server();
    browser = suite.browser();
  });

  it('builds the Te × B deuterium scan, previews 1,550 points, keeps the draft across sign-in, submits and completes', async () => {
    const page = await browser.newPage();
    await signIn(page, server.baseUrl);
    await page.getByRole('link', { name: 'New sweep' }).first().click();
    await page.getByTestId('sweep-builder').waitFor();

    await page.getByTestId('builder-model').getByText('Cross-field drifts').click();
    await page.getByTestId('sweep-name').fill('Journey: deuterium Te × B');
    await mode(page, 'Te_eV', 'Axis');
    await axisKind(page, 'Te_eV', 'Logarithmic');
    await page.getByTestId('axis-min-Te_eV').fill('1');
    await page.getByTestId('axis-max-Te_eV').fill('1000');
    await page.getByTestId('axis-count-Te_eV').fill('31');
    await mode(page, 'B_T', 'Axis');
    await page.getByTestId('axis-min-B_T').fill('0.1');
    await page.getByTestId('axis-max-B_T').fill('5');
    await page.getByTestId('axis-count-B_T').fill('50');
    await mode(page, 'Ti_eV', 'Fixed');
    await page.getByTestId('fixed-Ti_eV').fill('Te_eV');
    await mode(page, 'mu', 'Fixed');
    await page.getByTestId('fixed-mu').fill('2');
    await mode(page, 'Ln_m', 'Fixed');
    await page.getByTestId('fixed-Ln_m').fill('2 cm');

    // An error appears beside its field as you type (axes.1.max → the B "To" field) and goes away.
    await page.getByTestId('axis-max-B_T').fill('500');
    await expect
      .poll(async () => (await page.getByTestId('input-row-B_T').textContent()) ?? '', { timeout: 10000 })
      .toMatch(/≤ 100 T/);
    await page.getByTestId('axis-max-B_T').fill('5');

    const points = page.getByTestId('preview-points');
    await expect.poll(async () => points.textContent(), { timeout: 10000 }).toBe('1,550');
    const sample = page.getByTestId('preview-sample');
    // Point #0 is the first corner: Te 1 eV, B 0.1 T, Ti = Te.
    expect(Number(await sample.getByTestId('sample-Te_eV').getAttribute('data-value'))).toBe(1);
    expect(Number(await sample.getByTestId('sample-B_T').getAttribute('data-value'))).toBeCloseTo(0.1, 12);
    expect(Number(await sample.getByTestId('sample-Ti_eV').getAttribute('data-value'))).toBe(1);
    expect(await sample.getByTestId('flags').getAttribute('data-count')).not.toBeNull();
    const verdict = page.getByTestId('quota-verdict');
    await verdict.waitFor({ timeout: 15000 });
    expect(await verdict.getAttribute('data-allowed')).toBe('true');

    // The session ends (token dropped); after signing in again the draft is still there.
    await page.evaluate(() => window.localStorage.removeItem('driftgrid.session'));
    await signIn(page, server.baseUrl);
    await page.goto(server.baseUrl + '/sweeps/new');
    await page.getByTestId('draft-restored').waitFor({ timeout: 10000 });
    expect(await page.getByTestId('sweep-name').inputValue()).toBe('Journey: deuterium Te × B');
    expect(await page.getByTestId('fixed-Ti_eV').inputValue()).toBe('Te_eV');
    await expect.poll(async () => page.getByTestId('preview-points').textContent(), { timeout: 10000 }).toBe('1,550');
    await page.getByTestId('quota-verdict').waitFor({ timeout: 15000 });

    // Ctrl+Enter from a field submits; the sweep page opens.
    await page.getByTestId('sweep-name').press('Control+Enter');
    await page.waitForURL(/\/sweeps\/\d+$/, { timeout: 15000 });
    const id = Number(/\/sweeps\/(\d+)$/.exec(page.url())![1]);
    expect(id).toBeGreaterThan(0);

    // The sweep page follows the run live until it reads Completed.
    const status = page.getByTestId('sweep-status');
    await status.waitFor({ timeout: 15000 });
    await expect
      .poll(async () => status.getAttribute('data-status'), { timeout: 60000, interval: 250 })
      .toBe('completed');

    const token = await server.login(DEMO.researcher);
    const done = await waitForSweep(server, token, id, 60_000);
    expect(done.status).toBe('completed');
    expect(done.points).toBe(1550);
    expect(done.model).toBe('cross-field');
    expect(done.definition.fixed).toMatchObject({ Ti_eV: 'Te_eV', mu: 2, Ln_m: '2 cm' });
    // A submitted draft is cleared: the builder starts empty again.
    await page.goto(server.baseUrl + '/sweeps/new');
    await page.getByTestId('sweep-builder').waitFor();
    expect(await page.getByTestId('sweep-name').inputValue()).toBe('');
    await page.close();
  });

  it('loads an example, previews it and shows server errors for a bad definition', async () => {
    const page = await browser.newPage();
    await signIn(page, server.baseUrl);
    await page.goto(server.baseUrl + '/sweeps/new');
    await page.getByTestId('load-example').click();
    await page.getByTestId('example-deuterium-edge-grid.json').click();
    // SPEC §4 example: 31 × 50 × 3 × 3.
    await expect.poll(async () => page.getByTestId('preview-points').textContent(), { timeout: 10000 }).toBe('13,950');
    expect(await page.getByTestId('axis-values-Ln_m').inputValue()).toBe('0.01, 0.02, 0.05');
    expect(await page.getByTestId('derived-expr-0').inputValue()).toBe('vE_ms / vDi_ms');
    // An unknown symbol in a derived column is reported beside that field.
    await page.getByTestId('derived-expr-0').fill('vE_ms / nonsense');
    await expect
      .poll(async () => (await page.getByTestId('preview-errors').textContent()) ?? '', { timeout: 10000 })
      .toMatch(/Derived column 1 · Expression: unknown input or output `nonsense`/);
    await page.close();
  });

  it('shows every problem at once, each beside its field in the form’s words, and none before typing', async () => {
    const page = await browser.newPage();
    await signIn(page, server.baseUrl);
    await page.goto(server.baseUrl + '/sweeps/new');
    await page.getByTestId('reset-builder').click();
    await page.getByTestId('sweep-builder').waitFor();
    // Nothing typed yet: no "must not be empty" greets the user.
    await page.waitForTimeout(400);
    expect(await page.getByTestId('sweep-builder').textContent()).not.toMatch(/must not be empty/i);

    // Three problems in three places: an emptied name (structure), an axis bound that is no
    // quantity and a misspelt input in a fixed value (both need the model).
    await page.getByTestId('sweep-name').fill('x');
    await page.getByTestId('sweep-name').fill('');
    await mode(page, 'Te_eV', 'Axis');
    await page.getByTestId('axis-min-Te_eV').fill('abc');
    await page.getByTestId('axis-max-Te_eV').fill('100');
    await mode(page, 'Ti_eV', 'Fixed');
    await page.getByTestId('fixed-Ti_eV').fill('Te_eVV');

    const describedError = async (testId: string) =>
      page.getByTestId(testId).evaluate((el) => {
        const ids = (el.getAttribute('aria-describedby') ?? '').split(/\s+/).filter(Boolean);
        return ids.map((id) => document.getElementById(id)?.textContent ?? '').join(' ');
      });
    await expect
      .poll(() => describedError('fixed-Ti_eV'), { timeout: 10000 })
      .toBe('unknown input or output `Te_eVV`; did you mean `Te_eV`?');
    expect(await describedError('sweep-name')).toMatch(/must not be empty/);
    expect(await describedError('axis-min-Te_eV')).toMatch(/expected a quantity in eV .*unknown unit `abc`/);

    const listed = page.getByTestId('preview-errors');
    expect(await listed.textContent()).toMatch(/^3 problems to fix/);
    const text = (await listed.textContent()) ?? '';
    expect(text).toContain('Name: must not be empty');
    expect(text).toContain('T_e axis · From: expected a quantity in eV');
    expect(text).toContain('T_i fixed value: unknown input or output `Te_eVV`; did you mean `Te_eV`?');
    // Never a JSON path, never the unit parser's own words.
    expect(await page.getByTestId('sweep-builder').textContent()).not.toMatch(/\b(axes|fixed|derived)\.\w|Unit "/);
    await page.close();
  });

  it('keeps the preview in view while the form scrolls: a summary bar at 1024 × 768, a side panel at 1440', async () => {
    for (const [width, testId] of [
      [1024, 'preview-summary'],
      [1440, 'preview-side'],
    ] as const) {
      const ctx = await browser.newContext({ viewport: { width, height: 768 } });
      const page = await ctx.newPage();
      await signIn(page, server.baseUrl);
      await page.goto(server.baseUrl + '/sweeps/new');
      await page.getByTestId('load-example').click();
      await page.getByTestId('example-deuterium-edge-grid.json').click();
      // Scroll to the last field of the form, as someone filling it in would.
      await page.getByTestId('sweep-tags').scrollIntoViewIfNeeded();
      await page.getByTestId('sweep-tags').click();
      const box = await page.getByTestId(testId).boundingBox();
      expect(box, `${testId} at ${width}`).not.toBeNull();
      expect(box!.y, `${testId} top at ${width}`).toBeGreaterThanOrEqual(0);
      expect(box!.y + Math.min(box!.height, 120), `${testId} at ${width}`).toBeLessThanOrEqual(768);
      if (width === 1024) {
        await expect
          .poll(() => page.getByTestId('summary-points').textContent(), { timeout: 10000 })
          .toBe('13,950 points');
        await page.getByTestId('summary-quota').waitFor({ timeout: 15000 });
        // The sample point's flag count matches the full preview below the form.
        const flags = await page.getByTestId('preview-sample').getByTestId('flags').getAttribute('data-count');
        expect(await page.getByTestId('summary-flags').getAttribute('data-count')).toBe(flags);
      } else {
        expect(await page.getByTestId('preview-summary').isVisible()).toBe(false);
        expect(await page.getByTestId('submit-sweep').isVisible()).toBe(true);
        const submit = await page.getByTestId('submit-sweep').boundingBox();
        expect(submit!.y + submit!.height).toBeLessThanOrEqual(768);
      }
      await ctx.close();
    }
  });
});
