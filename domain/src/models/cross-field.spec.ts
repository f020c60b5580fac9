import fc from 'fast-check';

// A fixed seed: the same cases on every run, so a failure can be replayed.
fc.configureGlobal({ seed: 20261201 });
import { describe, expect, it } from 'vitest';
import { ELEMENTARY_CHARGE as E, VACUUM_PERMEABILITY as MU0 } from '../constants.js';
import { crossField } from './cross-field.js';
import { allocateChunk } from './registry.js';
import { resolveInputs } from './validate.js';
import { readReferenceCsv, referenceValue } from './reference-csv.js';

const nrl = readReferenceCsv('nrl_coefficients_check.csv');
const checks = readReferenceCsv('derived_check_values.csv');
const defaults = Object.fromEntries(crossField.inputs.map((i) => [i.name, i.default]));
const run = (over: Record<string, number>) => crossField.evaluate({ ...defaults, ...over });
const num = (over: Record<string, number>, key: string) => run(over).outputs[key] as number;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

/** NRL coefficient row: [CODATA-2018 recomputation, published 3 s.f. value]. */
function coeff(needle: string): [number, number] {
  return [
    referenceValue(nrl, 'quantity', needle, 'coeff_from_CODATA2018'),
    referenceValue(nrl, 'quantity', needle, 'NRL_published_3sf'),
  ];
}

/** Compare with the CODATA recomputation (7 s.f. in the file) and the printed 3 s.f. value. */
function expectNrl(actual: number, [codata, printed]: [number, number], factor: number): void {
  expect(rel(actual, codata * factor)).toBeLessThan(2e-6);
  expect(rel(actual, printed * factor)).toBeLessThan(5e-3);
}

describe('cross-field against the NRL Plasma Formulary (converted to SI)', () => {
  // Source: NRL Plasma Formulary, "Fundamental Plasma Parameters" (cgs, T in eV, B in gauss, n in
  // cm^-3); coefficients in tests/reference/physics/nrl_coefficients_check.csv. SI: B_G = 1e4 B_T,
  // lengths ×1e-2, n_cm3 = 1e-6 n_m3.
  const points = [
    { Te_eV: 10, Ti_eV: 3, B_T: 0.5, n_m3: 1e19, mu: 2, Z: 1 },
    { Te_eV: 250, Ti_eV: 800, B_T: 3.2, n_m3: 4e20, mu: 39.66, Z: 3 },
    { Te_eV: 0.7, Ti_eV: 0.05, B_T: 0.02, n_m3: 2e16, mu: 1, Z: 1 },
  ];
  it.each(points)('gyrofrequencies, thermal speeds, gyroradii, Debye length at %o', (p) => {
    const o = run({ ...p, gamma_e: 1, gamma_i: 1 }).outputs as Record<string, number>;
    const sqrtTe = Math.sqrt(p.Te_eV),
      sqrtTi = Math.sqrt(p.Ti_eV);
    expectNrl(o.omega_ce!, coeff('electron gyrofrequency'), 1e4 * p.B_T); // 1.76e7 B[G] rad/s (CONFIRMED secondary)
    expectNrl(o.omega_ci!, coeff('ion gyrofrequency'), (1e4 * p.Z * p.B_T) / p.mu); // 9.58e3 Z μ⁻¹ B (CONFIRMED secondary)
    expectNrl(o.vte_ms!, coeff('electron thermal velocity'), 1e-2 * sqrtTe); // 4.19e7 T^½ cm/s (CONFIRMED secondary)
    expectNrl(o.vti_ms!, coeff('ion thermal velocity'), (1e-2 * sqrtTi) / Math.sqrt(p.mu)); // 9.79e5 μ^-½ T^½ cm/s
    expectNrl(o.rho_e_m!, coeff('electron gyroradius'), (1e-2 * sqrtTe) / (1e4 * p.B_T)); // 2.38 T^½ B⁻¹ cm
    expectNrl(o.rho_i_m!, coeff('ion gyroradius'), (1e-2 * Math.sqrt(p.mu) * sqrtTi) / (p.Z * 1e4 * p.B_T)); // 1.02e2 (FROM MEMORY, reproduced)
    expectNrl(o.lambdaD_m!, coeff('Debye length'), (1e-2 * sqrtTe) / Math.sqrt(1e-6 * p.n_m3)); // 7.43e2 T^½ n^-½ cm (CONFIRMED secondary)
  });

  it('ion sound speed matches C_s = 9.79e5 (γ Z T_e/μ)^½ cm/s for cold ions', () => {
    // NRL C_s has no ion-temperature term; T_i → 1e-12 T_e makes ours reduce to it (to 1e-12).
    for (const [Te, g, Z, mu] of [
      [10, 1, 1, 2],
      [50, 5 / 3, 2, 4],
      [3, 3, 1, 39.66],
    ] as const) {
      const cs = num({ Te_eV: Te, Ti_eV: Te * 1e-12, gamma_e: g, Z, mu }, 'cs_ms');
      expectNrl(cs, coeff('ion sound speed'), 1e-2 * Math.sqrt((g * Z * Te) / mu));
    }
  });

  it('beta matches 4.03e-11 n T B⁻² per species', () => {
    // NRL β = 8πnkT/B² (one species, FROM MEMORY, reproduced): SI 4.03e-11 × 1e-6 / 1e8 n_m3 T B_T⁻².
    const beta = num({ n_m3: 3e19, Te_eV: 40, Ti_eV: 40 * 1e-12, B_T: 1.3 }, 'beta');
    expectNrl(beta, coeff('beta'), (1e-14 * 3e19 * 40) / 1.3 ** 2);
  });
});

describe('cross-field textbook facts', () => {
  it('reproduces the drift check values', () => {
    // DERIVED check values (tests/reference/physics/derived_check_values.csv): |v_D| = γT/(B L_n), |v_E| = E/B.
    const v = (needle: string) => referenceValue(checks, 'quantity', needle, 'value');
    expect(
      rel(
        num({ Te_eV: 10, Ti_eV: 10, B_T: 0.1, Ln_m: 0.01, gamma_e: 1 }, 'vDe_ms'),
        v('T=10 eV, B=0.1 T, L_n=0.01 m, gamma=1'),
      ),
    ).toBeLessThan(1e-12);
    expect(rel(-num({ Ti_eV: 10, B_T: 0.1, Ln_m: 0.01, gamma_i: 5 / 3 }, 'vDi_ms'), v('gamma=1.667'))).toBeLessThan(
      1e-7,
    ); // the file's 16666.667 is γ = 5/3
    expect(rel(num({ Te_eV: 50, B_T: 2, Ln_m: 0.02 }, 'vDe_ms'), v('T=50 eV'))).toBeLessThan(1e-12);
    expect(rel(-num({ Ti_eV: 3, B_T: 0.05, Ln_m: 0.03 }, 'vDi_ms'), v('T=3 eV'))).toBeLessThan(1e-12);
    expect(rel(Math.abs(num({ Er_Vm: 1e3, B_T: 0.1 }, 'vE_ms')), v('|v_E|'))).toBeLessThan(1e-12);
  });

  it('E×B drift does not depend on charge, mass or temperature', () => {
    // Guiding-centre theory: v_E = E×B/B², independent of q and m (CONFIRMED, see README).
    fc.assert(
      fc.property(
        // Subnormal fields (|E_r| < 1e-300 V/m) are not physical and lose the relative precision checked below.
        fc.double({ min: -1e5, max: 1e5, noNaN: true }).filter((x) => x === 0 || Math.abs(x) > 1e-300),
        fc.double({ min: 0.01, max: 10, noNaN: true }),
        fc.double({ min: 1, max: 200, noNaN: true }),
        fc.double({ min: 1, max: 20, noNaN: true }),
        fc.double({ min: 0.1, max: 1e4, noNaN: true }),
        (Er, B, mu, Z, T) => {
          const a = num({ Er_Vm: Er, B_T: B, mu: 1, Z: 1, Te_eV: 10, Ti_eV: 10 }, 'vE_ms');
          const b = num({ Er_Vm: Er, B_T: B, mu, Z, Te_eV: T, Ti_eV: T / 3 }, 'vE_ms');
          expect(b).toBe(a);
          expect(Math.abs(a + Er / B)).toBeLessThanOrEqual(1e-15 * Math.abs(Er / B));
        },
      ),
    );
  });

  it('electron and ion diamagnetic drifts are opposite; the current lowers the field inside', () => {
    // Chen §3.5 (FROM MEMORY): v_D = −∇p×B/(qnB²) changes sign with q. Fitzpatrick, "Drift
    // Equations" (CONFIRMED): the diamagnetic current reduces the field inside the plasma.
    fc.assert(
      fc.property(
        fc.double({ min: 0.1, max: 1e4, noNaN: true }),
        fc.double({ min: 0.1, max: 1e4, noNaN: true }),
        fc.double({ min: 0.05, max: 10, noNaN: true }),
        fc.double({ min: 1e15, max: 1e21, noNaN: true }),
        (Te, Ti, B, n) => {
          const o = run({ Te_eV: Te, Ti_eV: Ti, B_T: B, n_m3: n }).outputs as Record<string, number>;
          expect(o.vDe_ms).toBeGreaterThan(0);
          expect(o.vDi_ms).toBeLessThan(0);
          expect(o.jTheta_Am2).toBeLessThan(0);
          expect(o.dB_over_B).toBeLessThan(0);
        },
      ),
    );
  });

  it('pressure balance: B/B0 = sqrt(1 − β0) at the check values', () => {
    // DERIVED from p + B²/2μ0 = B0²/2μ0 (Chen §5.8, FROM MEMORY); values in derived_check_values.csv.
    for (const beta of [0.01, 0.1, 0.5]) {
      const expected = referenceValue(checks, 'quantity', `beta0=2mu0 p/B0^2=${beta}`, 'value');
      const B = 0.4,
        Te = 20;
      const n = (beta * B * B) / (2 * MU0 * E * Te);
      const o = run({ B_T: B, Te_eV: Te, Ti_eV: Te * 1e-12, n_m3: n }).outputs as Record<string, number>;
      expect(o.beta).toBeCloseTo(beta, 9);
      expect(1 + o.dB_over_B!).toBeCloseTo(expected, 7);
    }
    // n = 1e18 m^-3, kT = 10 eV, B0 = 0.1 T → β0 = 4.0267091e-4 (one species).
    const b = num({ n_m3: 1e18, Te_eV: 10, Ti_eV: 1e-11, B_T: 0.1 }, 'beta');
    expect(rel(b, referenceValue(checks, 'quantity', 'beta0 for above', 'value'))).toBeLessThan(1e-7);
  });

  it('flags the drift ordering at ρ_i/L_n ≥ 0.1, λ_D/L_n ≥ 0.1 and β ≥ 1 (common practice)', () => {
    const ok = run({});
    expect(ok.flags).toEqual([]);
    expect(ok.outputs.valid).toBe(true);
    const hot = run({ Ti_eV: 2000, B_T: 0.1 });
    expect(hot.outputs.rho_i_over_Ln as number).toBeGreaterThanOrEqual(0.1);
    expect(hot.flags).toContain('rho_i_over_Ln');
    expect(hot.outputs.valid).toBe(false);
    const thin = run({ n_m3: 1e12, Ln_m: 0.001 });
    expect(thin.flags).toContain('lambdaD_over_Ln');
    const dense = run({ n_m3: 1e23, B_T: 0.1 });
    expect(dense.flags).toContain('beta');
    expect(dense.outputs.dB_over_B).toBe(-1);
    // A sweep may move the threshold.
    const strict = crossField.evaluate(defaults, { rho_i_over_Ln_max: 0.01 });
    expect(strict.flags).toEqual(['rho_i_over_Ln']);
  });
});

describe('cross-field in the solar wind (unit strings end to end)', () => {
  it('reproduces the normalised space-plasma values', () => {
    // n = 1 cm^-3, T = 1e5 K, B = 1 nT, protons: DERIVED values in derived_check_values.csv, agreeing
    // with the Finnish Meteorological Institute reference table (CONFIRMED to 2 s.f.: 300 km, 7.0 km,
    // 22 m, 15 mHz, 3.5).
    const v = (needle: string) => referenceValue(checks, 'quantity', needle, 'value');
    const asIon = crossField.evaluate(
      resolveInputs(crossField, {
        n_m3: '1 cm^-3',
        Te_eV: '1e5 K',
        Ti_eV: '1e5 K',
        B_T: '1 nT',
        mu: 1,
        Z: 1,
        Ln_m: '1e11 m',
      }),
    ).outputs as Record<string, number>;
    expect(rel(asIon.rho_i_m! / 1e3, v('proton thermal gyroradius'))).toBeLessThan(1e-7);
    expect(rel(asIon.rho_e_m! / 1e3, v('electron thermal gyroradius'))).toBeLessThan(1e-7);
    expect(rel(asIon.lambdaD_m!, v('Debye length n=1cm^-3'))).toBeLessThan(1e-7);
    expect(rel((asIon.omega_ci! / (2 * Math.PI)) * 1e3, v('proton cyclotron freq'))).toBeLessThan(1e-7);
    expect(rel(asIon.omega_ce! / (2 * Math.PI), v('electron cyclotron freq'))).toBeLessThan(1e-7);
    // β per species: the model sums both, so with T_i = T_e it is twice the tabulated value.
    expect(rel(asIon.beta! / 2, v('beta per species'))).toBeLessThan(1e-7);
  });
});

describe('cross-field scaling properties (fast-check)', () => {
  const point = fc.record({
    Te_eV: fc.double({ min: 0.1, max: 1e4, noNaN: true }),
    Ti_eV: fc.double({ min: 0.1, max: 1e4, noNaN: true }),
    B_T: fc.double({ min: 0.01, max: 10, noNaN: true }),
    n_m3: fc.double({ min: 1e14, max: 1e22, noNaN: true }),
    Ln_m: fc.double({ min: 1e-3, max: 10, noNaN: true }),
    gamma_e: fc.double({ min: 0.5, max: 3, noNaN: true }),
    gamma_i: fc.double({ min: 0.5, max: 3, noNaN: true }),
    Er_Vm: fc.double({ min: -1e5, max: 1e5, noNaN: true }),
    mu: fc.double({ min: 1, max: 200, noNaN: true }),
    Z: fc.double({ min: 1, max: 10, noNaN: true }),
  });
  const factor = fc.double({ min: 0.25, max: 4, noNaN: true });

  it('v_D ∝ γ T/(Z B L_n)', () => {
    // Diamagnetic drift |v_D| = γ kT/(|q| B L_n) (Chen §3.5, FROM MEMORY; DERIVED form in README).
    fc.assert(
      fc.property(point, factor, (p, f) => {
        const a = run(p).outputs as Record<string, number>;
        for (const [key, exp] of [
          ['Ti_eV', 1],
          ['gamma_i', 1],
          ['Z', -1],
          ['B_T', -1],
          ['Ln_m', -1],
        ] as const) {
          const b = run({ ...p, [key]: p[key] * f }).outputs as Record<string, number>;
          expect(rel(b.vDi_ms!, a.vDi_ms! * f ** exp)).toBeLessThan(1e-12);
        }
        for (const [key, exp] of [
          ['Te_eV', 1],
          ['gamma_e', 1],
          ['B_T', -1],
          ['Ln_m', -1],
        ] as const) {
          const b = run({ ...p, [key]: p[key] * f }).outputs as Record<string, number>;
          expect(rel(b.vDe_ms!, a.vDe_ms! * f ** exp)).toBeLessThan(1e-12);
        }
        // Independent of n, μ and E_r.
        const c = run({ ...p, n_m3: p.n_m3 * f, mu: p.mu * f, Er_Vm: -p.Er_Vm }).outputs as Record<string, number>;
        expect(rel(c.vDi_ms!, a.vDi_ms!)).toBeLessThan(1e-14);
      }),
    );
  });

  it('j_θ = −|∇p|/B with ∇p = γ_e T_e ∇n + γ_i T_i ∇n_i', () => {
    // j×B = ∇p for a static magnetised fluid (Chen §5.8, FROM MEMORY); |∇n| = n/L_n, n_i = n/Z.
    fc.assert(
      fc.property(point, (p) => {
        const gradP = (E * (p.gamma_e * p.Te_eV * p.n_m3 + (p.gamma_i * p.Ti_eV * p.n_m3) / p.Z)) / p.Ln_m;
        expect(rel(num(p, 'jTheta_Am2'), -gradP / p.B_T)).toBeLessThan(1e-12);
      }),
    );
  });

  it('ρ_i ∝ sqrt(T_i m_i)/(Z B) and ρ_e ∝ sqrt(T_e)/B', () => {
    // ρ = v_t/ω_c = sqrt(kT m)/(|q| B) (NRL convention, see README).
    fc.assert(
      fc.property(point, factor, (p, f) => {
        const a = run(p).outputs as Record<string, number>;
        for (const [key, exp] of [
          ['Ti_eV', 0.5],
          ['mu', 0.5],
          ['Z', -1],
          ['B_T', -1],
        ] as const) {
          const b = run({ ...p, [key]: p[key] * f }).outputs as Record<string, number>;
          expect(rel(b.rho_i_m!, a.rho_i_m! * f ** exp)).toBeLessThan(1e-12);
        }
        const e = run({ ...p, Te_eV: p.Te_eV * f, mu: p.mu * f }).outputs as Record<string, number>;
        expect(rel(e.rho_e_m!, a.rho_e_m! * Math.sqrt(f))).toBeLessThan(1e-12);
        // |v_Di|/v_ti = γ_i ρ_i/L_n.
        expect(rel(a.vDi_over_vti!, (p.gamma_i * a.rho_i_m!) / p.Ln_m)).toBeLessThan(1e-12);
      }),
    );
  });
});

describe('cross-field evaluateChunk', () => {
  it('equals evaluate point by point (bit for bit)', () => {
    const n = 300;
    let seed = 12345;
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const cols: Record<string, Float64Array> = {};
    for (const spec of crossField.inputs) {
      const col = new Float64Array(n);
      for (let k = 0; k < n; k++) {
        const lo = spec.min > 0 ? spec.min : spec.name === 'Er_Vm' ? -1e4 : 1e-3;
        const hi = Math.min(spec.max, spec.name === 'n_m3' ? 1e24 : spec.name === 'Er_Vm' ? 1e4 : 1e3);
        col[k] = spec.name === 'Er_Vm' ? lo + (hi - lo) * rnd() : lo * (hi / lo) ** rnd();
      }
      cols[spec.name] = col;
    }
    const out = allocateChunk(crossField, n);
    crossField.evaluateChunk(cols, n, out);
    let flagged = 0;
    for (let k = 0; k < n; k++) {
      const point = Object.fromEntries(crossField.inputs.map((s) => [s.name, cols[s.name]![k]!]));
      const r = crossField.evaluate(point);
      for (const o of crossField.outputs) {
        const v = out.columns[o.name]![k]!;
        expect(o.kind === 'boolean' ? v === 1 : v).toBe(r.outputs[o.name]);
      }
      const codes = crossField.flags.filter((f) => out.flags[k]! & (1 << f.bit)).map((f) => f.code);
      expect(codes).toEqual(r.flags);
      if (codes.length) flagged++;
    }
    expect(flagged).toBeGreaterThan(0); // the sample covers flagged points too
  });
});
