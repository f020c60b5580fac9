/**
 * cross-field version 2: Coulomb logarithms, collision rates, magnetisation, the collisional
 * drifts and the new validity flags. Every check names its source beside it.
 */
import fc from 'fast-check';
import { lusolve } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { ARGON_MU, ELECTRON_MASS, ELEMENTARY_CHARGE as E, PROTON_MASS, SPEED_OF_LIGHT } from '../constants.js';
import { crossField } from './cross-field.js';
import { allocateChunk } from './registry.js';
import { readReferenceCsv, referenceValue } from './reference-csv.js';

fc.configureGlobal({ seed: 20261202 });

const nrl = readReferenceCsv('nrl_coefficients_check.csv');
const defaults = Object.fromEntries(crossField.inputs.map((i) => [i.name, i.default]));
const run = (over: Record<string, number>, th?: Record<string, number>) =>
  crossField.evaluate({ ...defaults, ...over }, th);
const out = (over: Record<string, number>) => run(over).outputs as Record<string, number>;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('Coulomb logarithms (NRL Plasma Formulary, "Collisions and transport")', () => {
  // Reference values worked by hand from the printed formulas (n in cm⁻³, T in eV):
  //   lnΛ_ei = 23 − ln(n_e^½ Z T_e^−3/2) for T_e ≤ 10 Z² eV, 24 − ln(n_e^½ T_e^−1) above;
  //   lnΛ_ii = 23 − ln[(Z²/T_i)(2 n_i Z²/T_i)^½] for like ions.
  // The formulas are from memory in the issue text and were re-read against the Formulary's
  // collision section (FROM MEMORY: no stored copy of that page was available to this test).
  it.each([
    // n_e [m⁻³], T_e [eV], Z, expected, branch
    [1e19, 10, 1, 11.487074535029771, 'T_e ≤ 10 Z² eV'],
    [1e18, 3, 1, 10.832407875037891, 'T_e ≤ 10 Z² eV'],
    [4e20, 30, 2, 10.597406060415022, 'T_e ≤ 10 Z² eV (Z = 2 moves the boundary to 40 eV)'],
    [1e19, 100, 1, 13.638367081526795, 'T_e > 10 Z² eV'],
    [1e20, 2000, 1, 15.482806808583762, 'T_e > 10 Z² eV'],
  ])('lnΛ_ei at n_e = %s m⁻³, T_e = %s eV, Z = %s is %s (%s)', (n, Te, Z, expected) => {
    expect(rel(out({ n_m3: n, Te_eV: Te, Z }).lnLambda_ei!, expected)).toBeLessThan(1e-13);
  });

  it.each([
    // n_e [m⁻³] (n_i = n_e/Z), T_i [eV], Z, expected lnΛ_ii
    [1e19, 10, 1, 11.1405009447498],
    [5e17, 0.1, 1, 5.730611802544658],
    [2e20, 1000, 2, 14.817522135555077], // n_i = 1e20 m⁻³
  ])('lnΛ_ii at n_e = %s m⁻³, T_i = %s eV, Z = %s is %s', (n, Ti, Z, expected) => {
    expect(rel(out({ n_m3: n, Ti_eV: Ti, Z }).lnLambda_ii!, expected)).toBeLessThan(1e-13);
  });

  it('the electron–ion branches meet within a fraction of a unit at T_e = 10 Z² eV', () => {
    // Common practice: the two NRL branches differ by 1 − ln(10^½) ≈ −0.151 at the boundary.
    for (const Z of [1, 2, 3]) {
      const at = out({ Te_eV: 10 * Z * Z, Z }).lnLambda_ei!;
      const above = out({ Te_eV: 10 * Z * Z * (1 + 1e-12), Z }).lnLambda_ei!;
      expect(above - at).toBeCloseTo(1 - 0.5 * Math.log(10), 9);
    }
  });
});

describe('collision rates against the NRL Plasma Formulary', () => {
  // ν_e = 2.91e-6 n_e lnΛ T_e^−3/2 s⁻¹ and ν_i = 4.80e-8 Z⁴ μ^−½ n_i lnΛ T_i^−3/2 s⁻¹ (NRL Plasma
  // Formulary, "Fundamental Plasma Parameters"; FROM MEMORY, reproduced to 3 s.f. from Braginskii's
  // 1/τ_e and 1/τ_i with CODATA 2018: tests/reference/physics/nrl_coefficients_check.csv).
  const coeff = (needle: string): [number, number] => [
    referenceValue(nrl, 'quantity', needle, 'coeff_from_CODATA2018'),
    referenceValue(nrl, 'quantity', needle, 'NRL_published_3sf'),
  ];
  const [nuECodata, nuEPrinted] = coeff('electron collision rate');
  const [nuICodata, nuIPrinted] = coeff('ion collision rate');

  it.each([
    [1e19, 10, 1], // lower lnΛ branch
    [3e17, 2, 1],
    [1e20, 500, 1], // upper lnΛ branch
    [2e21, 5000, 3],
  ])('ν_ei at n_e = %s m⁻³, T_e = %s eV, Z = %s', (n, Te, Z) => {
    const o = out({ n_m3: n, Te_eV: Te, Z });
    const base = n * 1e-6 * o.lnLambda_ei! * Te ** -1.5;
    expect(rel(o.nu_ei_s!, nuECodata * base)).toBeLessThan(2e-6);
    expect(rel(o.nu_ei_s!, nuEPrinted * base)).toBeLessThan(5e-3);
  });

  it.each([
    [1e19, 10, 1, 2],
    [1e18, 0.05, 1, 39.6594],
    [4e20, 800, 2, 2],
    [1e19, 3000, 1, 1], // T_i above 10 eV as well as below: ν_ii has one formula
  ])('ν_ii at n_e = %s m⁻³, T_i = %s eV, Z = %s, μ = %s', (n, Ti, Z, mu) => {
    const o = out({ n_m3: n, Ti_eV: Ti, Z, mu });
    const base = Z ** 4 * mu ** -0.5 * (n / Z) * 1e-6 * o.lnLambda_ii! * Ti ** -1.5;
    expect(rel(o.nu_ii_s!, nuICodata * base)).toBeLessThan(2e-6);
    expect(rel(o.nu_ii_s!, nuIPrinted * base)).toBeLessThan(5e-3);
  });

  it('neutral rates are n_n σ v̄ with v̄ = sqrt(8 e (T_j/m_j + T_n/m_n)/π) (kinetic theory, common practice)', () => {
    const p = { nn_m3: 2.4e20, Tn_eV: 0.03, Ti_eV: 0.2, Te_eV: 3, mu: 39.6594, sigma_in_m2: 8e-19, sigma_en_m2: 2e-20 };
    const o = out(p);
    const mi = p.mu * PROTON_MASS;
    const vin = Math.sqrt(((8 * E) / Math.PI) * (p.Ti_eV / mi + p.Tn_eV / mi));
    const ven = Math.sqrt(((8 * E) / Math.PI) * (p.Te_eV / ELECTRON_MASS + p.Tn_eV / mi));
    expect(rel(o.nu_in_s!, p.nn_m3 * p.sigma_in_m2 * vin)).toBeLessThan(1e-14);
    expect(rel(o.nu_en_s!, p.nn_m3 * p.sigma_en_m2 * ven)).toBeLessThan(1e-14);
    expect(o.nu_e_s).toBe(o.nu_ei_s! + o.nu_en_s!);
    expect(o.nu_i_s).toBe(o.nu_in_s);
    expect(o.nu_over_omega_i).toBe(o.nu_in_s! / o.omega_ci!);
  });

  it('D_Bohm = 6.25e6 T B⁻¹ cm²/s (NRL Plasma Formulary, from memory; exactly c k T/(16 e B))', () => {
    const o = out({ Te_eV: 7, B_T: 0.3 });
    // 6.25e6 cm²/s × T[eV]/B[G] = 6.25e2 m²/s × T/(1e4 B_T)
    expect(rel(o.D_Bohm_m2s!, (6.25e2 * 7) / (1e4 * 0.3))).toBeLessThan(1e-15);
  });
});

describe('ρ_s is the drift-wave sound gyroradius c_s0/ω_ci', () => {
  it('matches 9.79e5 (Z T_e/μ)^½ cm/s over 9.58e3 Z μ⁻¹ B[G] rad/s whatever T_i and γ', () => {
    // ρ_s = c_s/ω_ci with c_s = (Z T_e/m_i)^½ (W. Horton, Rev. Mod. Phys. 71, 735 (1999), §II;
    // FROM MEMORY). NRL C_s at γ = 1 and ω_ci coefficients: nrl_coefficients_check.csv.
    const cs = referenceValue(nrl, 'quantity', 'ion sound speed', 'coeff_from_CODATA2018');
    const wci = referenceValue(nrl, 'quantity', 'ion gyrofrequency', 'coeff_from_CODATA2018');
    for (const [Te, Ti, Z, mu, B, ge, gi] of [
      [10, 10, 1, 2, 0.5, 1, 1],
      [3, 0.05, 1, 39.6594, 0.1, 5 / 3, 3],
      [200, 400, 2, 4, 2, 1, 5 / 3],
    ] as const) {
      const o = out({ Te_eV: Te, Ti_eV: Ti, Z, mu, B_T: B, gamma_e: ge, gamma_i: gi });
      const expected = (1e-2 * cs * Math.sqrt((Z * Te) / mu)) / ((wci * Z * 1e4 * B) / mu);
      expect(rel(o.rho_s_m!, expected)).toBeLessThan(2e-6);
    }
  });
});

/**
 * The friction balance 0 = q(E + v×B) − ∇p/n − m ν v for (v_r, v_θ) as a 2×2 system, solved by
 * mathjs's LU solver. B along +z, v×B = (v_θ B, −v_r B), −∇p/n = +e γ T/L_n r̂ (density falls
 * outward):  r: −mν v_r + qB v_θ = −(q E_r + e γ T/L_n);  θ: −qB v_r − mν v_θ = 0.
 * Both rows are divided by |q|B so that the LU pivots are of order one (mathjs treats pivots
 * below its epsilon as zero).
 */
function solveFriction(
  q: number,
  m: number,
  nu: number,
  B: number,
  Er: number,
  gammaT_over_Ln: number,
): [number, number] {
  const s = Math.abs(q) * B;
  const A = [
    [(-m * nu) / s, (q * B) / s],
    [(-q * B) / s, (-m * nu) / s],
  ];
  const b = [[-(q * Er + E * gammaT_over_Ln) / s], [0]];
  const x = lusolve(A, b) as number[][];
  return [x[0]![0]!, x[1]![0]!];
}

describe('collisional drifts against an independent solution of the momentum balance', () => {
  const point = fc.record({
    Te_eV: fc.double({ min: 0.5, max: 500, noNaN: true }),
    Ti_eV: fc.double({ min: 0.02, max: 200, noNaN: true }),
    B_T: fc.double({ min: 0.005, max: 5, noNaN: true }),
    n_m3: fc.double({ min: 1e15, max: 1e21, noNaN: true }),
    Ln_m: fc.double({ min: 1e-3, max: 1, noNaN: true }),
    gamma_e: fc.double({ min: 1, max: 3, noNaN: true }),
    gamma_i: fc.double({ min: 1, max: 3, noNaN: true }),
    Er_Vm: fc.double({ min: -1e4, max: 1e4, noNaN: true }),
    mu: fc.double({ min: 1, max: 200, noNaN: true }),
    Z: fc.integer({ min: 1, max: 4 }),
    nn_m3: fc.double({ min: 1e16, max: 1e24, noNaN: true }),
    sigma_in_m2: fc.double({ min: 1e-20, max: 1e-17, noNaN: true }),
    sigma_en_m2: fc.double({ min: 1e-21, max: 1e-18, noNaN: true }),
  });

  it('(v_r, v_θ) of both species equal the lusolve solution (Chen, diffusion across B: the same equations)', () => {
    fc.assert(
      fc.property(point, (p) => {
        const o = out(p);
        const mi = p.mu * PROTON_MASS;
        const [vrE, vthE] = solveFriction(-E, ELECTRON_MASS, o.nu_e_s!, p.B_T, p.Er_Vm, (p.gamma_e * p.Te_eV) / p.Ln_m);
        const [vrI, vthI] = solveFriction(p.Z * E, mi, o.nu_i_s!, p.B_T, p.Er_Vm, (p.gamma_i * p.Ti_eV) / p.Ln_m);
        const scaleE = Math.abs(vrE) + Math.abs(vthE);
        const scaleI = Math.abs(vrI) + Math.abs(vthI);
        expect(Math.abs(o.vr_e_ms! - vrE)).toBeLessThanOrEqual(1e-9 * scaleE);
        expect(Math.abs(o.vTheta_e_ms! - vthE)).toBeLessThanOrEqual(1e-9 * scaleE);
        expect(Math.abs(o.vr_i_ms! - vrI)).toBeLessThanOrEqual(1e-9 * scaleI);
        expect(Math.abs(o.vTheta_i_ms! - vthI)).toBeLessThanOrEqual(1e-9 * scaleI);
      }),
    );
  });

  it('ν ≪ ω_c recovers the collisionless drifts to 1e-12 (Chen: the magnetised limit)', () => {
    fc.assert(
      fc.property(point, (p) => {
        // No neutrals and a thin plasma in a strong field: ν/ω_c ≤ 1e-7 for both species.
        const o = out({ ...p, nn_m3: 0, n_m3: 1e14, B_T: 2 + p.B_T });
        expect(o.nu_over_omega_e!).toBeLessThan(1e-7);
        expect(o.nu_i_s).toBe(0);
        const e0 = o.vE_ms! + o.vDe_ms!;
        const i0 = o.vE_ms! + o.vDi_ms!;
        expect(Math.abs(o.vTheta_e_ms! - e0)).toBeLessThanOrEqual(1e-12 * Math.abs(e0));
        expect(Math.abs(o.vTheta_i_ms! - i0)).toBeLessThanOrEqual(1e-12 * Math.abs(i0));
        expect(Math.abs(o.vr_e_ms!)).toBeLessThanOrEqual(1e-6 * Math.abs(e0));
        expect(Math.abs(o.vr_i_ms!)).toBe(0);
        expect(o.vTheta_i_ratio).toBe(1);
      }),
    );
  });

  it('ν ≫ ω_c gives pure mobility and diffusion: v_r = ±(|q|/(mν)) E_r + γ (e T/(mν))/L_n (Chen, unmagnetised limit)', () => {
    fc.assert(
      fc.property(point, (p) => {
        // Dense neutrals, weak field: ν_i/ω_ci ≥ 1e4, so the 1/(1 + ω²/ν²) corrections are ≤ 1e-8.
        const o = out({ ...p, nn_m3: 1e26, sigma_in_m2: 1e-17, B_T: 1e-3, mu: ARGON_MU });
        expect(o.nu_over_omega_i!).toBeGreaterThan(1e4);
        const mi = ARGON_MU * PROTON_MASS;
        const mob = (p.Z * E) / (mi * o.nu_i_s!);
        const D = (E * p.Ti_eV) / (mi * o.nu_i_s!);
        const expected = mob * p.Er_Vm + (p.gamma_i * D) / p.Ln_m;
        const scale = Math.abs(mob * p.Er_Vm) + Math.abs((p.gamma_i * D) / p.Ln_m);
        expect(Math.abs(o.vr_i_ms! - expected)).toBeLessThanOrEqual(1e-7 * scale);
        // The azimuthal drift is suppressed by ω²/ν².
        expect(Math.abs(o.vTheta_i_ms!)).toBeLessThanOrEqual(
          1.0000001 * Math.abs(o.vE_ms! + o.vDi_ms!) * o.nu_over_omega_i! ** -2,
        );
        expect(rel(o.vTheta_i_ratio!, 1 / (1 + o.nu_over_omega_i! ** 2))).toBeLessThan(1e-15);
      }),
    );
  });
});

describe('validity flags of version 2 (each invalidates the point)', () => {
  it('unmagnetised_ions where ν_i/ω_ci ≥ 1, and the threshold moves it', () => {
    // An argon column at 1 Pa and 300 K (n_n = p/(k_B T) ≈ 2.4e20 m⁻³) in 0.05 T: ν_in ≈ 1e5 s⁻¹
    // against ω_ci ≈ 1.2e5 rad/s (the situation the demo sweep maps).
    const base = { mu: 39.6594, Ti_eV: 0.1, Te_eV: 3, n_m3: 1e17, Ln_m: 0.05, B_T: 0.02, nn_m3: 2.4e20 };
    const r = run(base);
    expect(r.outputs.nu_over_omega_i as number).toBeGreaterThan(1);
    expect(r.flags).toContain('unmagnetised_ions');
    expect(r.outputs.valid).toBe(false);
    const strong = run({ ...base, B_T: 0.5 });
    expect(strong.outputs.nu_over_omega_i as number).toBeLessThan(1);
    expect(strong.flags).not.toContain('unmagnetised_ions');
    const loose = run(base, { nu_over_omega_i_max: 1e3 });
    expect(loose.flags).not.toContain('unmagnetised_ions');
  });

  it('unmagnetised_electrons in a dense, cold, weakly magnetised plasma', () => {
    const r = run({ n_m3: 1e23, Te_eV: 1, Ti_eV: 1, B_T: 0.01, Ln_m: 10 });
    expect(r.outputs.nu_over_omega_e as number).toBeGreaterThanOrEqual(1);
    expect(r.flags).toContain('unmagnetised_electrons');
    expect(r.outputs.valid).toBe(false);
  });

  it('relativistic when |v_E|/c or v_te/c ≥ 0.1 (common practice)', () => {
    // E_r = 1e9 V/m at 1 T: |v_E| = 1e9 m/s = 3.3 c.
    const fast = run({ Er_Vm: 1e9, B_T: 1 });
    expect(fast.outputs.v_over_c as number).toBeCloseTo(1e9 / SPEED_OF_LIGHT, 12);
    expect(fast.flags).toContain('relativistic');
    expect(fast.outputs.valid).toBe(false);
    // T_e = 1 MeV: v_te = 4.19e8 m/s > c (NRL 4.19e7 T^½ cm/s).
    const hot = run({ Te_eV: 1e6, Ti_eV: 1, B_T: 50, Ln_m: 1e6 });
    expect(hot.flags).toContain('relativistic');
    // Just under the threshold no flag: v_te/c = 0.09.
    const te = (0.09 * SPEED_OF_LIGHT) ** 2 * (ELECTRON_MASS / E);
    expect(run({ Te_eV: te, Ti_eV: 1, B_T: 50, Ln_m: 1e6 }).flags).not.toContain('relativistic');
  });

  it('rho_s_over_Ln when ρ_s/L_n ≥ 0.1 (common practice), e.g. the 0.58 of a cold-ion point', () => {
    const r = run({ Te_eV: 20, Ti_eV: 0.01, mu: 39.6594, B_T: 0.05, Ln_m: 0.02 });
    expect(r.outputs.rho_s_over_Ln as number).toBeGreaterThan(0.1);
    expect(r.outputs.rho_i_over_Ln as number).toBeLessThan(0.1);
    expect(r.flags).toEqual(['rho_s_over_Ln']);
    expect(r.outputs.valid).toBe(false);
  });

  it('new flag bits fit the stored 32-bit mask and do not collide', () => {
    const bits = crossField.flags.map((f) => f.bit);
    expect(new Set(bits).size).toBe(bits.length);
    expect(Math.max(...bits)).toBeLessThan(31);
    expect(crossField.version).toBe('2.0.0');
  });
});

describe('evaluateChunk with collisions', () => {
  it('equals evaluate point by point, including neutrals and every flag', () => {
    const n = 400;
    let seed = 777;
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const ranges: Record<string, [number, number]> = {
      nn_m3: [1e14, 1e25],
      sigma_in_m2: [1e-20, 1e-17],
      sigma_en_m2: [1e-21, 1e-18],
      Tn_eV: [0.01, 1],
      Er_Vm: [1, 1e9],
      n_m3: [1e12, 1e24],
    };
    const cols: Record<string, Float64Array> = {};
    for (const spec of crossField.inputs) {
      const [lo, hi] = ranges[spec.name] ?? [spec.min > 0 ? spec.min : 1e-3, Math.min(spec.max, 1e3)];
      const col = new Float64Array(n);
      for (let k = 0; k < n; k++) col[k] = lo * (hi / lo) ** rnd() * (spec.name === 'Er_Vm' && k % 2 ? -1 : 1);
      cols[spec.name] = col;
    }
    const chunk = allocateChunk(crossField, n);
    crossField.evaluateChunk(cols, n, chunk);
    const seen = new Set<string>();
    for (let k = 0; k < n; k++) {
      const r = crossField.evaluate(Object.fromEntries(crossField.inputs.map((s) => [s.name, cols[s.name]![k]!])));
      for (const o of crossField.outputs) {
        const v = chunk.columns[o.name]![k]!;
        expect(o.kind === 'boolean' ? v === 1 : v).toBe(r.outputs[o.name]);
      }
      const codes = crossField.flags.filter((f) => chunk.flags[k]! & (1 << f.bit)).map((f) => f.code);
      expect(codes).toEqual(r.flags);
      codes.forEach((c) => seen.add(c));
    }
    // The random points reach every flag, so the comparison covers every branch of the mask.
    expect([...seen].sort()).toEqual(crossField.flags.map((f) => f.code).sort());
  });
});
