import { describe, expect, it } from 'vitest';
import { fitModel } from './fit-model.js';
import { checkInput } from './input.js';
import { compilePolytropic, fitsScale } from './models/polytropic.js';

/** Seeded PRNG (mulberry32, common practice) and Box–Muller normal deviates, so noise is reproducible. */
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

/** n = n0·[1 + ((γ−1)/γ)·φ/Te]^(1/(γ−1)), n0·exp(φ/Te) at γ = 1 (polytropic electron balance, SPEC §3.2). */
function density(phi: number, gamma: number, te: number, n0: number): number {
  if (gamma === 1) return n0 * Math.exp(phi / te);
  const base = 1 + ((gamma - 1) / gamma) * (phi / te);
  return base <= 0 ? 0 : n0 * base ** (1 / (gamma - 1));
}

function byName(result: ReturnType<typeof fitModel>, name: string) {
  const p = result.parameters.find((q) => q.name === name);
  if (!p) throw new Error(`no parameter ${name}`);
  return p;
}

// Argon column probe scan (invented): φ from −14 V to +2 V, above the −17.5 V cutoff of γ = 1.4, Te = 5 eV.
const phi = Array.from({ length: 80 }, (_, i) => -14 + (i * 16) / 79);

describe('polytropic with the density scale n0', () => {
  it('recovers γ = 1.4, Te = 5 eV, n0 = 3e17 m⁻³ from raw densities with seeded noise, within 3 standard errors', () => {
    const noise = normalSource(31415);
    const sigma = 0.01 * 3e17; // 1 % of n0, absolute
    const y = phi.map((p) => density(p, 1.4, 5, 3e17) + sigma * noise());
    const result = fitModel({ model: 'polytropic', x: { phi_V: phi }, xNames: ['phi_V'], y });
    expect(result.converged).toBe(true);
    expect(result.parameters.map((p) => p.name)).toEqual(['gamma', 'Te_eV', 'n0']);
    const gamma = byName(result, 'gamma');
    const te = byName(result, 'Te_eV');
    const n0 = byName(result, 'n0');
    // Truth is the generating values; a correct fit and correct errors put them within ~3σ.
    expect(Math.abs(gamma.value - 1.4)).toBeLessThan(3 * gamma.stdError);
    expect(Math.abs(te.value - 5)).toBeLessThan(3 * te.stdError);
    expect(Math.abs(n0.value - 3e17)).toBeLessThan(3 * n0.stdError);
    // The errors are informative, not vacuous: a few per cent at 1 % noise.
    expect(gamma.stdError / 1.4).toBeLessThan(0.05);
    expect(te.stdError / 5).toBeLessThan(0.05);
    expect(n0.stdError / 3e17).toBeLessThan(0.02);
    // The residual spread estimates the noise (common practice).
    expect(result.rmse / sigma).toBeGreaterThan(0.7);
    expect(result.rmse / sigma).toBeLessThan(1.3);
  });

  it('keeps γ = 1 exact (Boltzmann) with n0: noiseless n0·exp(φ/Te) gives back γ = 1, Te and n0', () => {
    const y = phi.map((p) => density(p, 1, 5, 2e18));
    const result = fitModel({ model: 'polytropic', x: { phi_V: phi }, xNames: ['phi_V'], y, params: { gamma: 1.3 } });
    expect(result.converged).toBe(true);
    expect(Math.abs(byName(result, 'gamma').value - 1)).toBeLessThan(1e-8);
    expect(Math.abs(byName(result, 'Te_eV').value - 5)).toBeLessThan(1e-7);
    expect(Math.abs(byName(result, 'n0').value / 2e18 - 1)).toBeLessThan(1e-8);
  });

  // Issue 15: data with γ = 1.3, Te = 4 eV and n0 = 3 (1 % noise) used to fit to γ ≈ 6 with n0 silently fixed
  // at 1, because max |y| lay in [0.2, 5]. n0 is now always fitted unless the request says normalised.
  it('fits n0 for y in the range that used to be taken as normalised (γ = 1.3, Te = 4 eV, n0 = 3)', () => {
    const noise = normalSource(1303);
    const y = phi.map((p) => density(p, 1.3, 4, 3) * (1 + 0.01 * noise()));
    expect(fitsScale({ model: 'polytropic', x: {}, xNames: [], y })).toBe(true);
    const result = fitModel({ model: 'polytropic', x: { phi_V: phi }, xNames: ['phi_V'], y });
    expect(result.converged).toBe(true);
    expect(result.parameters.map((p) => p.name)).toEqual(['gamma', 'Te_eV', 'n0']);
    for (const [name, truth] of [
      ['gamma', 1.3],
      ['Te_eV', 4],
      ['n0', 3],
    ] as const) {
      const q = byName(result, name);
      expect(Math.abs(q.value - truth), name).toBeLessThan(3 * q.stdError);
    }
    expect(result.r2).toBeGreaterThan(0.99);
  });

  it('normalised: true fits exactly γ and Te with n0 = 1', () => {
    const noise = normalSource(2718);
    const y = phi.map((p) => density(p, 1.4, 5, 1) + 0.01 * noise());
    const result = fitModel({ model: 'polytropic', x: { phi_V: phi }, xNames: ['phi_V'], y, normalised: true });
    expect(result.converged).toBe(true);
    expect(result.parameters.map((p) => p.name)).toEqual(['gamma', 'Te_eV']);
    expect(result.covariance).toHaveLength(2);
    expect(Math.abs(byName(result, 'gamma').value - 1.4)).toBeLessThan(3 * byName(result, 'gamma').stdError);
    expect(() =>
      fitModel({ model: 'polytropic', x: { phi_V: phi }, xNames: ['phi_V'], y, normalised: true, params: { n0: 1 } }),
    ).toThrow(/normalised/);
  });

  it('rejects a start n0 ≤ 0 naming the field', () => {
    const y = phi.map((p) => density(p, 1.4, 5, 3e17));
    expect(() =>
      fitModel({ model: 'polytropic', x: { phi_V: phi }, xNames: ['phi_V'], y, params: { n0: -1 } }),
    ).toThrow(/params\.n0.*outside the bounds/);
  });

  it('has an analytic Jacobian that matches central differences for all three parameters', () => {
    const y = phi.map((p) => density(p, 1.4, 5, 3e17));
    const input = { model: 'polytropic' as const, x: { phi_V: phi }, xNames: ['phi_V'], y };
    const model = compilePolytropic(input, checkInput(input));
    const n = model.n;
    const p = Float64Array.of(1.35, 4.6, 2.8e17);
    const jac = new Float64Array(3 * n);
    model.jacobian!(p, jac);
    const up = new Float64Array(n);
    const down = new Float64Array(n);
    for (let j = 0; j < 3; j++) {
      const h = 1e-6 * p[j]!;
      const q = Float64Array.from(p);
      q[j] = p[j]! + h;
      model.evaluate(q, up);
      q[j] = p[j]! - h;
      model.evaluate(q, down);
      for (let i = 0; i < n; i++) {
        const fd = (up[i]! - down[i]!) / (2 * h);
        expect(Math.abs(jac[j * n + i]! - fd)).toBeLessThanOrEqual(1e-6 * Math.abs(fd) + (1e-9 * 3e17) / p[j]!);
      }
    }
  });
});
