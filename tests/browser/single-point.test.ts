/**
 * Single-point page (issue 3 "done means"): the demo researcher types 10 eV, 0.5 T, 2 cm and reads
 * drifts and orderings that match a hand calculation from the SPEC §3.1 formulas with CODATA 2018
 * constants (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)), written out here independently of
 * domain/src/constants.ts.
 *
 * Stable hooks used (ui/src/components/QuantityInput, ui/src/pages/SinglePoint.page.tsx):
 *   data-testid="model-picker"        model segmented control (labels = model titles)
 *   data-testid="input-<name>"        one text field per model input, e.g. input-Te_eV (aria-label = name)
 *   data-testid="range-<name>"        the allowed range shown under the field
 *   data-testid="output-<name>"       output value cell; data-value = full precision, text = 4 s.f. + unit
 *   data-testid="flags"               validity flags box, data-count = raised flags; items flag-<code>
 *   data-testid="inputs-invalid"      shown instead of outputs while an input is invalid
 *   data-testid="profile-plot"        column-profile radial plots, data-a = width a (m)
 */
import type { Browser, Page } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';
import type { RunningServer } from '../support/server.js';

const run = chromiumAvailable();

// CODATA 2018.
const e = 1.602176634e-19;
const m_p = 1.67262192369e-27;
const eps0 = 8.8541878128e-12;

/** SPEC §3.1 at γ_e = γ_i = 1, Z = 1: T in volts, v_t = sqrt(kT/m) (NRL convention), ρ = v_t/ω_c. */
function hand(Te: number, Ti: number, B: number, n: number, Ln: number, mu: number, Er: number) {
  const mi = mu * m_p;
  const rho_i = Math.sqrt((e * Ti) / mi) / ((e * B) / mi);
  return {
    vE_ms: -Er / B,
    vDe_ms: Te / (B * Ln),
    vDi_ms: -Ti / (B * Ln),
    rho_i_m: rho_i,
    rho_i_over_Ln: rho_i / Ln,
    lambdaD_over_Ln: Math.sqrt((eps0 * Te) / (e * n)) / Ln,
  };
}

/** The number shown on screen (4 significant figures, typographic minus, × 10ⁿ notation). */
function shown(text: string): number {
  const sup: Record<string, string> = {
    '⁰': '0',
    '¹': '1',
    '²': '2',
    '³': '3',
    '⁴': '4',
    '⁵': '5',
    '⁶': '6',
    '⁷': '7',
    '⁸': '8',
    '⁹': '9',
    '⁻': '-',
  };
  const t = text
    .replace(/\u2212/g, '-')
    .replace(/\u00a0/g, ' ')
    .trim();
  const m = /^(-?[\d.]+)(?: × 10([⁰¹²³⁴⁵⁶⁷⁸⁹⁻]+))?/.exec(t);
  if (!m) throw new Error(`not a number on screen: "${text}"`);
  const exp = m[2] ? Number([...m[2]].map((c) => sup[c]).join('')) : 0;
  return Number(m[1]) * 10 ** exp;
}

const signIn = (page: Page, baseUrl: string) => signInThroughForm(page, baseUrl);

describe.runIf(run)('single-point page', () => {
  const suite = browserSuite();
  let server: RunningServer;
  let browser: Browser;
  beforeEach(() => {
    server = suite.server();
    browser = suite.browser();
  });

  it('reads drifts and ρ_i/L_n for 10 eV, 0.5 T, 2 cm that match the hand calculation', async () => {
    const page = await browser.newPage();
    await signIn(page, server.baseUrl);
    await page.getByRole('link', { name: 'Single point' }).first().click();
    await page.getByTestId('input-Te_eV').waitFor();

    expect(await page.getByTestId('range-Te_eV').textContent()).toContain('> 0 and ≤ 1e6 eV');
    await page.getByTestId('input-Te_eV').fill('10 eV');
    await page.getByTestId('input-B_T').fill('0.5 T');
    await page.getByTestId('input-Ln_m').fill('2 cm');
    await page.getByTestId('input-Er_Vm').fill('-500 V/m');

    // Registry defaults for the rest: Ti 10 eV, n 1e19 m^-3, mu 2, Z 1, γ 1.
    const want = hand(10, 10, 0.5, 1e19, 0.02, 2, -500);
    // Outputs follow the typing after a short debounce: wait for the last field typed (E_r).
    const cell = page.getByTestId('output-vE_ms');
    await expect
      .poll(async () => Number(await cell.getAttribute('data-value')), { timeout: 10000 })
      .toBeCloseTo(want.vE_ms, 9);

    for (const key of ['vE_ms', 'vDe_ms', 'vDi_ms', 'rho_i_m', 'rho_i_over_Ln', 'lambdaD_over_Ln'] as const) {
      const c = page.getByTestId(`output-${key}`);
      const full = Number(await c.getAttribute('data-value'));
      expect(full / want[key], key).toBeCloseTo(1, 9);
      // What the researcher reads: 4 significant figures of the same value.
      const text = (await c.textContent())!;
      expect(Math.abs(shown(text) / want[key] - 1), `${key}: ${text}`).toBeLessThan(5e-4);
    }
    expect((await page.getByTestId('output-vDe_ms').textContent())!.replace(/\u00a0/g, ' ')).toBe('1000 m/s');
    expect((await page.getByTestId('output-vDi_ms').textContent())!.replace(/\u00a0/g, ' ')).toBe('\u22121000 m/s');
    expect((await page.getByTestId('output-vE_ms').textContent())!.replace(/\u00a0/g, ' ')).toBe('1000 m/s');
    // ρ_i/L_n ≈ 0.0457 < 0.1: no flag.
    expect(await page.getByTestId('flags').getAttribute('data-count')).toBe('0');
    await page.close();
  });

  it('explains a raised flag in words and shows unit errors beside the field', async () => {
    const page = await browser.newPage();
    await signIn(page, server.baseUrl);
    await page.goto(server.baseUrl + '/single-point');
    await page.getByTestId('input-Te_eV').fill('10 eV');
    await page.getByTestId('input-Ln_m').fill('2 cm');
    // 100 G: ρ_i grows 50×, ρ_i/L_n ≈ 2.3 ≥ 0.1 (common-practice threshold).
    await page.getByTestId('input-B_T').fill('100 G');
    const flag = page.getByTestId('flag-rho_i_over_Ln');
    await flag.waitFor({ timeout: 10000 });
    expect(await flag.textContent()).toMatch(/gyroradius/i);
    const rho = Number(await page.getByTestId('output-rho_i_over_Ln').getAttribute('data-value'));
    expect(rho / hand(10, 10, 0.01, 1e19, 0.02, 2, 0).rho_i_over_Ln).toBeCloseTo(1, 9);

    // Wrong dimension: the message names the expected unit, beside the field; outputs give way.
    await page.getByTestId('input-B_T').fill('3 cm');
    await page.getByTestId('inputs-invalid').waitFor({ timeout: 10000 });
    const describedBy = await page.getByTestId('input-B_T').getAttribute('aria-describedby');
    const errorText = await page
      .locator(`[id="${describedBy!.split(' ').find((id) => id.includes('error'))}"]`)
      .textContent();
    expect(errorText).toMatch(/quantity in T/);
    await page.close();
  });

  it('plots the radial profiles of column-profile with the width a marked', async () => {
    const page = await browser.newPage();
    await signIn(page, server.baseUrl);
    await page.goto(server.baseUrl + '/single-point');
    await page.getByTestId('model-picker').getByText('Gaussian column profile').click();
    await page.getByTestId('input-a_m').fill('4 cm');
    const plot = page.getByTestId('profile-plot');
    await plot.waitFor({ timeout: 15000 });
    await expect.poll(async () => plot.getAttribute('data-a'), { timeout: 10000 }).toBe('0.04');
    // echarts loads lazily and draws SVG; five panels (n, p, drifts, j_θ, B).
    await expect.poll(async () => plot.locator('svg').count(), { timeout: 15000 }).toBeGreaterThanOrEqual(5);
    expect(await plot.textContent()).toContain('a = 0.04 m');
    await page.close();
  });

  it('takes a neutral pressure, shows the collision outputs and lists every ordering with its threshold', async () => {
    const page = await browser.newPage();
    await page.setViewportSize({ width: 1440, height: 1000 });
    await signIn(page, server.baseUrl);
    await page.goto(server.baseUrl + '/single-point');
    await page.getByTestId('input-Te_eV').waitFor();
    // An argon column at 1 Pa, 300 K in 0.02 T (issue 12 scenario): n_n = p/(k_B T) (ideal gas).
    await page.getByTestId('input-mu').fill('39.6594');
    await page.getByTestId('input-Te_eV').fill('3 eV');
    await page.getByTestId('input-Ti_eV').fill('0.1 eV');
    await page.getByTestId('input-n_m3').fill('1e17');
    await page.getByTestId('input-Ln_m').fill('1 m');
    await page.getByTestId('input-B_T').fill('0.2 T');
    await page.getByTestId('input-Tn_eV').fill('300 K');
    await page.getByTestId('input-nn_m3').fill('1 Pa');
    const kB = 1.380649e-23;
    const nn = 1 / (kB * 300);
    const mi = 39.6594 * m_p;
    // ν_in = n_n σ v̄, v̄ = sqrt(8 e (T_i + T_n)/(π m_i)), σ = 1e-18 m² (registry default).
    const nu = nn * 1e-18 * Math.sqrt(((8 * e) / Math.PI) * ((0.1 + (kB * 300) / e) / mi));
    const cell = page.getByTestId('output-nu_in_s');
    await expect
      .poll(async () => Number(await cell.getAttribute('data-value')) / nu, { timeout: 10000 })
      .toBeCloseTo(1, 9);
    // 0.2 T: magnetised (ν/ω ≈ 0.44); every ordering is listed, thresholds or "no threshold".
    const banner = page.getByTestId('flags');
    expect(await page.getByTestId('ordering-nu_over_omega_i').textContent()).toContain('flags at ≥ 1');
    expect(await page.getByTestId('ordering-vDi_over_vti').textContent()).toContain('no threshold');
    expect(await banner.textContent()).not.toMatch(/every ordering parameter is below/);
    await page.screenshot({ path: 'test-results/single-point-collisions-1440-light.png', fullPage: false });
    // 0.02 T: the ions stop being magnetised and the point is invalid.
    await page.getByTestId('input-B_T').fill('0.02 T');
    await expect.poll(async () => banner.getAttribute('data-state'), { timeout: 10000 }).toBe('invalid');
    await page.getByTestId('flag-unmagnetised_ions').waitFor();
    await page.setViewportSize({ width: 1024, height: 900 });
    await page.emulateMedia({ colorScheme: 'dark' });
    await page.screenshot({ path: 'test-results/single-point-collisions-1024-dark.png', fullPage: false });
    await page.close();
  });
});
