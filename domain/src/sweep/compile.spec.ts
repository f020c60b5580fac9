import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ValidationError } from '../errors.js';
import { getModel } from '../models/index.js';
import { planChunks } from './chunks.js';
import { checkSweep, compileSweep } from './compile.js';
import { estimateSweep } from './estimate.js';

const fixture = (name: string): Record<string, unknown> =>
  JSON.parse(readFileSync(new URL(`fixtures/${name}`, import.meta.url), 'utf8')) as Record<string, unknown>;

/** Paths → messages of a rejected definition. */
function errorsOf(raw: unknown): Record<string, string> {
  const r = checkSweep(raw);
  if (r.ok) throw new Error('expected the definition to be rejected');
  return Object.fromEntries(r.errors.map((e) => [e.path, e.message]));
}

const edge = fixture('edge-deuterium-grid.json');

describe('compileSweep: the SPEC §4 example', () => {
  const sweep = compileSweep(edge);

  it('has 31·50·3·3 = 13,950 points and the expected columns', () => {
    expect(sweep.totalPoints).toBe(13950);
    const names = sweep.columns.map((c) => c.name);
    const model = getModel('cross-field');
    expect(names).toEqual([
      'idx',
      ...model.inputs.map((i) => i.name),
      ...model.outputs.map((o) => o.name),
      'vE_over_vDi',
      'flags',
    ]);
    expect(sweep.columns.find((c) => c.name === 'Ti_eV')).toMatchObject({
      kind: 'input',
      source: 'expression',
      unit: 'eV',
    });
    expect(sweep.columns.find((c) => c.name === 'Te_eV')).toMatchObject({ source: 'axis' });
    expect(sweep.columns.find((c) => c.name === 'gamma_i')).toMatchObject({ source: 'fixed' });
    expect(sweep.columns.find((c) => c.name === 'vE_over_vDi')).toMatchObject({ kind: 'derived' });
    expect(sweep.columns.find((c) => c.name === 'valid')).toMatchObject({ kind: 'output', type: 'boolean' });
  });

  it('maps indices to points by mixed radix, last axis fastest, endpoints exact', () => {
    expect(sweep.pointAt(0)).toMatchObject({ Te_eV: 1, B_T: 0.1, Ln_m: 0.01, gamma_e: 1, Ti_eV: 1, n_m3: 1e19, mu: 2 });
    expect(sweep.pointAt(1)).toMatchObject({ Te_eV: 1, B_T: 0.1, Ln_m: 0.01, gamma_e: 1.6667 });
    expect(sweep.pointAt(3)).toMatchObject({ Ln_m: 0.02, gamma_e: 1 });
    expect(sweep.pointAt(9).B_T).toBeCloseTo(0.1 + 4.9 / 49, 14);
    expect(sweep.pointAt(13949)).toMatchObject({ Te_eV: 1000, B_T: 5, Ln_m: 0.05, gamma_e: 3, Ti_eV: 1000 });
    // Log axis: 31 points over three decades, so every 10th is a power of ten.
    expect(sweep.pointAt(10 * 450).Te_eV).toBeCloseTo(10, 12);
    expect(sweep.pointAt(20 * 450).Te_eV).toBeCloseTo(100, 10);
    expect(sweep.axes.map((a) => a.count)).toEqual([31, 50, 3, 3]);
  });

  it('evaluates chunks exactly as the model evaluates each point', () => {
    const model = getModel('cross-field');
    const chunk = sweep.evaluateChunk(4990, 5030);
    expect(chunk.idx0).toBe(4990);
    expect(chunk.n).toBe(40);
    for (let k = 0; k < chunk.n; k++) {
      const inputs = sweep.pointAt(4990 + k);
      for (const name of Object.keys(inputs)) expect(chunk.columns[name]![k]).toBe(inputs[name]);
      const expected = model.evaluate(inputs, sweep.thresholds);
      for (const o of model.outputs) {
        const v = expected.outputs[o.name]!;
        expect(chunk.columns[o.name]![k]).toBe(typeof v === 'boolean' ? Number(v) : v);
      }
      const flags = model.flags.filter((f) => chunk.flags[k]! & (1 << f.bit)).map((f) => f.code);
      expect(flags).toEqual(expected.flags);
      const vE = expected.outputs['vE_ms'] as number;
      const vDi = expected.outputs['vDi_ms'] as number;
      expect(chunk.columns['vE_over_vDi']![k]).toBeCloseTo(vE / vDi, 12);
    }
  });

  it('gives the same values whichever chunking is used', () => {
    const whole = sweep.evaluateChunk(0, 13950);
    const parts = planChunks(13950, 5000);
    expect(parts).toEqual([
      { index: 0, i0: 0, i1: 5000 },
      { index: 1, i0: 5000, i1: 10000 },
      { index: 2, i0: 10000, i1: 13950 },
    ]);
    for (const p of parts) {
      const c = sweep.evaluateChunk(p.i0, p.i1);
      for (const name of ['Te_eV', 'B_T', 'gamma_e', 'vDe_ms', 'beta']) {
        expect(Array.from(c.columns[name]!)).toEqual(Array.from(whole.columns[name]!.subarray(p.i0, p.i1)));
      }
      expect(Array.from(c.flags)).toEqual(Array.from(whole.flags.subarray(p.i0, p.i1)));
    }
  });

  it('describes one point with named outputs and flag codes', () => {
    const p = sweep.evaluatePointAt(13949);
    expect(p.inputs.Te_eV).toBe(1000);
    expect(typeof p.outputs['valid']).toBe('boolean');
    expect(p.derived['vE_over_vDi']).toBeDefined();
    expect(Array.isArray(p.flags)).toBe(true);
    // vE = -Er/B = 0 here (Er fixed at 0), so the derived ratio is -0 / negative = 0.
    expect(Math.abs(p.derived['vE_over_vDi']!)).toBe(0);
  });

  it('rejects chunk ranges outside the sweep', () => {
    expect(() => sweep.evaluateChunk(0, 13951)).toThrow(RangeError);
    expect(() => sweep.evaluateChunk(10, 5)).toThrow(RangeError);
    expect(() => sweep.pointAt(13950)).toThrow(RangeError);
  });

  it('estimates points, chunks and seconds', () => {
    expect(estimateSweep(sweep, 1e6)).toEqual({ points: 13950, chunks: 3, seconds: 0.01395 });
    expect(() => estimateSweep(sweep, 0)).toThrow(RangeError);
  });
});

describe('compileSweep: units and random designs', () => {
  it('converts unit strings and axis units to canonical SI', () => {
    const sweep = compileSweep(fixture('argon-column-lhs.json'));
    const [b, te, ln] = sweep.axes;
    expect([b!.min, b!.max]).toEqual([0.05, 0.2]); // 500 G … 2000 G
    expect([ln!.min, ln!.max]).toEqual([0.01, 0.05]); // 1 … 5 cm
    expect(te!.kind).toBe('log');
    const p = sweep.pointAt(123);
    expect(p.n_m3).toBe(1e18);
    expect(p.Er_Vm).toBe(-200);
    expect(p.Ti_eV).toBeCloseTo(0.1 * p.Te_eV!, 14);
    expect(sweep.thresholds['rho_i_over_Ln_max']).toBe(0.2);
    expect(sweep.thresholds['beta_max']).toBe(1);
  });

  it('keeps the latin-hypercube strata in physical units, log axes in log space', () => {
    const sweep = compileSweep(fixture('argon-column-lhs.json'));
    const n = sweep.totalPoints;
    const chunk = sweep.evaluateChunk(0, n);
    const strataB = new Uint32Array(n);
    const strataTe = new Uint32Array(n);
    for (let k = 0; k < n; k++) {
      strataB[Math.floor(((chunk.columns['B_T']![k]! - 0.05) / 0.15) * n)]! += 1;
      strataTe[Math.floor((Math.log(chunk.columns['Te_eV']![k]!) / Math.log(10)) * n)]! += 1;
    }
    expect(strataB.every((c) => c === 1)).toBe(true);
    expect(strataTe.every((c) => c === 1)).toBe(true);
    // Same definition, same points; another seed, other points.
    const again = compileSweep(fixture('argon-column-lhs.json')).evaluateChunk(0, 50);
    expect(Array.from(again.columns['B_T']!)).toEqual(Array.from(chunk.columns['B_T']!.subarray(0, 50)));
    const reseeded = compileSweep({
      ...fixture('argon-column-lhs.json'),
      sampling: { kind: 'latin-hypercube', samples: 2000, seed: 1 },
    });
    expect(reseeded.pointAt(0).B_T).not.toBe(sweep.pointAt(0).B_T);
  });

  it('spreads a list axis evenly over a latin hypercube (counts fixed up to the two straddling strata)', () => {
    const sweep = compileSweep({
      name: 'list balance',
      model: 'parallel-balance',
      axes: [
        { param: 'gamma_e', kind: 'list', values: [1, 1.2, 1.6667] },
        { param: 'Te_eV', kind: 'log', min: 1, max: 100 },
      ],
      sampling: { kind: 'latin-hypercube', samples: 1000, seed: 5 },
    });
    const g = sweep.evaluateChunk(0, 1000).columns['gamma_e']!;
    const counts = new Map<number, number>();
    for (const v of g) counts.set(v, (counts.get(v) ?? 0) + 1);
    // Strata 0..332 lie wholly below 1/3, 334..665 wholly in [1/3, 2/3), 667..999 wholly above;
    // strata 333 and 666 straddle a boundary and go either way with their offset.
    expect(counts.get(1)! - 333).toBeGreaterThanOrEqual(0);
    expect(counts.get(1)! - 333).toBeLessThanOrEqual(1);
    expect(counts.get(1.2)! - 332).toBeGreaterThanOrEqual(0);
    expect(counts.get(1.2)! - 332).toBeLessThanOrEqual(2);
    expect(counts.get(1.6667)! - 333).toBeGreaterThanOrEqual(0);
    expect(counts.get(1.6667)! - 333).toBeLessThanOrEqual(1);
    expect(counts.get(1)! + counts.get(1.2)! + counts.get(1.6667)!).toBe(1000);
  });

  it('maps Sobol points to axes: u = 0 at the minimum, u = 1/2 at the (log) midpoint, lists by floor(u·count)', () => {
    const sweep = compileSweep(fixture('sheath-sobol.json'));
    expect(sweep.totalPoints).toBe(1024);
    expect(sweep.pointAt(0)).toMatchObject({ Te_eV: 2, phi_V: -10, gamma_e: 1 });
    const p1 = sweep.pointAt(1); // Sobol point (1/2, 1/2, 1/2)
    expect(p1.Te_eV).toBeCloseTo(10, 12); // sqrt(2·50)
    expect(p1.phi_V).toBe(-5);
    expect(p1.gamma_e).toBe(1.6667); // floor(0.5·4) = 2
    const p2 = sweep.pointAt(2); // (3/4, 1/4, 1/4)
    expect(p2.Te_eV).toBeCloseTo(2 * 25 ** 0.75, 12);
    expect(p2.phi_V).toBe(-7.5);
    expect(p2.gamma_e).toBe(1.2);
    const skipped = compileSweep({
      ...fixture('sheath-sobol.json'),
      sampling: { kind: 'sobol', samples: 10, skip: 1 },
    });
    expect(skipped.pointAt(0)).toEqual(p1);
  });
});

describe('compileSweep: errors with paths', () => {
  it('reports unknown params, fixed-and-swept, duplicates, ranges and thresholds all at once', () => {
    const errors = errorsOf({
      ...edge,
      fixed: { ...(edge.fixed as object), B_T: 1, Tx_eV: 3 },
      axes: [
        { param: 'Te_eV', kind: 'log', min: 1, max: 1000, count: 31 },
        { param: 'B_T', kind: 'linear', min: 0.1, max: 500, count: 5 },
        { param: 'Lx_m', kind: 'list', values: [1] },
        { param: 'Te_eV', kind: 'list', values: [1] },
        { param: 'gamma_e', kind: 'list', values: [1, -2] },
      ],
      thresholds: { beta_max: 1, bogus: 2 },
    });
    expect(errors['fixed.B_T']).toMatch(/also swept along an axis/);
    expect(errors['fixed.Tx_eV']).toBe('`Tx_eV` is not an input of Cross-field drifts; did you mean `Te_eV`?');
    expect(errors['axes.1.max']).toMatch(/B_T must be > 0 and ≤ 100 T; got 500/);
    expect(errors['axes.2.param']).toBe('`Lx_m` is not an input of Cross-field drifts; did you mean `Ln_m`?');
    expect(errors['axes.3.param']).toBe('T_e is already swept by axis 1');
    expect(errors['axes.4.values.1']).toMatch(/gamma_e must be > 0/);
    expect(errors['thresholds.bogus']).toMatch(/unknown threshold/);
  });

  it('reports structural and model problems together, each at its own path and label', () => {
    const r = checkSweep({
      ...edge,
      name: '',
      fixed: { ...(edge.fixed as object), Ti_eV: 'Te_eVV' },
      axes: [
        { param: 'Te_eV', kind: 'log', min: '', max: 1000, count: 31 },
        { param: 'B_T', kind: 'linear', min: 0.1, max: 500, count: 5 },
      ],
      derived: [
        { name: '1bad', expr: 'vE_ms' },
        { name: 'ok', expr: 'vE_ms / nope' },
      ],
    });
    if (r.ok) throw new Error('expected a rejection');
    const byPath = Object.fromEntries(r.errors.map((e) => [e.path, e]));
    expect(Object.keys(byPath).sort()).toEqual(
      ['axes.0.min', 'axes.1.max', 'derived.0.name', 'derived.1.expr', 'fixed.Ti_eV', 'name'].sort(),
    );
    // The B axis is the second axis as written, although the broken first one was set aside.
    expect(byPath['axes.1.max']).toMatchObject({ label: 'B axis · To', message: expect.stringMatching(/≤ 100 T/) });
    expect(byPath['axes.0.min']!.label).toBe('T_e axis · From');
    expect(byPath['name']!.label).toBe('Name');
    expect(byPath['fixed.Ti_eV']).toMatchObject({
      label: 'T_i fixed value',
      message: 'unknown input or output `Te_eVV`; did you mean `Te_eV`?',
    });
    expect(byPath['derived.1.expr']).toMatchObject({
      label: 'Derived column 2 · Expression',
      message: expect.stringMatching(/unknown input or output `nope`/),
    });
    // No message or label carries a JSON path.
    for (const e of r.errors) expect(`${e.label} ${e.message}`).not.toMatch(/\b(axes|fixed|derived)\.\w/);
  });

  it('says which name was meant for a misspelt input in a value or an expression', () => {
    expect(errorsOf({ ...edge, fixed: { ...(edge.fixed as object), Ti_eV: '2*Te_eW' } })['fixed.Ti_eV']).toBe(
      'unknown input or output `Te_eW`; did you mean `Te_eV`?',
    );
    expect(errorsOf({ ...edge, fixed: { ...(edge.fixed as object), Ti_eV: 'Te_eV * Te_eVV' } })['fixed.Ti_eV']).toMatch(
      /unknown input or output `Te_eVV`; did you mean `Te_eV`\?/,
    );
    // A real unit still reads as a quantity; a wrong one says which unit is wanted.
    expect(compileSweep({ ...edge, fixed: { ...(edge.fixed as object), Ti_eV: '20 eV' } }).totalPoints).toBe(13950);
    expect(errorsOf({ ...edge, fixed: { ...(edge.fixed as object), Ti_eV: '20 cm' } })['fixed.Ti_eV']).toMatch(
      /expected a quantity in eV/,
    );
  });

  it('rejects an unknown model', () => {
    expect(errorsOf({ ...edge, model: 'warp-drive' })['model']).toMatch(
      /unknown model "warp-drive"; known models: cross-field/,
    );
  });

  it('rejects cyclic and self-referencing expressions', () => {
    const errors = errorsOf({
      ...edge,
      fixed: { n_m3: 1e19, Ti_eV: 'Er_Vm + 1', Er_Vm: 'Ti_eV * 2', mu: 'mu + 1' },
    });
    expect(errors['fixed.Ti_eV']).toMatch(/cycle/);
    expect(errors['fixed.Er_Vm']).toMatch(/cycle/);
    expect(errors['fixed.mu']).toMatch(/itself/);
  });

  it('orders chained expressions topologically', () => {
    const sweep = compileSweep({
      ...edge,
      fixed: { ...(edge.fixed as object), Ti_eV: 'Er_Vm + Te_eV', Er_Vm: '2*Te_eV' },
    });
    const p = sweep.pointAt(13949);
    expect(p.Er_Vm).toBe(2000);
    expect(p.Ti_eV).toBe(3000);
    const chunk = sweep.evaluateChunk(13940, 13950);
    expect(chunk.columns['Ti_eV']![9]).toBe(3000);
  });

  it('rejects an expression-valued input that leaves its range at a corner', () => {
    const errors = errorsOf({ ...edge, fixed: { ...(edge.fixed as object), Ti_eV: 'Te_eV - 5' } });
    expect(errors['fixed.Ti_eV']).toMatch(/leaves the allowed range at Te_eV = 1: Ti_eV must be > 0/);
  });

  it('rejects bad unit strings and dimensions', () => {
    const errors = errorsOf({
      ...edge,
      fixed: { ...(edge.fixed as object), n_m3: '3 cm' },
      axes: [
        { param: 'Te_eV', kind: 'log', min: '1 eV', max: '2 T', count: 3 },
        { param: 'B_T', kind: 'linear', min: 2, max: 1, count: 5 },
        { param: 'Ln_m', kind: 'log', min: 0, max: 1, count: 3, unit: 'cm' },
      ],
    });
    expect(errors['fixed.n_m3']).toMatch(/m\^-3/);
    expect(errors['axes.0.max']).toMatch(/eV/);
    expect(errors['axes.1.max']).toMatch(/greater than min/);
    expect(errors['axes.2.min']).toBeDefined();
  });

  it('rejects unknown symbols and name clashes in derived columns', () => {
    const errors = errorsOf({
      ...edge,
      derived: [
        { name: 'ratio', expr: 'vE_ms / nope' },
        { name: 'beta', expr: '1' },
      ],
    });
    expect(errors['derived.0.expr']).toMatch(/nope/);
    expect(errors['derived.1.name']).toMatch(/already an input or output/);
  });

  it('throws one ValidationError from compileSweep', () => {
    try {
      compileSweep({ ...edge, axes: [{ param: 'Te_eV', kind: 'log', min: -1, max: 10, count: 3 }] });
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ValidationError);
      expect((err as ValidationError).details!.some((d) => d.path === 'axes.0.min')).toBe(true);
    }
  });

  it('asks for a list axis on integer inputs in random designs', () => {
    const model = getModel('column-profile');
    const nr = model.inputs.find((i) => i.integer);
    if (!nr) return; // no integer input in this model set
    const errors = errorsOf({
      name: 'x',
      model: 'column-profile',
      axes: [{ param: nr.name, kind: 'linear', min: nr.min + 1, max: nr.min + 10 }],
      sampling: { kind: 'sobol', samples: 8 },
    });
    expect(errors['axes.0.kind']).toMatch(/whole numbers: use a list axis/);
  });
});
