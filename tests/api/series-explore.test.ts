/**
 * Plot series for exploring a multi-axis sweep: picking which values of a many-valued groupBy input are
 * drawn (`groups=`), slices combined with groups, and the point index carried by every drawn point so the
 * ui can show the whole row under the cursor. Values are checked against the stored rows.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
let token = '';
let id = 0;
const auth = () => ({ authorization: `Bearer ${token}` });
// Three axes, last fastest: Te (6, log) × Ln (25, linear) × B (4, linear) → strides 100, 4, 1.
const AXES = [
  { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 6 },
  { param: 'Ln_m', kind: 'linear', min: 0.01, max: 0.25, count: 25 },
  { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 4 },
];

beforeAll(async () => {
  t = await startTestApp();
  token = await t.login(DEMO.researcher);
  const { Ln_m: _ln, ...fixed } = smallSweep().fixed;
  const res = await t.http
    .post('/api/sweeps')
    .set(auth())
    .send(smallSweep({ name: 'Argon three-axis scan', fixed, axes: AXES }));
  expect(res.status).toBe(201);
  id = res.body.id;
  await waitForSweep(t, token, id);
}, 120_000);

afterAll(async () => {
  await t?.close();
});

const series = (query: Record<string, string | number>) =>
  t.http.get(`/api/sweeps/${id}/series`).query(query).set(auth());

async function rowAt(idx: number): Promise<Record<string, number>> {
  const res = await t.http
    .get(`/api/sweeps/${id}/results`)
    .query({ filter: JSON.stringify({ idx: { eq: idx } }), pageSize: 1 })
    .set(auth());
  expect(res.status).toBe(200);
  expect(res.body.rows).toHaveLength(1);
  return res.body.rows[0];
}

describe('groups: which values of a many-valued input are drawn', () => {
  it('refuses to group by 25 values without a pick, naming groups as the way out', async () => {
    const res = await series({ x: 'Te_eV', y: 'rho_i_over_Ln', groupBy: 'Ln_m' });
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe('groupBy');
    expect(res.body.details[0].message).toContain('groups=');
  });

  it('draws exactly the picked values, each line matching the stored rows at the slice', async () => {
    const res = await series({ x: 'Te_eV', y: 'rho_i_over_Ln', groupBy: 'Ln_m', groups: '24,0,12', 'slice.B_T': 2 });
    expect(res.status).toBe(200);
    expect(res.body.method).toBe('grid-slice');
    // Sorted by value: Ln = 0.01, 0.13, 0.25 m (grid values 0, 12, 24 of a linear axis, step 0.01 m).
    expect(res.body.groups.map((g: { value: number }) => g.value)).toEqual(
      [0.01, 0.13, 0.25].map((v) => expect.closeTo(v, 12)),
    );
    expect(res.body.slice.B_T).toMatchObject({ index: 2 });
    for (const [gi, digit] of [0, 12, 24].entries()) {
      const g = res.body.groups[gi];
      expect(g.points).toHaveLength(6);
      for (const [k, p] of g.points.entries()) {
        // The carried index is the grid index of (Te = k, Ln = digit, B = 2).
        expect(p[3]).toBe(k * 100 + digit * 4 + 2);
        const row = await rowAt(p[3]);
        expect(p[0]).toBe(row.Te_eV);
        expect(p[1]).toBe(row.rho_i_over_Ln);
        expect(row.Ln_m).toBe(g.value);
        expect(row.B_T).toBe(res.body.slice.B_T.value);
      }
    }
  });

  it('checks the picked values: past the end, too many, malformed, or without groupBy', async () => {
    const past = await series({ x: 'Te_eV', y: 'beta', groupBy: 'Ln_m', groups: '3,25' });
    expect(past.status).toBe(400);
    expect(past.body.details[0]).toMatchObject({ path: 'groups' });
    expect(past.body.details[0].message).toContain('0 to 24');
    const many = await series({
      x: 'Te_eV',
      y: 'beta',
      groupBy: 'Ln_m',
      groups: Array.from({ length: 21 }, (_, i) => i).join(','),
    });
    expect(many.status).toBe(400);
    expect(many.body.details[0].path).toMatch(/^groups/);
    const text = await series({ x: 'Te_eV', y: 'beta', groupBy: 'Ln_m', groups: 'first' });
    expect(text.status).toBe(400);
    const alone = await series({ x: 'Te_eV', y: 'beta', groups: '1' });
    expect(alone.status).toBe(400);
    expect(alone.body.details[0].path).toBe('groups');
    const notSwept = await series({ x: 'vte_ms', y: 'beta', groupBy: 'B_T', groups: '1' });
    expect(notSwept.status).toBe(400);
    expect(notSwept.body.details[0].path).toBe('groups');
  });
});

describe('point indices on heatmaps', () => {
  it('gives each sliced cell the index of its stored row; averaged cells have none', async () => {
    const res = await series({ kind: 'heatmap', x: 'Te_eV', y: 'B_T', z: 'rho_i_over_Ln', 'slice.Ln_m': 7 });
    expect(res.status).toBe(200);
    expect(res.body.cells).toHaveLength(24);
    for (const c of res.body.cells.slice(0, 6)) {
      const [xi, yi, z, , , idx] = c;
      expect(idx).toBe(xi * 100 + 7 * 4 + yi);
      const row = await rowAt(idx);
      expect(row.rho_i_over_Ln).toBe(z);
      expect(row.Te_eV).toBe(res.body.x.values[xi]);
      expect(row.B_T).toBe(res.body.y.values[yi]);
    }
    const mean = await series({ kind: 'heatmap', x: 'Te_eV', y: 'B_T', z: 'rho_i_over_Ln', agg: 'mean' });
    expect(mean.body.cells.every((c: unknown[]) => c[5] === null)).toBe(true);
  });
});
