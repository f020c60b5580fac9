/**
 * Issue 12: a sweep over neutral density (given as pressure) and field raises unmagnetised_ions
 * exactly where ν_in ≥ ω_ci, the summary counts points by the new flags, and the export manifest
 * lists them. The expected boundary is recomputed here independently: ν_in = n_n σ v̄ with
 * v̄ = sqrt(8 e (T_i + T_n)/(π m_i)) (kinetic theory, common practice) and ω_ci = Z e B/m_i
 * (NRL Plasma Formulary); constants CODATA 2018.
 */
import { strFromU8, unzipSync } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { waitForSweep } from '../support/sweeps.js';

const E = 1.602176634e-19;
const MP = 1.67262192369e-27;
const MU = (39.948 * 1.6605390666e-27) / MP;
const KB = 1.380649e-23;

describe('collisions and magnetisation through the api', () => {
  let t: TestApp;
  let token: string;
  beforeAll(async () => {
    t = await startTestApp();
    token = await t.login(DEMO.researcher);
  });
  afterAll(async () => {
    await t?.close();
  });

  it('flags unmagnetised_ions where ν_in/ω_ci ≥ 1 on a pressure × field grid, and counts it', async () => {
    const Tn = (300 * KB) / E;
    const def = {
      name: 'Argon magnetisation test scan',
      model: 'cross-field',
      fixed: { mu: '39.948 * m_u / m_p', Z: 1, n_m3: 1e17, Te_eV: 3, Ti_eV: 0.1, Ln_m: 0.05, Tn_eV: '300 K' },
      axes: [
        { param: 'nn_m3', kind: 'log', min: '0.01 Pa', max: '10 Pa', count: 7 },
        { param: 'B_T', kind: 'log', min: 0.01, max: 1, count: 5 },
      ],
      sampling: { kind: 'grid' },
    };
    const created = await t.http.post('/api/sweeps').set('authorization', `Bearer ${token}`).send(def);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const sweep = await waitForSweep(t, token, created.body.id);
    expect(sweep.status).toBe('completed');

    const res = await t.http
      .get(`/api/sweeps/${created.body.id}/results`)
      .query({ pageSize: 200 })
      .set('authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    const rows = res.body.rows as Record<string, unknown>[];
    // Rows carry the flag mask; the bit of each code comes from the model registry.
    const model = await t.http.get('/api/models/cross-field').set('authorization', `Bearer ${token}`);
    expect(model.body.version).toBe('2.0.0');
    const bit = (model.body.flags as { code: string; bit: number }[]).find((f) => f.code === 'unmagnetised_ions')!.bit;
    expect(rows).toHaveLength(35);
    let flagged = 0;
    for (const r of rows) {
      const nn = r.nn_m3 as number,
        B = r.B_T as number;
      const mi = MU * MP;
      const nu = nn * 1e-18 * Math.sqrt(((8 * E) / Math.PI) * ((0.1 + Tn) / mi));
      const x = nu / ((E * B) / mi);
      expect(Math.abs((r.nu_over_omega_i as number) / x - 1)).toBeLessThan(1e-9);
      const mask = r.flags as number;
      const expected = x >= 1;
      if (expected) flagged++;
      expect((mask & (1 << bit)) !== 0, `nn ${nn} B ${B} x ${x}: mask ${mask}`).toBe(expected);
      if (expected) expect(r.valid).toBe(false);
    }
    // Both sides of the boundary are on the grid.
    expect(flagged).toBeGreaterThan(3);
    expect(flagged).toBeLessThan(32);
    expect(sweep.flagsSummary.byFlag.unmagnetised_ions).toBe(flagged);

    // The export's manifest counts the points per flag too, with the model version they were computed with.
    const zip = await t.http
      .get(`/api/sweeps/${created.body.id}/export`)
      .set('authorization', `Bearer ${token}`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(zip.status).toBe(200);
    const files = unzipSync(new Uint8Array(zip.body as Buffer));
    const manifest = JSON.parse(strFromU8(files['manifest.json']!)) as {
      sweep: { flagCounts: Record<string, number> };
      model: { version: string };
    };
    expect(manifest.sweep.flagCounts.unmagnetised_ions).toBe(flagged);
    expect(manifest.model.version).toBe('2.0.0');
  });

  it('refuses a pressure when the neutral temperature is swept, naming the field', async () => {
    const res = await t.http
      .post('/api/sweeps/preview')
      .set('authorization', `Bearer ${token}`)
      .send({
        name: 'bad',
        model: 'cross-field',
        fixed: { nn_m3: '1 Pa' },
        axes: [{ param: 'Tn_eV', kind: 'linear', min: 0.02, max: 0.05, count: 2 }],
        sampling: { kind: 'grid' },
      });
    expect(JSON.stringify(res.body)).toMatch(/fixed\.nn_m3/);
    expect(JSON.stringify(res.body)).toMatch(/fixed Tn_eV/);
  });
});
