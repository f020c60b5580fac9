/**
 * Models api: GET /api/models, GET /api/models/:id, POST /api/models/:id/evaluate (SPEC §6).
 *
 * The hand-checked point (Te 10 eV, B 0.5 T, L_n 2 cm, registry defaults elsewhere: Ti 10 eV,
 * n 1e19 m^-3, γ_e = γ_i = 1, E_r = 0, mu 2, Z 1) is recomputed here from the SPEC §3.1 formulas
 * with CODATA 2018 constants written out below (Tiesinga et al., Rev. Mod. Phys. 93, 025010
 * (2021)), independently of domain/src/constants.ts; the NRL Plasma Formulary ion-gyroradius
 * coefficient (1.02×10² cm, printed to 3 figures) is a second, outside check.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

// CODATA 2018 (e exact since 2019).
const e = 1.602176634e-19;
const m_e = 9.1093837015e-31;
const m_p = 1.67262192369e-27;
const eps0 = 8.8541878128e-12;
const mu0 = 1.25663706212e-6;

function hand(Te: number, Ti: number, B: number, n: number, Ln: number, mu: number) {
  const mi = mu * m_p;
  const vti = Math.sqrt((e * Ti) / mi); // v_t = sqrt(kT/m), NRL convention (SPEC §2)
  const wci = (e * B) / mi;
  const vte = Math.sqrt((e * Te) / m_e);
  const wce = (e * B) / m_e;
  const rho_i = vti / wci;
  const lambdaD = Math.sqrt((eps0 * Te) / (e * n));
  return {
    vE_ms: 0,
    vDe_ms: Te / (B * Ln),
    vDi_ms: -Ti / (B * Ln),
    jTheta_Am2: -(e * n * (Te + Ti)) / (Ln * B), // −|∇p|/B with |∇p| = e n (Te+Ti)/L_n at γ = 1
    beta: (2 * mu0 * e * n * (Te + Ti)) / (B * B),
    omega_ce: wce,
    omega_ci: wci,
    rho_e_m: vte / wce,
    rho_i_m: rho_i,
    lambdaD_m: lambdaD,
    rho_i_over_Ln: rho_i / Ln,
    lambdaD_over_Ln: lambdaD / Ln,
  };
}

describe('models api', () => {
  let t: TestApp;
  let token: string;
  let reviewer: string;
  const auth = (tk: string) => ({ authorization: `Bearer ${tk}` });

  beforeAll(async () => {
    t = await startTestApp();
    token = await t.login(DEMO.researcher);
    reviewer = await t.login(DEMO.reviewer);
  });
  afterAll(async () => {
    await t?.close();
  });

  it('lists the three models with units, defaults, ranges and meanings', async () => {
    const res = await t.http.get('/api/models').set(auth(token));
    expect(res.status).toBe(200);
    const ids = res.body.items.map((m: { id: string }) => m.id);
    expect(ids).toEqual(['cross-field', 'parallel-balance', 'column-profile']);
    expect(res.body.total).toBe(3);
    for (const m of res.body.items) {
      expect(m.version).toMatch(/^\d+\.\d+\.\d+$/);
      for (const i of m.inputs) {
        expect(typeof i.unit).toBe('string');
        expect(typeof i.default).toBe('number');
        expect(i.min).toBeLessThanOrEqual(i.max);
        expect(i.meaning.length).toBeGreaterThan(5);
      }
      expect(m.outputs.length).toBeGreaterThan(3);
    }
  });

  it('returns one model; a reviewer may read it too', async () => {
    const res = await t.http.get('/api/models/cross-field').set(auth(reviewer));
    expect(res.status).toBe(200);
    expect(res.body.id).toBe('cross-field');
    const te = res.body.inputs.find((i: { name: string }) => i.name === 'Te_eV');
    expect(te).toMatchObject({ unit: 'eV', min: 0, minExclusive: true });
    expect(res.body.flags.map((f: { code: string }) => f.code)).toContain('rho_i_over_Ln');
    expect(res.body.hasProfile).toBe(false);
  });

  it('404 for an unknown model names the known ids', async () => {
    const res = await t.http.get('/api/models/no-such-model').set(auth(token));
    expect(res.status).toBe(404);
    expect(res.body.message).toContain('cross-field');
    expect(res.body.message).toContain('column-profile');
    const ev = await t.http.post('/api/models/no-such-model/evaluate').set(auth(token)).send({ inputs: {} });
    expect(ev.status).toBe(404);
    expect(ev.body.message).toContain('parallel-balance');
  });

  it('401 without a session', async () => {
    expect((await t.http.get('/api/models')).status).toBe(401);
    expect((await t.http.get('/api/models/cross-field')).status).toBe(401);
    expect((await t.http.post('/api/models/cross-field/evaluate').send({ inputs: {} })).status).toBe(401);
  });

  it('evaluates the hand-checked point given as unit strings', async () => {
    const res = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: { Te_eV: '10 eV', B_T: '0.5 T', Ln_m: '2 cm' } });
    expect(res.status).toBe(200);
    expect(res.body.model).toBe('cross-field');
    expect(res.body.modelVersion).toMatch(/^\d+\.\d+\.\d+$/);
    expect(res.body.inputs).toMatchObject({ Te_eV: 10, B_T: 0.5, Ln_m: 0.02, Ti_eV: 10, n_m3: 1e19, mu: 2 });
    const want = hand(10, 10, 0.5, 1e19, 0.02, 2);
    for (const [k, v] of Object.entries(want)) {
      if (v === 0) expect(Math.abs(res.body.outputs[k]), k).toBe(0);
      else expect(res.body.outputs[k] / v, k).toBeCloseTo(1, 10);
    }
    // E×B drift zero at E_r = 0; diamagnetic drifts ±1000 m/s (10 V / (0.5 T · 0.02 m)).
    expect(res.body.outputs.vDe_ms).toBeCloseTo(1000, 9);
    expect(res.body.outputs.vDi_ms).toBeCloseTo(-1000, 9);
    // NRL Plasma Formulary: r_i = 1.02×10² μ^½ T_i^½ / B cm (B in gauss), 3 printed figures.
    const nrlRhoI = (1.02e2 * Math.sqrt(2) * Math.sqrt(10)) / 5000 / 100;
    expect(Math.abs(res.body.outputs.rho_i_m / nrlRhoI - 1)).toBeLessThan(5e-3);
    // ρ_i/L_n ≈ 0.0457 < 0.1, λ_D/L_n ≪ 0.1, β ≪ 1: no flag, valid.
    expect(res.body.flags).toEqual([]);
    expect(res.body.outputs.valid).toBe(true);
  });

  it('gives the same numbers for canonical numbers, other units and defaults', async () => {
    const a = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: { Te_eV: 10, B_T: 0.5, Ln_m: 0.02 } });
    const b = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: { Te_eV: '0.01 keV', B_T: '5000 G', Ln_m: '20 mm', n_m3: '1e13 cm^-3' } });
    expect(a.status).toBe(200);
    expect(b.status).toBe(200);
    for (const k of ['vDe_ms', 'vDi_ms', 'rho_i_m', 'lambdaD_m', 'beta'])
      expect(b.body.outputs[k] / a.body.outputs[k], k).toBeCloseTo(1, 12);
    // No inputs at all: every registry default (Te 10 eV, B 0.5 T, L_n 2 cm) — the same point.
    const d = await t.http.post('/api/models/cross-field/evaluate').set(auth(token)).send({});
    expect(d.status).toBe(200);
    expect(d.body.outputs.vDe_ms).toBe(a.body.outputs.vDe_ms);
  });

  it('flags a point outside the drift ordering instead of rejecting it', async () => {
    // Te = Ti = 1 keV, B 0.1 T, L_n 1 cm, deuterium: ρ_i ≈ 4.6 cm ≫ 0.1 L_n.
    const res = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: { Te_eV: '1 keV', Ti_eV: '1 keV', B_T: '0.1 T', Ln_m: '1 cm' } });
    expect(res.status).toBe(200);
    expect(res.body.flags).toContain('rho_i_over_Ln');
    expect(res.body.outputs.valid).toBe(false);
    expect(res.body.outputs.rho_i_over_Ln / hand(1000, 1000, 0.1, 1e19, 0.01, 2).rho_i_over_Ln).toBeCloseTo(1, 10);
  });

  it('400 names the field and the allowed range', async () => {
    const neg = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: { Te_eV: -5 } });
    expect(neg.status).toBe(400);
    const d = neg.body.details.find((x: { path: string }) => x.path === 'inputs.Te_eV');
    expect(d.message).toContain('Te_eV');
    expect(d.message).toMatch(/> 0 and ≤ 1e6 eV/);

    const dim = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: { B_T: '3 cm' } });
    expect(dim.status).toBe(400);
    expect(dim.body.details[0].path).toBe('inputs.B_T');
    expect(dim.body.details[0].message).toMatch(/\bT\b/);

    const unknown = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: { Tx: 1 } });
    expect(unknown.status).toBe(400);
    expect(unknown.body.details[0].path).toBe('inputs.Tx');
    expect(unknown.body.details[0].message).toContain('Te_eV');

    const whole = await t.http
      .post('/api/models/column-profile/evaluate')
      .set(auth(token))
      .send({ inputs: { nr: 10.5 } });
    expect(whole.status).toBe(400);
    expect(whole.body.details[0].path).toBe('inputs.nr');
    expect(whole.body.details[0].message).toMatch(/≥ 16 and ≤ 8192/);

    const shape = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: { Te_eV: [1] } });
    expect(shape.status).toBe(400);
    expect(shape.body.details[0].path).toBe('inputs.Te_eV');

    const th = await t.http
      .post('/api/models/cross-field/evaluate')
      .set(auth(token))
      .send({ inputs: {}, thresholds: { nope: 1 } });
    expect(th.status).toBe(400);
    expect(th.body.details[0].path).toBe('thresholds.nope');
  });

  it('returns radial profiles for column-profile, consistent with the scalars', async () => {
    const res = await t.http
      .post('/api/models/column-profile/evaluate')
      .set(auth(token))
      .send({ inputs: { a_m: '4 cm', nr: 128, B0_T: '1000 G' } });
    expect(res.status).toBe(200);
    const p = res.body.profile;
    expect(p.r_m).toHaveLength(128);
    for (const k of ['n_m3', 'p_Pa', 'vDe_ms', 'vDi_ms', 'vE_ms', 'jTheta_Am2', 'B_T'])
      expect(p[k], k).toHaveLength(128);
    expect(p.r_m[0]).toBe(0);
    // r_max = 3a (registry default rmax_over_a = 3).
    expect(p.r_m[127]).toBeCloseTo(0.12, 12);
    // Gaussian: n(a) = n0/e at r = a (definition of the width).
    const n0 = res.body.inputs.n0_m3;
    expect(p.n_m3[0]).toBeCloseTo(n0, -5);
    // Diamagnetic field depression: B below B0 on the axis (textbook: the current lowers the field inside).
    expect(p.B_T[0]).toBeLessThan(0.1);
    expect(p.B_T[0] / 0.1 - 1).toBeCloseTo(res.body.outputs.dB_over_B_axis, 12);
    // Peak |j_θ| of a Gaussian isothermal column sits at r = a/√2 (max of r·exp(−r²/a²)); grid spacing 0.12/127.
    expect(Math.abs(res.body.outputs.r_peak_m - 0.04 / Math.SQRT2)).toBeLessThan(0.12 / 127);
  });
});
