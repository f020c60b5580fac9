import { describe, expect, it } from 'vitest';
import { fitRequestSchema } from './fits.js';

// Request shape of POST /api/fits, SPEC §6.
describe('fitRequestSchema', () => {
  it('accepts the SPEC §6 request shapes', () => {
    const ok = fitRequestSchema.safeParse({
      source: { kind: 'sweep', id: 's1' },
      model: 'power-law',
      y: 'vDi_ms',
      x: ['Ti_eV', 'B_T', 'Ln_m'],
      filter: { Te_eV: { gte: 10, lte: 100 }, valid: { eq: true } },
    });
    expect(ok.success).toBe(true);
    const expr = fitRequestSchema.safeParse({
      source: { kind: 'dataset', id: 'd1' },
      model: 'expression',
      y: 'n',
      x: 'phi',
      expr: 'A*exp(phi/Te)',
      params: { A: 1, Te: 3 },
      weights: 'n_err',
    });
    expect(expr.success).toBe(true);
  });

  function messages(body: unknown): string[] {
    const r = fitRequestSchema.safeParse(body);
    expect(r.success).toBe(false);
    return r.success ? [] : r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
  }

  it('names the field of each problem', () => {
    expect(messages({ source: { kind: 'table', id: 'a' }, model: 'power-law', y: 'v', x: 'T' })).toContain(
      'source.kind: source.kind must be "sweep" or "dataset"',
    );
    expect(messages({ source: { kind: 'sweep', id: 'a' }, model: 'expression', y: 'v', x: 'T' })).toEqual([
      'expr: expr is required when model is "expression"',
      'params: params (start values) are required when model is "expression"',
    ]);
    expect(messages({ source: { kind: 'sweep', id: 'a' }, model: 'cubic', y: 'v', x: 'T' })[0]).toMatch(
      /^model: model must be one of power-law/,
    );
    expect(messages({ source: { kind: 'sweep', id: 'a' }, model: 'polytropic', y: 'v', x: ['a', 'b'] })).toContain(
      'x: polytropic takes exactly one x column',
    );
    expect(
      messages({
        source: { kind: 'sweep', id: 'a' },
        model: 'power-law',
        y: 'v',
        x: 'T',
        filter: { T: { between: 1 } },
      })[0],
    ).toMatch(/^filter\.T/);
    expect(messages({ source: { kind: 'sweep', id: 'a' }, model: 'power-law', y: 'v', x: [] })[0]).toMatch(/^x:/);
  });
});
