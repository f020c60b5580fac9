import { describe, expect, it } from 'vitest';
import { ValidationError } from '../errors.js';
import { crossField } from '../models/cross-field.js';
import { allocateChunk } from '../models/registry.js';
import { compileDerived } from './compile.js';
import { compileExpression } from './security.js';

const symbols = [...crossField.inputs, ...crossField.outputs].map((s) => s.name);

function detailsOf(fn: () => unknown) {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(ValidationError);
    return (e as ValidationError).details!;
  }
  throw new Error('expected a ValidationError');
}

describe('compileDerived', () => {
  it('computes columns for a chunk and a point, with earlier derived columns visible', () => {
    const d = compileDerived(
      [
        { name: 'vE_over_vDi', expr: 'vE_ms / vDi_ms' },
        { name: 'ratio2', expr: '2 * vE_over_vDi + sqrt(beta)' },
        { name: 'hot', expr: 'Te_eV > 100' },
        { name: 'neg', expr: 'sqrt(-Te_eV)' },
      ],
      symbols,
    );
    expect(d.names).toEqual(['vE_over_vDi', 'ratio2', 'hot', 'neg']);
    const n = 5;
    const inputs: Record<string, Float64Array> = {};
    for (const s of crossField.inputs) inputs[s.name] = new Float64Array(n).fill(s.default);
    for (let k = 0; k < n; k++) {
      inputs.Er_Vm![k] = 100 * k;
      inputs.Te_eV![k] = 50 * k + 1;
    }
    const out = allocateChunk(crossField, n);
    crossField.evaluateChunk(inputs, n, out);
    const cols = d.evaluateChunk({ ...inputs, ...out.columns }, n);
    for (let k = 0; k < n; k++) {
      const vE = out.columns.vE_ms![k]!,
        vDi = out.columns.vDi_ms![k]!;
      expect(cols.vE_over_vDi![k]).toBe(vE / vDi);
      expect(cols.ratio2![k]).toBeCloseTo((2 * vE) / vDi + Math.sqrt(out.columns.beta![k]!), 12);
      expect(cols.hot![k]).toBe(inputs.Te_eV![k]! > 100 ? 1 : 0);
      expect(cols.neg![k]).toBeNaN(); // predictable mode: NaN, not a complex number
      const point: Record<string, number> = {};
      for (const s of symbols) point[s] = (inputs[s] ?? out.columns[s]!)[k]!;
      expect(d.evaluatePoint(point).vE_over_vDi).toBe(cols.vE_over_vDi![k]);
    }
  });

  it('rejects unknown symbols naming them', () => {
    const [d] = detailsOf(() => compileDerived([{ name: 'x', expr: 'vE_ms / v_Di' }], symbols));
    expect(d!.path).toBe('derived.0.expr');
    expect(d!.message).toMatch(/unknown input or output `v_Di`; did you mean `vDi_ms`\?/);
    const [u] = detailsOf(() => compileDerived([{ name: 'x', expr: 'Te_eV * 1 cm' }], symbols));
    expect(u!.message).toMatch(/unknown input or output `cm`/);
    const [e] = detailsOf(() => compileDerived([{ name: 'x', expr: 'e * phi' }], symbols));
    expect(e!.message).toMatch(/"e" is ambiguous/);
  });

  it.each([
    ['import({a: 1})', /function "import" is not allowed/],
    ['createUnit("foo")', /function "createUnit" is not allowed/],
    ['evaluate("1+1")', /function "evaluate" is not allowed/],
    ['parse("1")', /function "parse" is not allowed/],
    ['simplify("x")', /function "simplify" is not allowed/],
    ['derivative("x^2", "x")', /function "derivative" is not allowed/],
    ['f(x) = x^2', /defining functions is not allowed/],
    ['Te_eV = 3', /assignment is not allowed/],
    ['a = 1; a', /only one expression|assignment/],
    ['Te_eV.constructor', /property access/],
    ['[1, 2]', /array syntax is not allowed/],
    ['"abc"', /only numbers may appear/],
    ['Te_eV to K', /operator "to" is not allowed/],
    ['cos', /is a function, not a value/],
    ['foo(Te_eV)', /unknown or forbidden function "foo"/],
    ['sqrt(', /cannot read expression/],
    ['sqrt()', /cannot be evaluated/],
  ])('rejects %s', (expr, message) => {
    const details = detailsOf(() => compileDerived([{ name: 'bad', expr }], symbols));
    expect(details.map((d) => d.path)).toContain('derived.0.expr');
    expect(details.map((d) => d.message).join(' | ')).toMatch(message);
  });

  it('checks names: identifiers, unique, no clash with inputs/outputs', () => {
    const details = detailsOf(() =>
      compileDerived(
        [
          { name: 'B_T', expr: '1' },
          { name: '2x', expr: '1' },
          { name: 'ok', expr: '1' },
          { name: 'ok', expr: '2' },
          { name: 'sqrt', expr: '3' },
        ],
        symbols,
      ),
    );
    expect(details.map((d) => d.path)).toEqual([
      'derived.0.name',
      'derived.1.name',
      'derived.3.name',
      'derived.4.name',
    ]);
    expect(details[0]!.message).toMatch(/already an input or output/);
    expect(details[2]!.message).toMatch(/defined twice/);
  });
});

describe('compileExpression', () => {
  it('evaluates fixed-value expressions over other inputs', () => {
    const f = compileExpression('Te_eV', ['Te_eV', 'B_T'], 'fixed.Ti_eV');
    expect(f.symbols).toEqual(['Te_eV']);
    expect(f({ Te_eV: 42, B_T: 1 })).toBe(42);
    const g = compileExpression('0.5 * Te_eV * pi + max(B_T, 2)', ['Te_eV', 'B_T'], 'fixed.x');
    expect(
      g(
        new Map([
          ['Te_eV', 2],
          ['B_T', 3],
        ]),
      ),
    ).toBeCloseTo(Math.PI + 3, 14);
    expect(() => compileExpression('Ti_eV', ['Te_eV'], 'fixed.Ti_eV')).toThrow(
      /fixed.Ti_eV.*unknown input or output `Ti_eV`; did you mean `Te_eV`\?/,
    );
    expect(() => compileExpression('  ', ['Te_eV'], 'fixed.Ti_eV')).toThrow(/non-empty/);
  });
});

describe('physical constants in expressions (CODATA 2018, domain/src/constants.ts)', () => {
  it('derived columns read q_e, m_e, m_p, m_u, eps0, mu0, k_B, c0 as their CODATA 2018 values', async () => {
    const { compileDerived: compile } = await import('./compile.js');
    const d = compile(
      [
        { name: 'ratio', expr: 'm_p / m_e' },
        { name: 'c_check', expr: '1 / sqrt(eps0 * mu0) / c0' },
        { name: 'kelvin', expr: 'Te_eV * q_e / k_B' },
        { name: 'argon', expr: '39.948 * m_u / m_p' },
      ],
      ['Te_eV'],
    );
    const v = d.evaluatePoint({ Te_eV: 1 });
    // CODATA 2018: m_p/m_e = 1836.15267343; 1 eV = 11604.51812 K; c = 1/sqrt(ε0 μ0) to the 1e-10 of μ0.
    expect(v.ratio).toBeCloseTo(1836.15267343, 7);
    expect(Math.abs(v.c_check! - 1)).toBeLessThan(1e-9);
    expect(v.kelvin).toBeCloseTo(11604.51812, 4);
    expect(v.argon).toBeCloseTo(39.6594195574, 9);
    const chunk = d.evaluateChunk({ Te_eV: Float64Array.of(1, 2) }, 2);
    expect(chunk.kelvin![1]).toBeCloseTo(2 * 11604.51812, 4);
  });

  it('refuses a bare e naming both meanings and the names to use; constants cannot be redefined', async () => {
    const { compileDerived: compile } = await import('./compile.js');
    let err: unknown;
    try {
      compile([{ name: 'x', expr: 'e * Te_eV' }], ['Te_eV']);
    } catch (e) {
      err = e;
    }
    const msg = (err as { details: { message: string }[] }).details[0]!.message;
    expect(msg).toMatch(/elementary charge/);
    expect(msg).toMatch(/Euler/);
    expect(msg).toMatch(/q_e/);
    expect(msg).toMatch(/exp\(1\)/);
    expect(() => compile([{ name: 'q_e', expr: 'Te_eV' }], ['Te_eV'])).toThrow(/reserved/);
    // A model column of the same name would win over the constant (none exists today).
    expect(compile([{ name: 'y', expr: 'c0 * 2' }], ['c0']).evaluatePoint({ c0: 3 }).y).toBe(6);
  });
});
