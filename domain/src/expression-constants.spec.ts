/**
 * The one constant scope shared by derived columns and fit expressions: CODATA 2018 values
 * (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021), as in constants.ts), under unambiguous names.
 */
import { describe, expect, it } from 'vitest';
import { ValidationError } from './errors.js';
import { AMBIGUOUS_E_MESSAGE, EXPRESSION_CONSTANTS, EXPRESSION_CONSTANT_VALUES } from './expression-constants.js';
import { fitModel } from './fit/index.js';

describe('expression constants', () => {
  it('hold the CODATA 2018 values (NIST allascii.txt, 2018 adjustment)', () => {
    expect(EXPRESSION_CONSTANT_VALUES).toEqual({
      q_e: 1.602176634e-19,
      m_e: 9.1093837015e-31,
      m_p: 1.67262192369e-27,
      m_u: 1.6605390666e-27,
      eps0: 8.8541878128e-12,
      mu0: 1.25663706212e-6,
      k_B: 1.380649e-23,
      c0: 299792458,
    });
    for (const c of EXPRESSION_CONSTANTS) expect(c.unit.length).toBeGreaterThan(0);
  });

  it('fit expressions use them and refuse a bare e with the same message', () => {
    // y = A·exp(−x·q_e/(k_B·T)) with T = 11604.518 K, i.e. x in eV over 1 eV: recover A = 3, T.
    const xs = Array.from({ length: 30 }, (_, i) => i * 0.1);
    const T = 11604.51812;
    const ys = xs.map((x) => 3 * Math.exp((-x * 1.602176634e-19) / (1.380649e-23 * T)));
    const fit = fitModel({
      model: 'expression',
      x: { x: xs },
      xNames: ['x'],
      y: ys,
      expr: 'A * exp(-x * q_e / (k_B * T))',
      params: { A: 1, T: 9000 },
    });
    const byName = Object.fromEntries(fit.parameters.map((p) => [p.name, p.value]));
    expect(byName.A).toBeCloseTo(3, 8);
    expect(byName.T! / T).toBeCloseTo(1, 8);
    let err: unknown;
    try {
      fitModel({ model: 'expression', x: { x: xs }, xNames: ['x'], y: ys, expr: 'A * e^(-x)', params: { A: 1 } });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ValidationError);
    expect((err as ValidationError).details!.map((d) => d.message)).toContain(AMBIGUOUS_E_MESSAGE);
    expect(AMBIGUOUS_E_MESSAGE).toMatch(/elementary charge.*Euler's number.*q_e.*exp\(1\)/s);
  });
});
