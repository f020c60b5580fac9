import { describe, expect, it } from 'vitest';
import { ELEMENTARY_CHARGE, PROTON_MASS } from '../constants.js';
import { fitModel } from './fit-model.js';
import { retardationRegion } from './probe/region.js';
import type { FitResult } from './types.js';

/**
 * Probe characteristics on seeded synthetic traces (invented argon-column scenario). Physics:
 * single probe I = I_is·(exp((V − V_f)/Te) − 1) below the plasma potential, electron saturation above;
 * double probe I = I_is·tanh(V/(2Te)); Bohm flux I_is = h·e·n·A·c_s, c_s = sqrt(e·Te/m_i), h = 0.61.
 * Sources: Hutchinson, Principles of Plasma Diagnostics, electric probes chapter; Stangeby, The Plasma
 * Boundary of Magnetic Fusion Devices, Bohm criterion — both from memory. e and m_p: CODATA 2018.
 */
function normalSource(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

const byName = (r: FitResult, name: string) => r.parameters.find((p) => p.name === name)!;

// Argon (μ = 39.948), Te = 3 eV, n = 5e16 m⁻³, a 2 mm² tip: I_is = h·e·n·A·c_s.
const TRUTH = { te: 3, vf: -11, n: 5e16, area: 2e-6, mu: 39.948, h: 0.61 };
const cs = Math.sqrt((ELEMENTARY_CHARGE * TRUTH.te) / (TRUTH.mu * PROTON_MASS));
const IIS = TRUTH.h * ELEMENTARY_CHARGE * TRUTH.n * TRUTH.area * cs;
// Plasma potential ≈ V_f + 5.2 Te for argon (common practice), electron saturation flat above it.
const VP = TRUTH.vf + 5.2 * TRUTH.te;
const V = Array.from({ length: 140 }, (_, i) => -40 + (i * 50) / 139);
const single = (v: number) => IIS * Math.expm1((Math.min(v, VP) - TRUTH.vf) / TRUTH.te);

describe('probe-retarding on synthetic single-probe traces', () => {
  it('chooses the retardation region below the knee automatically', () => {
    const r = retardationRegion(V, V.map(single));
    expect(r.vMax).toBeLessThanOrEqual(VP);
    expect(r.vMax).toBeGreaterThan(VP - 3 * TRUTH.te);
    expect(r.vMin).toBe(-40);
  });

  it('recovers Te, V_f, I_is and n within 2 standard errors in ≥ 95 % of 200 seeded draws', () => {
    const noise = normalSource(20261202);
    const sigma = 0.02 * IIS;
    const hits = { Te_eV: 0, V_f: 0, I_is: 0, n_m3: 0 };
    let converged = 0;
    for (let d = 0; d < 200; d++) {
      const I = V.map((v) => single(v) + sigma * noise());
      const r = fitModel({
        model: 'probe-retarding',
        x: { V },
        xNames: ['V'],
        y: I,
        probe: { area_m2: TRUTH.area, mu: TRUTH.mu },
      });
      if (!r.converged) continue;
      converged++;
      const within = (value: number, se: number, truth: number) => Math.abs(value - truth) <= 2 * se;
      if (within(byName(r, 'Te_eV').value, byName(r, 'Te_eV').stdError, TRUTH.te)) hits.Te_eV++;
      if (within(byName(r, 'V_f').value, byName(r, 'V_f').stdError, TRUTH.vf)) hits.V_f++;
      if (within(byName(r, 'I_is').value, byName(r, 'I_is').stdError, IIS)) hits.I_is++;
      const n = r.derived![0]!;
      expect(n.name).toBe('n_m3');
      if (within(n.value, n.stdError, TRUTH.n)) hits.n_m3++;
    }
    expect(converged).toBe(200);
    for (const [name, count] of Object.entries(hits)) expect(count, name).toBeGreaterThanOrEqual(190);
  });

  it('honours an explicit range and reports the window', () => {
    const I = V.map(single);
    const r = fitModel({ model: 'probe-retarding', x: { V }, xNames: ['V'], y: I, range: [-30, -8] });
    expect(r.region).toMatchObject({ vMin: -30, vMax: -8, automatic: false });
    expect(r.n).toBe(V.filter((v) => v >= -30 && v <= -8).length);
    expect(byName(r, 'Te_eV').value).toBeCloseTo(TRUTH.te, 8);
  });

  it('fits the sheath-expansion slope when asked', () => {
    const I = V.filter((v) => v < VP).map((v) => single(v) + 2e-6 * (v - TRUTH.vf));
    const Vs = V.filter((v) => v < VP);
    const r = fitModel({
      model: 'probe-retarding',
      x: { V: Vs },
      xNames: ['V'],
      y: I,
      sheathSlope: true,
      range: [-40, VP],
    });
    expect(r.converged).toBe(true);
    expect(byName(r, 'slope').value).toBeCloseTo(2e-6, 12);
    expect(byName(r, 'Te_eV').value).toBeCloseTo(TRUTH.te, 7);
  });

  it('density: n = I_is/(h·e·A·c_s) at the fitted values, and its error follows the delta method', () => {
    const r = fitModel({
      model: 'probe-retarding',
      x: { V },
      xNames: ['V'],
      y: V.map(single),
      probe: { area_m2: TRUTH.area, mu: TRUTH.mu },
    });
    expect(r.derived![0]!.value / TRUTH.n).toBeCloseTo(1, 8);
    expect(r.derived![0]!.unit).toBe('m^-3');
  });
});

describe('probe-double on synthetic double-probe traces', () => {
  const Vd = Array.from({ length: 101 }, (_, i) => -30 + 0.6 * i);
  const iis = 1.2e-3;
  const te = 5;
  it('recovers Te and I_is within 2 standard errors in ≥ 95 % of 200 seeded draws', () => {
    const noise = normalSource(1618);
    const hits = { Te_eV: 0, I_is: 0 };
    for (let d = 0; d < 200; d++) {
      const I = Vd.map((v) => iis * Math.tanh(v / (2 * te)) + 0.01 * iis * noise());
      const r = fitModel({ model: 'probe-double', x: { V: Vd }, xNames: ['V'], y: I });
      expect(r.converged).toBe(true);
      if (Math.abs(byName(r, 'Te_eV').value - te) <= 2 * byName(r, 'Te_eV').stdError) hits.Te_eV++;
      if (Math.abs(byName(r, 'I_is').value - iis) <= 2 * byName(r, 'I_is').stdError) hits.I_is++;
    }
    for (const [name, count] of Object.entries(hits)) expect(count, name).toBeGreaterThanOrEqual(190);
  });

  it('fits a slope when asked', () => {
    const I = Vd.map((v) => iis * Math.tanh(v / (2 * te)) + 1e-5 * v);
    const r = fitModel({ model: 'probe-double', x: { V: Vd }, xNames: ['V'], y: I, sheathSlope: true });
    expect(byName(r, 'slope').value).toBeCloseTo(1e-5, 12);
    expect(byName(r, 'Te_eV').value).toBeCloseTo(te, 7);
  });
});
