import { describe, expect, it } from 'vitest';
import { initialState, parseStartValues, toRequest } from './builder-state.js';

const source = { kind: 'sweep' as const, id: 3 };

describe('fit builder state', () => {
  it('builds a power-law request on valid points with a range', () => {
    const s = {
      ...initialState(true),
      y: 'vDi_ms',
      x: ['Te_eV', 'B_T'],
      ranges: [{ column: 'Te_eV', min: '2', max: '' }],
    };
    const r = toRequest(s, source, true);
    expect(r).toEqual({
      ok: true,
      body: {
        source,
        model: 'power-law',
        y: 'vDi_ms',
        x: ['Te_eV', 'B_T'],
        filter: { valid: { eq: true }, Te_eV: { gte: 2 } },
      },
    });
  });

  it('sends one x for single-x models and needs start values for expressions', () => {
    const poly = toRequest({ ...initialState(false), model: 'polytropic', y: 'n', x: ['phi'] }, source, false);
    expect(poly.ok && poly.body.x).toBe('phi');
    const expr = toRequest(
      { ...initialState(false), model: 'expression', y: 'n', x: ['phi'], expr: 'A*exp(phi/T)' },
      source,
      false,
    );
    expect(expr.ok).toBe(false);
    if (!expr.ok) expect(expr.errors.params).toMatch(/start value/);
  });

  it('reports field errors before sending', () => {
    const r = toRequest({ ...initialState(false), ranges: [{ column: 'B_T', min: '3', max: '1' }] }, source, false);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(Object.keys(r.errors).sort()).toEqual(['ranges.0', 'x', 'y']);
  });

  it('parses start values', () => {
    expect(parseStartValues('A = 1, T=4e0\nk = -2')).toEqual({ ok: true, value: { A: 1, T: 4, k: -2 } });
    expect(parseStartValues('A 1').ok).toBe(false);
  });
});
