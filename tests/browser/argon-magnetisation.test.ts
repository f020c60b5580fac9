/**
 * Issue 12 through the ui: the builder loads the argon magnetisation example (neutral pressure
 * axis "0.01 Pa"–"10 Pa" converted to n_n at T_n = 300 K, field axis), lists the physical constants
 * beside the derived-column expressions, and previews the design without errors. The point count is
 * the product of the axis counts (31 × 21).
 */
import type { Browser } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';
import type { RunningServer } from '../support/server.js';

describe.runIf(chromiumAvailable())('argon magnetisation example in the builder', () => {
  const suite = browserSuite();
  let server: RunningServer;
  let browser: Browser;
  beforeEach(() => {
    server = suite.server();
    browser = suite.browser();
  });

  it('loads the pressure × field example, shows the new inputs and the constant names', async () => {
    const page = await browser.newPage();
    await page.setViewportSize({ width: 1440, height: 1000 });
    await signInThroughForm(page, server.baseUrl);
    await page.goto(server.baseUrl + '/sweeps/new');
    await page.getByTestId('load-example').click();
    await page.getByTestId('example-argon-magnetisation-pressure-b.json').click();
    for (const name of ['nn_m3', 'Tn_eV', 'sigma_in_m2', 'sigma_en_m2'])
      await page.getByTestId(`input-row-${name}`).waitFor();
    expect(await page.getByTestId('axis-min-nn_m3').inputValue()).toBe('0.01 Pa');
    await expect.poll(async () => page.getByTestId('preview-points').textContent(), { timeout: 15000 }).toMatch(/651/);
    expect(await page.getByTestId('preview-errors').count()).toBe(0);
    expect(await page.getByTestId('expression-constants').textContent()).toMatch(/q_e.*m_p.*k_B.*c0/);
    await page.getByTestId('input-row-nn_m3').scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'test-results/builder-pressure-1440-light.png' });
    await page.setViewportSize({ width: 1024, height: 900 });
    await page.emulateMedia({ colorScheme: 'dark' });
    await page.getByTestId('expression-constants').scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'test-results/builder-constants-1024-dark.png' });
    await page.close();
  });
});
