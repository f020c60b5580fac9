import { describe, expect, it } from 'vitest';
import { ValidationError } from '../errors.js';
import { fitModel } from './fit-model.js';
import type { FitInput } from './types.js';

function validationOf(input: FitInput): ValidationError {
  try {
    fitModel(input);
  } catch (err) {
    if (err instanceof ValidationError) return err;
    throw err;
  }
  throw new Error('expected a ValidationError');
}

const x = [1, 2, 3, 4, 5, 6];
const y = [2.1, 3.9, 6.2, 7.8, 10.1, 12.2];

describe('fit errors', () => {
  it('refuses too few points (n ≤ number of parameters)', () => {
    const err = validationOf({
      model: 'expression',
      expr: 'a + b*x',
      x: { x: [1, 2] },
      xNames: ['x'],
      y: [1, 2],
      params: { a: 0, b: 1 },
    });
    expect(err.message).toMatch(/too few points: 2 point\(s\) for 2 parameter\(s\)/);
    expect(err.details?.[0]?.path).toBe('y');
  });

  it('refuses a power law over duplicate x columns as singular', () => {
    const err = validationOf({ model: 'power-law', x: { a: x, b: [...x] }, xNames: ['a', 'b'], y });
    expect(err.message).toMatch(/singular/);
    expect(err.details?.[0]?.path).toBe('x');
  });

  it('reports a structurally singular expression as not converged, never as a result', () => {
    const result = fitModel({
      model: 'expression',
      expr: 'a*x + b*x',
      x: { x },
      xNames: ['x'],
      y,
      params: { a: 1, b: 1 },
    });
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/singular/);
    expect(result.parameters.every((p) => Number.isNaN(p.stdError))).toBe(true);
  });

  it('names unknown symbols of an expression', () => {
    const err = validationOf({
      model: 'expression',
      expr: 'a*x + k*exp(q)',
      x: { x },
      xNames: ['x'],
      y,
      params: { a: 1 },
    });
    expect(err.message).toMatch(/unknown symbol\(s\) k, q/);
    expect(err.details?.[0]?.path).toBe('expr');
  });

  it.each([
    ['b1*(x', /cannot be parsed/],
    ['a = x', /AssignmentNode is not allowed/],
    ['f(t) = t', /FunctionAssignmentNode is not allowed/],
    ['import({}, {})', /function import is not allowed/],
    ['createUnit("foo")', /function createUnit is not allowed/],
    ['evaluate("1+1")', /function evaluate is not allowed/],
    ['parse("x")', /function parse is not allowed/],
    ['a * x * 5 cm', /unknown symbol\(s\) cm/],
    ['a*[1,2][1]', /not allowed/],
  ])('rejects the expression %s', (expr, message) => {
    const err = validationOf({ model: 'expression', expr, x: { x }, xNames: ['x'], y, params: { a: 1 } });
    expect(err.message).toMatch(message);
  });

  it('rejects parameters that do not occur in the expression and missing start values', () => {
    expect(
      validationOf({ model: 'expression', expr: 'a*x', x: { x }, xNames: ['x'], y, params: { a: 1, c: 2 } }).details,
    ).toContainEqual({
      path: 'params.c',
      message: 'does not appear in expr, so it cannot be fitted',
    });
    expect(validationOf({ model: 'expression', expr: 'a*x', x: { x }, xNames: ['x'], y }).message).toMatch(
      /unknown symbol\(s\) a/,
    );
  });

  it('names the row of a non-positive value in a power law', () => {
    const err = validationOf({ model: 'power-law', x: { x }, xNames: ['x'], y: [1, 2, -3, 4, 5, 6] });
    expect(err.message).toMatch(/row 2 is -3/);
    const errX = validationOf({ model: 'power-law', x: { x: [1, 0, 3, 4, 5, 6] }, xNames: ['x'], y });
    expect(errX.details?.[0]?.path).toBe('x.x');
  });

  it('rejects missing columns, mismatched lengths, non-finite data and bad sigma', () => {
    expect(validationOf({ model: 'power-law', x: { x }, xNames: ['T'], y }).details?.[0]?.path).toBe('x.T');
    expect(validationOf({ model: 'power-law', x: { x: [1, 2] }, xNames: ['x'], y }).message).toMatch(
      /x.x: has 2 values, y has 6/,
    );
    expect(validationOf({ model: 'power-law', x: { x }, xNames: ['x'], y: [1, 2, NaN, 4, 5, 6] }).message).toMatch(
      /row 2 is not a finite number/,
    );
    expect(
      validationOf({ model: 'exponential', x: { x }, xNames: ['x'], y, sigma: [1, 1, 0, 1, 1, 1] }).message,
    ).toMatch(/weights: row 2: sigma must be > 0/);
    expect(validationOf({ model: 'exponential', x: { x, z: x }, xNames: ['x', 'z'], y }).message).toMatch(
      /exactly one x column/,
    );
    expect(validationOf({ model: 'power-law', x: { x }, xNames: ['x'], y, params: { D: 1 } }).details?.[0]?.path).toBe(
      'params.D',
    );
    expect(validationOf({ model: 'polytropic', x: { x }, xNames: ['x'], y, params: { gamma: -1 } }).message).toMatch(
      /outside the bounds/,
    );
  });

  it('reports a budget too small to converge as not converged', () => {
    const result = fitModel({
      model: 'expression',
      expr: 'b1*(1-exp(-b2*x))',
      x: { x },
      xNames: ['x'],
      y: [3, 5, 6.5, 7.4, 8, 8.4],
      params: { b1: 1, b2: 1 },
      maxIterations: 1,
    });
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/not converged/);
  });
});

describe('bounds', () => {
  it('stops at an active bound and says so', () => {
    // Unconstrained least squares for y ≈ b·x on these data gives b ≈ 2.03; bounded at 1.5 it must sit on the bound.
    const result = fitModel({
      model: 'expression',
      expr: 'b*x',
      x: { x },
      xNames: ['x'],
      y,
      params: { b: 1 },
      bounds: { b: { max: 1.5 } },
    });
    expect(result.converged).toBe(true);
    expect(result.parameters[0]!.value).toBe(1.5);
    expect(result.message).toMatch(/at a bound: b/);
  });

  it('rejects bounds on unknown parameters and inverted bounds', () => {
    expect(
      validationOf({
        model: 'expression',
        expr: 'b*x',
        x: { x },
        xNames: ['x'],
        y,
        params: { b: 1 },
        bounds: { c: { max: 1 } },
      }).details?.[0]?.path,
    ).toBe('bounds.c');
    expect(
      validationOf({
        model: 'expression',
        expr: 'b*x',
        x: { x },
        xNames: ['x'],
        y,
        params: { b: 1 },
        bounds: { b: { min: 2, max: 1 } },
      }).message,
    ).toMatch(/min \(2\) must be below max \(1\)/);
  });
});
