import { describe, expect, it } from 'vitest';
import { fromRequest, initialState, parseStartValues, toRequest } from './builder-state.js';

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

describe('fit builder steering', () => {
  const base = {
    ...initialState(false),
    model: 'expression' as const,
    y: 'y',
    x: ['x'],
    expr: 'a + b*x',
    params: 'a = 1, b = 2',
  };
  it('sends fixed values and [lo, hi] bounds with open sides as null', () => {
    const r = toRequest(
      {
        ...base,
        steer: { a: { fixed: true, value: '0.5', lo: '', hi: '' }, b: { fixed: false, value: '', lo: '0', hi: '' } },
      },
      { kind: 'dataset', id: 1 },
      false,
    );
    expect(r.ok && r.body.fixed).toEqual({ a: 0.5 });
    expect(r.ok && r.body.bounds).toEqual({ b: [0, null] });
  });
  it('reports a reversed bound and a fixed parameter without a value beside their fields', () => {
    const r = toRequest(
      {
        ...base,
        steer: { a: { fixed: true, value: '', lo: '', hi: '' }, b: { fixed: false, value: '', lo: '3', hi: '1' } },
      },
      { kind: 'dataset', id: 1 },
      false,
    );
    expect(r.ok).toBe(false);
    expect(!r.ok && Object.keys(r.errors).sort()).toEqual(['bounds.b', 'fixed.a']);
  });
  it('sends sigmaMode with weights only, and the probe options in SI', () => {
    const withW = toRequest({ ...base, weights: 's', sigmaMode: 'absolute' }, { kind: 'dataset', id: 1 }, false);
    expect(withW.ok && withW.body.sigmaMode).toBe('absolute');
    const probe = toRequest(
      {
        ...initialState(false),
        model: 'probe-retarding',
        y: 'I',
        x: ['V'],
        probe: { areaMm2: '2', mu: '39.948', h: '0.61', vMin: '-30', vMax: '-5', slope: true },
      },
      { kind: 'dataset', id: 1 },
      false,
    );
    expect(probe.ok && probe.body).toMatchObject({
      x: 'V',
      range: [-30, -5],
      sheathSlope: true,
      probe: { area_m2: 2e-6, mu: 39.948, h: 0.61 },
    });
  });
  it('refills the form from a request with the last iterate as start values, fixed ones left out', () => {
    const s = fromRequest(
      {
        source: { kind: 'dataset', id: 1 },
        model: 'expression',
        y: 'y',
        x: 'x',
        expr: 'b1*(1-exp(-b2*x))',
        params: { b1: 1, b2: 1 },
        fixed: { b3: 2 },
      },
      false,
      { b1: 172.5, b2: 7.5e6, b3: 2 },
    );
    expect(parseStartValues(s.params)).toEqual({ ok: true, value: { b1: 172.5, b2: 7.5e6 } });
    expect(s.steer.b3).toMatchObject({ fixed: true, value: '2' });
  });
});
