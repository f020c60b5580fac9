import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { ARGON_PROBE_SCAN as SCAN, probeScanCsv } from '../fixtures/datasets/polytropic-probe.js';

let t: TestApp;
let researcher: string;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
}, 60_000);
afterAll(async () => {
  await t?.close();
});

describe('polytropic fit of a raw density column (SPEC §13.3)', () => {
  let datasetId: number;

  beforeAll(async () => {
    const res = await t.http
      .post('/api/datasets')
      .set(auth(researcher))
      .field('name', 'Argon column probe scan (raw density)')
      .field('units', JSON.stringify({ phi: 'V', n: 'cm^-3' }))
      .attach('file', Buffer.from(probeScanCsv()), 'argon-probe-polytropic.csv');
    expect(res.status).toBe(201);
    expect(res.body.columns.find((c: { name: string }) => c.name === 'n')).toMatchObject({
      unit: 'cm^-3',
      canonicalUnit: 'm^-3',
    });
    datasetId = res.body.id;
  });

  it('fits γ, Te and n0 (in m^-3) within 3 standard errors of the generating values', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({ source: { kind: 'dataset', id: datasetId }, model: 'polytropic', y: 'n', x: 'phi' });
    expect(res.status).toBe(201);
    const f = res.body;
    expect(f).toMatchObject({ status: 'completed', converged: true, n: SCAN.points });
    expect(f.parameters.map((q: { name: string }) => q.name)).toEqual(['gamma', 'Te_eV', 'n0']);
    const p = Object.fromEntries(f.parameters.map((q: { name: string }) => [q.name, q]));
    expect(p.gamma.unit).toBe('1');
    expect(p.Te_eV.unit).toBe('eV');
    expect(p.n0.unit).toBe('m^-3');
    expect(f.units).toMatchObject({ n: 'm^-3', phi: 'V' });
    // SI: 1 cm^-3 = 1e6 m^-3 (exact), so n0 = 1e12 cm^-3 is 1e18 m^-3.
    const n0 = SCAN.n0Cm3 * 1e6;
    expect(Math.abs(p.gamma.value - SCAN.gamma)).toBeLessThan(3 * p.gamma.stdError);
    expect(Math.abs(p.Te_eV.value - SCAN.teEv)).toBeLessThan(3 * p.Te_eV.stdError);
    expect(Math.abs(p.n0.value - n0)).toBeLessThan(3 * p.n0.stdError);
    // At 1 % noise the errors are informative, not vacuous.
    expect(p.gamma.stdError / SCAN.gamma).toBeLessThan(0.05);
    expect(p.Te_eV.stdError / SCAN.teEv).toBeLessThan(0.05);
    expect(p.n0.stdError / n0).toBeLessThan(0.02);
    // The 95 % interval brackets the value by t·stdError.
    expect(p.n0.ci95.low).toBeLessThan(p.n0.value);
    expect(p.n0.ci95.high).toBeGreaterThan(p.n0.value);
    // The residual spread estimates the noise (common practice): σ = 1e10 cm^-3 = 1e16 m^-3.
    const sigma = SCAN.sigmaCm3 * 1e6;
    expect(f.rmse / sigma).toBeGreaterThan(0.7);
    expect(f.rmse / sigma).toBeLessThan(1.3);
    expect(f.plot.residuals).toHaveLength(f.n);
  });

  it('takes a start value for n0 from params, and refuses a non-positive one naming the field', async () => {
    const ok = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({
        source: { kind: 'dataset', id: datasetId },
        model: 'polytropic',
        y: 'n',
        x: 'phi',
        params: { n0: 5e17, gamma: 1.2 },
      });
    expect(ok.status).toBe(201);
    expect(ok.body.converged).toBe(true);
    const n0 = ok.body.parameters.find((q: { name: string }) => q.name === 'n0');
    expect(Math.abs(n0.value - SCAN.n0Cm3 * 1e6)).toBeLessThan(3 * n0.stdError);

    const bad = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({ source: { kind: 'dataset', id: datasetId }, model: 'polytropic', y: 'n', x: 'phi', params: { n0: -1 } });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toMatch(/params\.n0/);
  });
});
