import { describe, expect, it } from 'vitest';
import { gridValues } from './axes.js';
import { compileSweep } from './compile.js';

describe('log grid axes hit exact decades', () => {
  it('1–1000 over 31 points gives exactly 10 and 100 (so an equality filter finds them)', () => {
    const v = gridValues('log', 1, 1000, 31);
    expect(v[0]).toBe(1);
    expect(v[10]).toBe(10);
    expect(v[20]).toBe(100);
    expect(v[30]).toBe(1000);
  });

  it('every representable decade inside an axis is exact, for many ranges and counts', () => {
    for (const [lo, hi] of [
      [1e-3, 1e3],
      [1e-20, 1e25],
      [1e15, 1e24],
      [0.01, 100],
    ] as const) {
      const decades = Math.round(Math.log10(hi / lo));
      for (const perDecade of [1, 2, 3, 5, 10, 20]) {
        const count = decades * perDecade + 1;
        const v = gridValues('log', lo, hi, count);
        for (let k = 0; k < count; k += perDecade) {
          const d = Math.round(Math.log10(lo)) + k / perDecade;
          expect(v[k]).toBe(Number(`1e${d}`));
        }
      }
    }
  });

  it('values between decades stay geometric to rounding and increase strictly', () => {
    for (const [lo, hi, count] of [
      [2, 2000, 7],
      [0.3, 7e5, 40],
      [1, 1000, 31],
    ] as const) {
      const v = gridValues('log', lo, hi, count);
      for (let k = 0; k < count; k++) {
        const expected = lo * (hi / lo) ** (k / (count - 1));
        expect(Math.abs(v[k]! - expected) / expected).toBeLessThan(4e-15);
        if (k) expect(v[k]!).toBeGreaterThan(v[k - 1]!);
      }
    }
  });

  it('a compiled sweep carries the exact decade into its points', () => {
    const s = compileSweep({
      name: 'decades',
      model: 'cross-field',
      axes: [{ param: 'Te_eV', kind: 'log', min: 1, max: 1000, count: 31 }],
      sampling: { kind: 'grid' },
    });
    expect(s.pointAt(10).Te_eV).toBe(10);
    expect(s.pointAt(20).Te_eV).toBe(100);
  });
});

describe('stored column budget', () => {
  it('refuses more derived columns than the 64 stored slots leave, naming the field and the limit', () => {
    const derived = Array.from({ length: 14 }, (_, i) => ({ name: `d${i}`, expr: 'Te_eV * 2' }));
    const def = {
      name: 'many',
      model: 'cross-field',
      axes: [{ param: 'Te_eV', kind: 'log', min: 1, max: 10, count: 2 }],
      sampling: { kind: 'grid' },
    };
    // cross-field 2.0.0 stores 14 inputs + 37 outputs = 51 columns: 13 derived fit, 14 do not.
    expect(() => compileSweep({ ...def, derived: derived.slice(0, 13) })).not.toThrow();
    expect(() => compileSweep({ ...def, derived })).toThrow(/at most 13 derived columns/);
  });
});
