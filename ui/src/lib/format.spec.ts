import { describe, expect, it } from 'vitest';
import {
  formatBytes,
  formatCount,
  formatNumber,
  formatQuantity,
  fullPrecision,
  MINUS,
  numberTitle,
  prettyUnit,
  toSuperscript,
} from './format.js';

// Expected strings follow SPEC §12's own examples (`1.25 × 10⁴ m/s`, `0.0213 T`) and the common
// practice of scientific notation with significant figures (rounding half away from zero as
// Number.prototype.toExponential does for these exactly representable cases).
describe('formatNumber', () => {
  it('writes the spec examples', () => {
    expect(formatNumber(12500)).toBe('1.25 × 10⁴');
    expect(formatNumber(0.0213)).toBe('0.0213');
  });

  it('keeps 4 significant figures by default and drops trailing zeros', () => {
    expect(formatNumber(3.14159265)).toBe('3.142');
    expect(formatNumber(1234.5678)).toBe('1235');
    expect(formatNumber(2)).toBe('2');
    expect(formatNumber(0.001234567)).toBe('0.001235');
    expect(formatNumber(299792458)).toBe('2.998 × 10⁸'); // c in m/s (CODATA 2018, exact)
  });

  it('honours the sig argument', () => {
    expect(formatNumber(1.602176634e-19, 6)).toBe('1.60218 × 10⁻¹⁹'); // e in C (CODATA 2018, exact)
    expect(formatNumber(9.1093837015e-31, 2)).toBe('9.1 × 10⁻³¹'); // m_e in kg (CODATA 2018)
    expect(formatNumber(123456, 2)).toBe('1.2 × 10⁵');
    expect(() => formatNumber(1, 0)).toThrow(/sig must be an integer from 1 to 17/);
  });

  it('switches to powers of ten outside [10⁻³, 10⁴), judged after rounding', () => {
    expect(formatNumber(9999)).toBe('9999');
    expect(formatNumber(9999.7)).toBe('1 × 10⁴');
    expect(formatNumber(10000)).toBe('1 × 10⁴');
    expect(formatNumber(0.001)).toBe('0.001');
    expect(formatNumber(0.00099999)).toBe('0.001');
    expect(formatNumber(0.0009994)).toBe('9.994 × 10⁻⁴');
  });

  it('uses a typographic minus for negative values', () => {
    expect(formatNumber(-3.2e-7)).toBe(`${MINUS}3.2 × 10⁻⁷`);
    expect(formatNumber(-42.5)).toBe(`${MINUS}42.5`);
  });

  it('handles zero, NaN, infinities and missing values', () => {
    expect(formatNumber(0)).toBe('0');
    expect(formatNumber(-0)).toBe('0');
    expect(formatNumber(Number.NaN)).toBe('—');
    expect(formatNumber(null)).toBe('—');
    expect(formatNumber(undefined)).toBe('—');
    expect(formatNumber(Infinity)).toBe('∞');
    expect(formatNumber(-Infinity)).toBe(`${MINUS}∞`);
  });

  it('writes engineering notation with exponents in multiples of three', () => {
    expect(formatNumber(12500, 4, { notation: 'engineering' })).toBe('12.5 × 10³');
    expect(formatNumber(1.5e-7, 4, { notation: 'engineering' })).toBe('150 × 10⁻⁹');
    expect(formatNumber(4.56789e11, 4, { notation: 'engineering' })).toBe('456.8 × 10⁹');
    expect(formatNumber(2.5e6, 4, { notation: 'engineering' })).toBe('2.5 × 10⁶');
  });
});

describe('fullPrecision and numberTitle', () => {
  it('keeps every digit of the double for hover', () => {
    expect(fullPrecision(1.602176634e-19)).toBe('1.602176634e-19');
    expect(fullPrecision(0.1 + 0.2)).toBe('0.30000000000000004');
    expect(numberTitle(12500.123, 'm^-3')).toEqual({ title: '12500.123 m⁻³' });
    expect(fullPrecision(null)).toBe('');
  });
});

describe('prettyUnit', () => {
  it('turns mathjs exponents into superscripts', () => {
    expect(prettyUnit('m^-3')).toBe('m⁻³');
    expect(prettyUnit('cm^-3')).toBe('cm⁻³');
    expect(prettyUnit('m^2')).toBe('m²');
    expect(prettyUnit('m s^-1')).toBe('m s⁻¹');
    expect(prettyUnit('kg*m^2/s^2')).toBe('kg·m²/s²');
    expect(prettyUnit('m^(-3)')).toBe('m⁻³');
  });
  it('leaves plain units alone and hides the dimensionless 1', () => {
    expect(prettyUnit('m/s')).toBe('m/s');
    expect(prettyUnit('eV')).toBe('eV');
    expect(prettyUnit('1')).toBe('');
    expect(prettyUnit(undefined)).toBe('');
    expect(prettyUnit('ohm')).toBe('Ω');
    expect(prettyUnit('um')).toBe('µm');
  });
  it('does not mangle fractional exponents', () => {
    expect(prettyUnit('m^0.5')).toBe('m^0.5');
  });
});

describe('formatQuantity', () => {
  it('puts the unit beside the value', () => {
    expect(formatQuantity(12500, 'm/s')).toBe('1.25 × 10⁴ m/s');
    expect(formatQuantity(0.0213, 'T')).toBe('0.0213 T');
    expect(formatQuantity(1e19, 'm^-3')).toBe('1 × 10¹⁹ m⁻³');
    expect(formatQuantity(1.6667, '1')).toBe('1.667');
    expect(formatQuantity(Number.NaN, 'T')).toBe('—');
  });
});

describe('small helpers', () => {
  it('superscripts digits and signs only', () => {
    expect(toSuperscript('-19')).toBe('⁻¹⁹');
    expect(() => toSuperscript('x')).toThrow(/no superscript form/);
  });
  it('groups counts and sizes', () => {
    expect(formatCount(1550)).toBe('1,550');
    expect(formatCount(1000000)).toBe('1,000,000');
    expect(formatCount(999)).toBe('999');
    expect(formatBytes(512)).toBe('512 B');
    expect(formatBytes(1_500_000)).toBe('1.5 MB');
  });
});

describe('plainNumber (placeholders that parse back)', () => {
  it('writes large and small magnitudes in e-notation and keeps ordinary ones', async () => {
    const { plainNumber } = await import('./format.js');
    expect(plainNumber(1e19)).toBe('1e19');
    expect(plainNumber(2.5e-7)).toBe('2.5e-7');
    expect(plainNumber(0.02)).toBe('0.02');
    expect(plainNumber(39.66)).toBe('39.66');
    expect(plainNumber(0)).toBe('0');
  });
});

describe('percentages and counts that agree', () => {
  it('rounds a fraction down, one decimal below 10 %, never 100 % early and never a bare 0 after a start', async () => {
    const { formatPercent } = await import('./format.js');
    expect(formatPercent(0.025)).toBe('2.5 %'); // "Running · 2 %" beside 2.5 % disagreed
    expect(formatPercent(0.0299)).toBe('2.9 %');
    expect(formatPercent(0.29)).toBe('29 %'); // 0.29·100 = 28.999… in binary
    expect(formatPercent(0.4299)).toBe('42 %');
    expect(formatPercent(1549 / 1550)).toBe('99 %');
    expect(formatPercent(1)).toBe('100 %');
    expect(formatPercent(0)).toBe('0 %');
    expect(formatPercent(1 / 13950)).toBe('< 0.1 %');
    expect(formatPercent(Number.NaN)).toBe('—');
  });
  it('keeps counts below a million exact and rounds larger ones half up in words', async () => {
    const { formatCountWords } = await import('./format.js');
    expect(formatCountWords(13_950)).toBe('13,950');
    expect(formatCountWords(999_999)).toBe('999,999');
    expect(formatCountWords(2_000_000)).toBe('2 million');
    expect(formatCountWords(13_950_000)).toBe('14.0 million'); // not 13.9: 13.95 has no exact binary form
    expect(formatCountWords(1_234_567)).toBe('1.23 million');
    expect(formatCountWords(1_235_000)).toBe('1.24 million');
    expect(formatCountWords(50_000_000)).toBe('50 million');
    expect(formatCountWords(1_000_000_000_000)).toBe('1 trillion');
  });
});
