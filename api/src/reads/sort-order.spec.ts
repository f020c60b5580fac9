import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { OrderBuilder } from './sort-order.js';

/**
 * The radix order must equal the SQL it replaces (results-query.ts compileSort): NULLs last in either
 * direction, values ascending or descending, ties in index order. Reference: a comparator sort on
 * the same pairs (common practice: a straightforward oracle for an optimised sort).
 */
function reference(values: (number | null)[], desc: boolean): number[] {
  const idx = values.map((_, i) => i);
  return idx.sort((a, b) => {
    const va = values[a]!;
    const vb = values[b]!;
    const na = va === null || Number.isNaN(va);
    const nb = vb === null || Number.isNaN(vb);
    if (na || nb) return na === nb ? a - b : na ? 1 : -1;
    if (va !== vb) return desc ? vb - va : va - vb;
    return a - b;
  });
}

function radix(values: (number | null)[], desc: boolean): number[] {
  const b = new OrderBuilder(4);
  values.forEach((v, i) => b.push(i, v));
  return Array.from(b.sort(desc));
}

describe('OrderBuilder (sorted order of a results view)', () => {
  it('orders negatives, zeros of both signs, subnormals, huge values and NULLs like SQLite', () => {
    const values = [3, -1, null, 0, -0, 5e-324, -5e-324, 1.7976931348623157e308, -2.5, null, 3, -1e-300];
    expect(radix(values, false)).toEqual(reference(values, false));
    expect(radix(values, true)).toEqual(reference(values, true));
    // ties (3 at 0 and 10; 0 and -0 at 3 and 4) stay in index order in both directions
    expect(radix(values, true).slice(1, 3)).toEqual([0, 10]);
  });

  it('matches a comparator sort on arbitrary doubles and NULLs (property)', () => {
    const value = fc.oneof(fc.double({ noNaN: false }), fc.constant(null), fc.integer({ min: -3, max: 3 }));
    fc.assert(
      fc.property(fc.array(value, { maxLength: 300 }), fc.boolean(), (vals, desc) => {
        const v = vals.map((x) => (x === null || Number.isFinite(x) ? x : null));
        expect(radix(v, desc)).toEqual(reference(v, desc));
      }),
      { seed: 14, numRuns: 200 },
    );
  });

  it('grows past its first capacity and returns a shareable order', () => {
    const b = new OrderBuilder(16);
    for (let i = 0; i < 10_000; i++) b.push(i, (i * 7919) % 1000);
    const out = b.sort(false);
    expect(out.length).toBe(10_000);
    expect(out.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(b.size).toBe(10_000);
    for (let k = 1; k < out.length; k++) {
      const a = (out[k - 1]! * 7919) % 1000;
      const c = (out[k]! * 7919) % 1000;
      expect(a < c || (a === c && out[k - 1]! < out[k]!)).toBe(true);
    }
  });

  it('handles an empty view', () => {
    expect(Array.from(new OrderBuilder().sort(true))).toEqual([]);
  });
});
