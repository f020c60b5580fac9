import { describe, expect, it } from 'vitest';
import { decodeFloat64, decodeUint32, encodeFloat64, encodeUint32 } from './chunk-codec.js';

describe('chunk codec (typed arrays as base64 through Redis)', () => {
  it('round-trips every value bit for bit, non-finite ones included, small and large', () => {
    for (const n of [0, 1, 3, 5000]) {
      const a = Float64Array.from({ length: n }, (_, i) => (i % 7 === 0 ? -0 : Math.sin(i) * 10 ** ((i % 40) - 20)));
      if (n > 3) a.set([Infinity, -Infinity, NaN, Number.MIN_VALUE], 0);
      const back = decodeFloat64(encodeFloat64(a));
      expect(back.length).toBe(n);
      expect(new Uint8Array(back.buffer, back.byteOffset, back.byteLength)).toEqual(new Uint8Array(a.buffer));
      const u = Uint32Array.from({ length: n }, (_, i) => (i * 2654435761) >>> 0);
      expect(Array.from(decodeUint32(encodeUint32(u)))).toEqual(Array.from(u));
    }
  });

  it('answers aligned, independent arrays: a small one is copied out of the shared pool', () => {
    const small = decodeFloat64(encodeFloat64(Float64Array.of(1, 2, 3)));
    expect(small.byteOffset % 8).toBe(0);
    expect(small.buffer.byteLength).toBe(24); // its own buffer, not a view into Node's 8 kB pool
    const large = decodeFloat64(encodeFloat64(new Float64Array(5000).fill(2.5)));
    expect(large.byteOffset % 8).toBe(0);
    expect(large.buffer.byteLength).toBe(40_000);
    // Views of distinct decodes never share memory.
    const again = decodeFloat64(encodeFloat64(new Float64Array(5000).fill(2.5)));
    again[0] = 7;
    expect(large[0]).toBe(2.5);
  });
});
