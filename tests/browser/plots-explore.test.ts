/**
 * Exploring a three-axis grid sweep on the Plots tab in a real browser: hold the third input at a picked
 * value, draw a chosen subset of a many-valued grouping, and check what the ui drew (the series it asked
 * for and received) against the stored rows from the results api. Also: the regime boundary ρ_i/L_n = 0.1
 * is drawn on a heatmap of another output, and hovering a cell shows every input and output of its point.
 */
import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { evenlySpread } from '@driftgrid/domain';
import { DEMO } from '../support/app.js';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

const run = chromiumAvailable();
const SHOTS = process.env.PLOT_SHOT_DIR;

// Te (7, log) × B (30, linear) × L_n (3, list): strides 90, 3, 1 (last axis fastest).
const AXES = [
  { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 7 },
  { param: 'B_T', kind: 'linear', min: 0.02, max: 0.6, count: 30 },
  { param: 'Ln_m', kind: 'list', values: [0.005, 0.02, 0.08] },
];

describe.runIf(run)('plots of a three-axis sweep', () => {
  const suite = browserSuite();
  let id = 0;
  let token = '';

  beforeAll(async () => {
    token = await suite.server().login(DEMO.researcher);
    const { Ln_m: _ln, ...fixed } = smallSweep().fixed;
    const res = await suite
      .server()
      .http.post('/api/sweeps')
      .set('authorization', `Bearer ${token}`)
      .send(smallSweep({ name: 'Argon three-axis browser scan', fixed, axes: AXES }));
    expect(res.status).toBe(201);
    id = res.body.id;
    await waitForSweep(suite.server(), token, id);
  }, 120_000);

  async function rowsWhere(filter: Record<string, unknown>): Promise<Record<string, number>[]> {
    const res = await suite
      .server()
      .http.get(`/api/sweeps/${id}/results`)
      .query({ filter: JSON.stringify(filter), pageSize: 1000, sort: 'idx:asc' })
      .set('authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    return res.body.rows;
  }

  async function open(page: Page, query: string) {
    await page.goto(`${suite.server().baseUrl}/sweeps/${id}?tab=plots&${query}`);
    await page.getByTestId('sweep-plot').waitFor({ timeout: 20000 });
  }

  const shot = async (page: Page, name: string) => {
    if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
  };

  it('holds L_n at a picked value on a heatmap of ρ_i/L_n over Te and B, with the threshold contour', async () => {
    const page = await suite.browser().newPage({ viewport: { width: 1440, height: 1000 } });
    const crashes: string[] = [];
    page.on('pageerror', (e) => crashes.push(e.message));
    await signInThroughForm(page, suite.server().baseUrl);
    await open(page, 'plot=heatmap&x=Te_eV&y=B_T&z=rho_i_over_Ln');

    // ρ_i/L_n spans more than two decades over this grid: the colour scale is logarithmic by itself.
    await expect
      .poll(() => page.getByTestId('sweep-plot').getAttribute('data-colour-scale'), { timeout: 15000 })
      .toBe('log');
    // At L_n = 5 mm every point of this grid is past the ordering: the boundary is listed but has no line.
    await expect
      .poll(() => page.getByTestId('sweep-plot').getAttribute('data-contours'), { timeout: 15000 })
      .toMatch(/ρ_i\/L_n = 0\.1:0/);

    // Pick the last L_n value; the ui asks for that slice and draws what it receives.
    const drawn = page.waitForResponse(
      (r) =>
        r.url().includes(`/api/sweeps/${id}/series`) &&
        r.url().includes('slice.Ln_m=2') &&
        r.url().includes('z=rho_i_over_Ln'),
    );
    await page.getByTestId('slice-Ln_m').click();
    await page.getByRole('option', { name: /0\.08/ }).click();
    const body = await (await drawn).json();
    await page.waitForURL(/at\.Ln_m=2/);
    expect(body.slice.Ln_m.value).toBeCloseTo(0.08, 12);
    const stored = await rowsWhere({ Ln_m: { eq: 0.08 } });
    expect(stored).toHaveLength(7 * 30);
    expect(body.cells).toHaveLength(7 * 30);
    for (const [xi, yi, z] of body.cells) {
      const row = stored.find((r) => r.Te_eV === body.x.values[xi] && r.B_T === body.y.values[yi]);
      expect(row, `cell ${xi},${yi}`).toBeDefined();
      expect(z).toBe(row!.rho_i_over_Ln);
    }
    // At L_n = 8 cm the boundary ρ_i/L_n = 0.1 crosses the Te–B plane.
    await expect
      .poll(() => page.getByTestId('sweep-plot').getAttribute('data-contours'), { timeout: 15000 })
      .toMatch(/ρ_i\/L_n = 0\.1:[1-9]/);
    // The caption says where L_n is held.
    await expect.poll(() => page.getByTestId('plot-caption').textContent()).toMatch(/Ln_m = 0\.08 m/);

    // Hover: every input and output of the point under the cursor.
    const box = (await page.getByTestId('sweep-plot').boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.4, box.y + box.height * 0.5);
    // The tooltip is drawn inside the chart's element; it fills in once the point's row has been read.
    const plot = page.getByTestId('sweep-plot');
    await expect.poll(async () => (await plot.textContent()) ?? '', { timeout: 10000 }).toMatch(/Stored point \d+/);
    const tipText = (await plot.textContent()) ?? '';
    for (const name of ['Te_eV', 'B_T', 'Ln_m', 'n_m3', 'vDi_ms', 'rho_i_over_Ln', 'beta', 'valid'])
      expect(tipText).toContain(name);
    expect(tipText).toMatch(/\d eV/);
    expect(tipText).toMatch(/ m\/s/);
    await shot(page, 'heatmap-1440');

    // The boundary is drawn on a heatmap of another output too (its ordering parameter read on the same grid).
    await open(page, 'plot=heatmap&x=Te_eV&y=B_T&z=vDi_ms&at.Ln_m=2');
    await expect
      .poll(() => page.getByTestId('sweep-plot').getAttribute('data-contours'), { timeout: 15000 })
      .toMatch(/ρ_i\/L_n = 0\.1:[1-9]/);
    expect(crashes).toEqual([]);
    await page.close();
  });

  it('groups by B (30 values): 8 spread evenly by default, then a chosen subset, checked against the rows', async () => {
    const page = await suite.browser().newPage({ viewport: { width: 1440, height: 1000 } });
    const crashes: string[] = [];
    page.on('pageerror', (e) => crashes.push(e.message));
    await signInThroughForm(page, suite.server().baseUrl);
    const first = page.waitForResponse(
      (r) => r.url().includes(`/api/sweeps/${id}/series`) && r.url().includes('groupBy=B_T'),
    );
    await open(page, 'plot=line&x=Te_eV&z=vDi_ms&by=B_T&at.Ln_m=1');
    const def = await (await first).json();
    const spread = evenlySpread(30, 8);
    expect(await page.getByTestId('sweep-plot').getAttribute('data-groups')).toBe(spread.join(','));
    expect(def.groups).toHaveLength(8);
    await expect
      .poll(() => page.getByTestId('plot-caption').textContent())
      .toMatch(/8 of 30 values of B_T drawn, spread evenly/);

    // Remove one value and add another through the picker.
    const B = (k: number) => 0.02 + (k * (0.6 - 0.02)) / 29;
    const label = (k: number) =>
      new RegExp(`^${B(k).toPrecision(4).replace(/0+$/, '').replace(/\.$/, '').replace('.', '\\.')}\\s*T$`);
    const next = page.waitForResponse(
      (r) =>
        r.url().includes(`/api/sweeps/${id}/series`) &&
        r.url().includes('groupBy=B_T') &&
        r.url().includes('groups=0%2C1%2C'),
    );
    await page.getByTestId('plot-groups').click();
    await page.getByRole('option', { name: label(1) }).click();
    const picked = await (await next).json();
    await page.keyboard.press('Escape');
    await page.waitForURL(/g=0%2C1%2C|g=0,1,/);
    const digits = [...spread, 1].sort((a, b) => a - b);
    expect(await page.getByTestId('sweep-plot').getAttribute('data-groups')).toBe(digits.join(','));
    expect(picked.groups).toHaveLength(9);
    const stored = await rowsWhere({ Ln_m: { eq: 0.02 } });
    for (const [gi, digit] of digits.entries()) {
      const g = picked.groups[gi];
      expect(g.value).toBeCloseTo(B(digit), 12);
      expect(g.points).toHaveLength(7);
      for (const [te, v, , idx] of g.points) {
        const row = stored.find((r) => r.idx === idx)!;
        expect(row.B_T).toBe(g.value);
        expect(row.Te_eV).toBe(te);
        expect(row.vDi_ms).toBe(v);
      }
    }
    await expect
      .poll(() => page.getByTestId('plot-caption').textContent())
      .toMatch(/9 of 30 values of B_T drawn \(your choice\)/);
    await shot(page, 'line-1440');
    expect(crashes).toEqual([]);
    await page.close();
  });
});
