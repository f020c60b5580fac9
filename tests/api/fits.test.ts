import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
let researcher: string;
let reviewer: string;
let admin: string;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

/**
 * A cross-field scan with Ti, B and Ln swept independently (Te fixed), so the exponents of vDi
 * against each can be separated. vDi = −γ_i·Ti/(Z·B·Ln) (SPEC §3.1; the textbook ion diamagnetic
 * drift with T in volts), so with γ_i = Z = 1 the power law is exact: C = −1, exponents 1, −1, −1.
 */
function crossFieldScan(counts = { ti: 4, b: 4, ln: [0.05, 0.1, 0.2, 0.5] }, name = 'Argon column drift scaling scan') {
  return smallSweep({
    name,
    fixed: { n_m3: 1e18, mu: 40, Z: 1, Er_Vm: 0, gamma_i: 1, gamma_e: 1, Te_eV: 5 },
    axes: [
      { param: 'Ti_eV', kind: 'log', min: 1, max: 10, count: counts.ti },
      { param: 'B_T', kind: 'linear', min: 0.1, max: 1, count: counts.b },
      { param: 'Ln_m', kind: 'list', values: counts.ln },
    ],
  });
}

async function runSweep(token: string, def: object): Promise<number> {
  const res = await t.http.post('/api/sweeps').set(auth(token)).send(def);
  expect(res.status).toBe(201);
  const done = await waitForSweep(t, token, res.body.id, 120_000);
  expect(done.status).toBe('completed');
  return res.body.id as number;
}

/** mulberry32: a small seeded generator, so the noisy data set is the same on every run. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let x = Math.imul(a ^ (a >>> 15), 1 | a);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by Box–Muller. */
function gaussian(next: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
}

let sweepId: number;
beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  reviewer = await t.login(DEMO.reviewer);
  admin = await t.login(DEMO.admin);
  sweepId = await runSweep(researcher, crossFieldScan());
}, 180_000);
afterAll(async () => {
  await t?.close();
});

const powerLaw = (over: Record<string, unknown> = {}) => ({
  source: { kind: 'sweep', id: sweepId },
  model: 'power-law',
  y: 'vDi_ms',
  x: ['Ti_eV', 'B_T', 'Ln_m'],
  filter: { valid: { eq: true } },
  ...over,
});

describe('power law on a noiseless cross-field sweep (SPEC §13.2)', () => {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- a supertest response body, asserted field by field
  let fit: Record<string, any>;

  it('recovers exponents 1, −1, −1 to 1e-9 on the valid points, with the sign of vDi on C', async () => {
    const res = await t.http.post('/api/fits').set(auth(researcher)).send(powerLaw());
    expect(res.status).toBe(201);
    fit = res.body;
    const valid = await t.http
      .get(`/api/sweeps/${sweepId}/results`)
      .query({ filter: JSON.stringify({ valid: { eq: true } }), pageSize: 1 })
      .set(auth(researcher));
    // The filter matters: some points break the drift ordering (ρ_i/Ln ≥ 0.1), some do not.
    expect(valid.body.total).toBeGreaterThan(10);
    expect(valid.body.total).toBeLessThan(64);
    expect(fit).toMatchObject({
      status: 'completed',
      model: 'power-law',
      converged: true,
      n: valid.body.total,
      dropped: 0,
      signRestored: true,
    });
    const p = Object.fromEntries(fit.parameters.map((q: { name: string }) => [q.name, q]));
    expect(Object.keys(p)).toEqual(['C', 'exp_Ti_eV', 'exp_B_T', 'exp_Ln_m']);
    expect(Math.abs(p.exp_Ti_eV.value - 1)).toBeLessThan(1e-9);
    expect(Math.abs(p.exp_B_T.value + 1)).toBeLessThan(1e-9);
    expect(Math.abs(p.exp_Ln_m.value + 1)).toBeLessThan(1e-9);
    // vDi = −Ti/(B·Ln) exactly for γ_i = Z = 1 (T in volts): C = −1 m/s per V/(T·m).
    expect(Math.abs(p.C.value + 1)).toBeLessThan(1e-9);
    const qs = Object.values(p) as { stdError: number | null; fixed: boolean; ci95: unknown }[];
    for (const q of qs) {
      // Exact data: residuals at the rounding level carry no scatter, so no standard error or interval is
      // claimed (null), and the message says why.
      expect(q.stdError).toBeNull();
      expect(q.ci95).toBeNull();
      expect(q.fixed).toBe(false);
    }
    expect(fit.message).toMatch(/rounding level/);
    // t(0.975, dof): a positive finite quantile above the normal 1.96 (Student-t, common practice).
    expect(fit.confidence.t).toBeGreaterThan(1.96);
    expect(p.exp_B_T.unit).toBe('1');
    // Column units as the sweep stores them (canonical: SI, temperatures in eV).
    expect(fit.units).toMatchObject({ B_T: 'T', Ti_eV: 'eV', Ln_m: 'm' });
    expect(fit.r2).toBeGreaterThan(1 - 1e-12);
    expect(fit.dof).toBe(fit.n - 4);
    expect(fit.rss).toBeLessThan(1e-12 * fit.n);
    // The exact log–log start of a noiseless power law needs no more than a few refinement steps.
    expect(Number.isInteger(fit.iterations)).toBe(true);
    expect(fit.iterations).toBeLessThanOrEqual(5);
    // Every fit carries the information criteria and a correlation matrix in parameter order.
    expect(fit.correlation).toHaveLength(4);
    expect(fit.correlation[1]).toEqual([null, null, null, null]);
    expect(typeof fit.aic).toBe('number');
  });

  it('stores the request, the versions, who ran it, and the plot data', async () => {
    expect(fit.modelVersion).toBeTruthy();
    const sweep = await t.http.get(`/api/sweeps/${sweepId}`).set(auth(researcher));
    expect(fit.modelVersion).toBe(sweep.body.provenance.modelVersion);
    expect(fit.appVersion).toBe(sweep.body.provenance.appVersion);
    expect(fit.owner.id).toBeGreaterThan(0);
    expect(fit.request).toMatchObject({
      source: { kind: 'sweep', id: sweepId },
      y: 'vDi_ms',
      filter: { valid: { eq: true } },
    });
    expect(fit.plot.shown).toBe(fit.n);
    expect(fit.plot.x.B_T).toHaveLength(fit.n);
    expect(fit.plot.y.every((v: number) => v < 0)).toBe(true);
    expect(fit.plot.fitted[0]).toBeCloseTo(fit.plot.y[0], 9);
    expect(fit.confidence).toMatchObject({ level: 0.95, dof: fit.dof });
    // t(0.975, ν) from a standard table (NIST/SEMATECH e-Handbook §1.3.6.7.2) lies between 2.0 and 2.2 for ν ≥ 10.
    expect(fit.confidence.t).toBeGreaterThan(2.0);
    expect(fit.confidence.t).toBeLessThan(2.23);
    const row = t
      .sqlite()
      .prepare(
        'SELECT owner_id, source_kind, source_id, status, request, app_version, source_model_version FROM fits WHERE id = ?',
      )
      .get(fit.id) as Record<string, unknown>;
    expect(row).toMatchObject({
      source_kind: 'sweep',
      source_id: sweepId,
      status: 'completed',
      app_version: fit.appVersion,
      source_model_version: fit.modelVersion,
    });
    expect(JSON.parse(row.request as string).x).toEqual(['Ti_eV', 'B_T', 'Ln_m']);
  });

  it('lists the fit with its source and shows it by id', async () => {
    const list = await t.http.get('/api/fits').query({ sourceKind: 'sweep', sourceId: sweepId }).set(auth(researcher));
    expect(list.status).toBe(200);
    expect(list.body).toMatchObject({ page: 1, pageSize: 50 });
    expect(list.body.items.map((f: { id: number }) => f.id)).toContain(fit.id);
    const item = list.body.items.find((f: { id: number }) => f.id === fit.id);
    expect(item.source).toMatchObject({ kind: 'sweep', id: sweepId, name: 'Argon column drift scaling scan' });
    expect(item.plot).toBeUndefined();
    const one = await t.http.get(`/api/fits/${fit.id}`).set(auth(researcher));
    expect(one.status).toBe(200);
    expect(one.body.parameters).toEqual(fit.parameters);
  });

  it('a power law on a quantity of both signs is refused naming y', async () => {
    // vE = −Er/B changes sign with Er: no single sign to carry on C.
    const mixed = await runSweep(
      researcher,
      smallSweep({
        name: 'Mixed-sign E×B scan',
        axes: [
          { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 3 },
          { param: 'Er_Vm', kind: 'list', values: [-100, 50, 200] },
        ],
        fixed: { n_m3: 1e18, mu: 40, Z: 1, gamma_i: 1, gamma_e: 1, Ti_eV: 'Te_eV', Ln_m: 0.02, B_T: 0.1 },
      }),
    );
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({ source: { kind: 'sweep', id: mixed }, model: 'power-law', y: 'vE_ms', x: ['Te_eV'] });
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe('y');
  });
});

describe('errors and access', () => {
  it('names an unknown column (400)', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(powerLaw({ x: ['Ti_eV', 'B_tesla'] }));
    expect(res.status).toBe(400);
    expect(res.body.details[0]).toMatchObject({ path: 'x.1' });
    expect(res.body.message).toContain('B_tesla');
  });

  it('names an unknown filter column (400)', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(powerLaw({ filter: { nope: { gte: 1 } } }));
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe('filter.nope');
  });

  it('refuses too few points (400)', async () => {
    // One point survives this filter; four parameters need at least five.
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(powerLaw({ filter: { Ti_eV: { lte: 1 }, B_T: { lte: 0.1 }, Ln_m: { lte: 0.05 } } }));
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/too few points/);
    const none = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(powerLaw({ filter: { Ti_eV: { gt: 1000 } } }));
    expect(none.status).toBe(400);
    expect(none.body.message).toMatch(/too few points/);
  });

  it('refuses a singular problem (400 naming x)', async () => {
    // Ti fixed by the filter: ln Ti is constant, collinear with ln C.
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(powerLaw({ filter: { Ti_eV: { lte: 1 } } }));
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe('x');
    expect(res.body.message).toMatch(/singular/);
  });

  it('rejects a malformed request with field paths', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({ source: { kind: 'sweep', id: sweepId }, model: 'spline', y: 'vDi_ms', x: 'B_T' });
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { path: string }) => d.path)).toContain('model');
  });

  it('is closed to reviewers for POST (403)', async () => {
    const res = await t.http.post('/api/fits').set(auth(reviewer)).send(powerLaw());
    expect(res.status).toBe(403);
  });

  it("hides another user's private sweep and its fits (404)", async () => {
    const adminSweep = await runSweep(admin, crossFieldScan({ ti: 3, b: 3, ln: [0.1, 0.5] }, 'Admin private scan'));
    const adminFit = await t.http
      .post('/api/fits')
      .set(auth(admin))
      .send(powerLaw({ source: { kind: 'sweep', id: adminSweep }, filter: undefined }));
    expect(adminFit.status).toBe(201);
    const post = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(powerLaw({ source: { kind: 'sweep', id: adminSweep } }));
    expect(post.status).toBe(404);
    expect((await t.http.get(`/api/fits/${adminFit.body.id}`).set(auth(researcher))).status).toBe(404);
    expect((await t.http.get(`/api/fits/${adminFit.body.id}`).set(auth(reviewer))).status).toBe(404);
    const list = await t.http.get('/api/fits').set(auth(researcher));
    expect(list.body.items.map((f: { id: number }) => f.id)).not.toContain(adminFit.body.id);
    // The admin sees every fit.
    const all = await t.http.get('/api/fits').set(auth(admin));
    expect(all.body.items.map((f: { id: number }) => f.id)).toContain(adminFit.body.id);
    expect((await t.http.get('/api/fits/999999').set(auth(admin))).status).toBe(404);
  });
});

describe('polytropic fit on an uploaded dataset (SPEC §13.3)', () => {
  // n/n0 = [1 + ((γ−1)/γ)·φ/Te]^(1/(γ−1)) (SPEC §3.2; the polytropic generalisation of the
  // Boltzmann relation, a textbook result), with γ = 1.4, Te = 5 eV and Gaussian noise of σ = 0.01.
  const GAMMA = 1.4;
  const TE = 5;
  const SIGMA = 0.01;
  const N = 240;
  const MISSING = [7, 100, 201];
  let datasetId: number;

  beforeAll(async () => {
    const noise = gaussian(rng(20261201));
    const lines = ['phi_V,n_over_n0,sigma'];
    for (let i = 0; i < N; i++) {
      const phi = -12 + (15 * i) / (N - 1);
      const y = (1 + ((GAMMA - 1) / GAMMA) * (phi / TE)) ** (1 / (GAMMA - 1)) + SIGMA * noise();
      lines.push(MISSING.includes(i) ? `${phi},,${SIGMA}` : `${phi},${y},${SIGMA}`);
    }
    const res = await t.http
      .post('/api/datasets')
      .set(auth(researcher))
      .field('name', 'Probe sweep, argon column')
      .field('units', JSON.stringify({ phi_V: 'V' }))
      .attach('file', Buffer.from(lines.join('\n') + '\n'), 'probe.csv');
    expect(res.status).toBe(201);
    datasetId = res.body.id;
  });

  it('recovers Te and γ within 3 standard errors and reports the dropped rows', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({ source: { kind: 'dataset', id: datasetId }, model: 'polytropic', y: 'n_over_n0', x: 'phi_V' });
    expect(res.status).toBe(201);
    const f = res.body;
    expect(f).toMatchObject({
      status: 'completed',
      converged: true,
      n: N - MISSING.length,
      dropped: MISSING.length,
      modelVersion: null,
    });
    const p = Object.fromEntries(f.parameters.map((q: { name: string }) => [q.name, q]));
    expect(p.Te_eV.unit).toBe('eV');
    expect(f.units.phi_V).toBe('V');
    expect(Math.abs(p.Te_eV.value - TE)).toBeLessThan(3 * p.Te_eV.stdError);
    expect(Math.abs(p.gamma.value - GAMMA)).toBeLessThan(3 * p.gamma.stdError);
    // The noise is small: the errors are a few per cent at most, not vacuous.
    expect(p.Te_eV.stdError / TE).toBeLessThan(0.05);
    expect(p.gamma.stdError / GAMMA).toBeLessThan(0.05);
    // RMSE of the residuals ≈ σ of the noise (common practice: residual spread estimates the noise).
    expect(f.rmse).toBeGreaterThan(0.7 * SIGMA);
    expect(f.rmse).toBeLessThan(1.3 * SIGMA);
    expect(f.plot.residuals).toHaveLength(f.n);
  });

  it('weights by σ give a reduced χ² near 1, and a range filter narrows the points', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({
        source: { kind: 'dataset', id: datasetId },
        model: 'polytropic',
        y: 'n_over_n0',
        x: 'phi_V',
        weights: 'sigma',
        filter: { phi_V: { gte: -10 } },
      });
    expect(res.status).toBe(201);
    // χ²/ν has standard deviation sqrt(2/ν) ≈ 0.1 here (common practice); 3σ band.
    expect(res.body.chi2red).toBeGreaterThan(0.7);
    expect(res.body.chi2red).toBeLessThan(1.3);
    expect(res.body.n).toBeLessThan(N - MISSING.length);
    expect(res.body.n).toBeGreaterThan(150);
    const list = await t.http
      .get('/api/fits')
      .query({ sourceKind: 'dataset', sourceId: datasetId })
      .set(auth(researcher));
    expect(list.body.total).toBe(2);
    expect(list.body.items[0].source.name).toBe('Probe sweep, argon column');
  });

  it('an expression fit on the dataset reports its own parameters', async () => {
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({
        source: { kind: 'dataset', id: datasetId },
        model: 'expression',
        y: 'n_over_n0',
        x: ['phi_V'],
        expr: 'A * exp(phi_V / T)',
        params: { A: 1, T: 4 },
      });
    expect(res.status).toBe(201);
    expect(res.body.parameters.map((q: { name: string }) => q.name).sort()).toEqual(['A', 'T']);
    expect(res.body.converged).toBe(true);
  });

  it('stores a fit that did not converge as failed, with converged: false and the reason', async () => {
    // One iteration from a far start cannot reach the minimum; it must not be marked converged.
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send({
        source: { kind: 'dataset', id: datasetId },
        model: 'expression',
        y: 'n_over_n0',
        x: ['phi_V'],
        expr: 'A * exp(phi_V / T)',
        params: { A: 50, T: 0.3 },
        maxIterations: 1,
      });
    expect(res.status).toBe(201);
    expect(res.body.converged).toBe(false);
    expect(res.body.status).toBe('failed');
    expect(res.body.message).toBeTruthy();
    expect(res.body.error).toMatch(/Did not converge/);
  });

  it('hides a private dataset from a reviewer (404)', async () => {
    const list = await t.http
      .get('/api/fits')
      .query({ sourceKind: 'dataset', sourceId: datasetId })
      .set(auth(reviewer));
    expect(list.body.total).toBe(0);
  });
});

describe('long fits run queued (≥ 100,000 points)', () => {
  it('answers 202, then shows progress and the result', async () => {
    // 50 × 50 × 40 = 100,000 points, every one fitted (no filter).
    const ln = Array.from({ length: 40 }, (_, k) => 0.05 + 0.01 * k);
    const big = await runSweep(researcher, crossFieldScan({ ti: 50, b: 50, ln }, 'Large drift scaling scan'));
    const res = await t.http
      .post('/api/fits')
      .set(auth(researcher))
      .send(powerLaw({ source: { kind: 'sweep', id: big }, filter: undefined }));
    expect(res.status).toBe(202);
    expect(res.body).toMatchObject({ status: 'queued', n: 100_000 });
    // eslint-disable-next-line @typescript-eslint/no-explicit-any -- a supertest response body, asserted field by field
    let f: Record<string, any> = {};
    const deadline = Date.now() + 120_000;
    while (Date.now() < deadline) {
      const g = await t.http.get(`/api/fits/${res.body.id}`).set(auth(researcher));
      expect(g.status).toBe(200);
      f = g.body;
      expect(f.progress).toBeGreaterThan(0);
      expect(f.progress).toBeLessThanOrEqual(1);
      if (f.status === 'completed' || f.status === 'failed') break;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(f).toMatchObject({ status: 'completed', progress: 1, converged: true, n: 100_000 });
    const exps = f.parameters.slice(1).map((q: { value: number }) => q.value);
    expect(Math.abs(exps[0] - 1)).toBeLessThan(1e-9);
    expect(Math.abs(exps[1] + 1)).toBeLessThan(1e-9);
    expect(Math.abs(exps[2] + 1)).toBeLessThan(1e-9);
    expect(f.plot.shown).toBeLessThanOrEqual(2000);
    expect(f.plot.total).toBe(100_000);
  }, 240_000);
});
