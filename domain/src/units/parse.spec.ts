import { describe, expect, it } from 'vitest';
import { ValidationError } from '../errors.js';
import { parseQuantity } from './parse.js';

function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe('parseQuantity', () => {
  it('takes numbers and bare number strings as canonical', () => {
    expect(parseQuantity('inputs.Te_eV', 20, 'eV')).toBe(20);
    expect(parseQuantity('inputs.mu', '10', '1')).toBe(10);
    expect(parseQuantity('inputs.n_m3', '1e19', 'm^-3')).toBe(1e19);
    expect(parseQuantity('inputs.Er_Vm', ' -2.5 ', 'V/m')).toBe(-2.5);
  });

  // Unit definitions: SI / mathjs; 1 G = 1e-4 T (cgs–SI, NRL Plasma Formulary conversion table).
  it.each([
    ['20 eV', 'eV', 20],
    ['2 keV', 'eV', 2000],
    ['3 cm', 'm', 0.03],
    ['2 cm', 'm', 0.02],
    ['1500 G', 'T', 0.15],
    ['2 kG', 'T', 0.2],
    ['0.5 T', 'T', 0.5],
    ['1e13 cm^-3', 'm^-3', 1e19],
    ['5 kV/m', 'V/m', 5000],
    ['50 V/cm', 'V/m', 5000],
    ['-1.5 kV', 'V', -1500],
  ] as const)('reads %s as %s', (text, unit, expected) => {
    expect(parseQuantity('inputs.x', text, unit)).toBe(expected);
  });

  it('converts kelvin to eV with k_B/e', () => {
    // CODATA 2018: 1 eV ↔ 11604.51812 K (exact relationship).
    expect(rel(parseQuantity('inputs.Te_eV', '11604.51812 K', 'eV'), 1)).toBeLessThan(1e-9);
    expect(rel(parseQuantity('inputs.Te_eV', '1.2e5 K', 'eV'), 1.2e5 / 11604.51812)).toBeLessThan(1e-9);
  });

  it('rejects the wrong dimension naming the field and the unit', () => {
    const cases: [string, string][] = [
      ['3 cm', 'eV'],
      ['0.5 T', 'm'],
      ['20 eV', 'T'],
      ['2 m', '1'],
      ['5 kV', 'V/m'],
    ];
    for (const [text, unit] of cases) {
      let err: unknown;
      try {
        parseQuantity('inputs.f', text, unit);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(ValidationError);
      const d = (err as ValidationError).details!;
      expect(d).toHaveLength(1);
      expect(d[0]!.path).toBe('inputs.f');
      expect(d[0]!.message).toMatch(
        unit === '1' ? /dimensionless/ : new RegExp(`expected a quantity in ${unit.replace('^', '\\^')}`),
      );
    }
  });

  it('rejects unreadable text', () => {
    expect(() => parseQuantity('inputs.B_T', 'lots', 'T')).toThrow(ValidationError);
    expect(() => parseQuantity('inputs.B_T', '', 'T')).toThrow(/empty/);
    expect(() => parseQuantity('inputs.B_T', 'T', 'T')).toThrow(ValidationError);
    expect(() => parseQuantity('inputs.B_T', { v: 1 } as unknown as string, 'T')).toThrow(ValidationError);
  });
});

describe('energies in other units convert with the CODATA 2018 elementary charge', () => {
  // CODATA 2018 / SI 2019: e = 1.602176634e-19 C exactly, so 1 eV = 1.602176634e-19 J exactly.
  // (mathjs's own eV uses the older 1.602176565e-19 J, which would be off by 4.3e-8.)
  it('reads joules and ergs as eV exactly', () => {
    expect(parseQuantity('Te_eV', '1.602176634e-19 J', 'eV')).toBe(1);
    expect(parseQuantity('Te_eV', '1.602176634e-12 erg', 'eV')).toBeCloseTo(1, 14);
    expect(parseQuantity('Te_eV', '2 keV', 'eV')).toBe(2000);
  });
});
