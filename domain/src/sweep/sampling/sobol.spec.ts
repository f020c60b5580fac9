import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { MAX_SOBOL_DIMENSIONS, sobolCoordinate, sobolPoint } from './sobol.js';
import { JOE_KUO_ROWS } from './sobol-directions.js';

const refDir = new URL('../../../../tests/reference/sobol/', import.meta.url);

describe('Sobol sequence (Joe & Kuo new-joe-kuo-6.21201 direction numbers)', () => {
  it('embeds the published direction-number rows unchanged', () => {
    // Source: tests/reference/sobol/new-joe-kuo-6.21201-head.txt (copy of the published file's head).
    const lines = readFileSync(new URL('new-joe-kuo-6.21201-head.txt', refDir), 'utf8').trim().split('\n').slice(1);
    expect(lines.length).toBe(JOE_KUO_ROWS.length);
    lines.forEach((line, k) => {
      const [d, ...rest] = line.trim().split(/\s+/).map(Number);
      expect(d).toBe(k + 2);
      expect(JOE_KUO_ROWS[k]).toEqual(rest);
    });
    expect(MAX_SOBOL_DIMENSIONS).toBeGreaterThanOrEqual(16);
  });

  it('reproduces the published first points in 3-D', () => {
    // Source: tests/reference/sobol/first-points-3d.csv (Joe & Kuo example points as listed in the
    // SALib and OpenTURNS test suites; see the README there). Not from memory.
    const rows = readFileSync(new URL('first-points-3d.csv', refDir), 'utf8').trim().split('\n').slice(1);
    expect(rows.length).toBe(10);
    for (const row of rows) {
      const [i, ...x] = row.split(',').map(Number);
      expect(Array.from(sobolPoint(i!, 3))).toEqual(x);
    }
  });

  it('has the (t,s)-sequence stratification in each dimension', () => {
    // Textbook property (each 1-D projection of a Sobol sequence is a (0,1)-sequence, Niederreiter
    // 1992 §4.5): the first 2^k points put exactly one point in each dyadic interval of length 2^-k.
    for (let dim = 0; dim < MAX_SOBOL_DIMENSIONS; dim++) {
      for (const k of [1, 4, 10]) {
        const n = 2 ** k;
        const counts = new Uint32Array(n);
        for (let i = 0; i < n; i++) counts[Math.floor(sobolCoordinate(i, dim) * n)]! += 1;
        expect(
          counts.every((c) => c === 1),
          `dim ${dim + 1}, k ${k}`,
        ).toBe(true);
      }
      // Any block of 2^k consecutive points starting at a multiple of 2^k has the same property.
      const n = 256;
      const counts = new Uint32Array(n);
      for (let i = 5 * n; i < 6 * n; i++) counts[Math.floor(sobolCoordinate(i, dim) * n)]! += 1;
      expect(counts.every((c) => c === 1)).toBe(true);
    }
  });

  it('is a (0,2)-net in the first two dimensions: every elementary 2-D box of area 2^-m holds one point', () => {
    // Textbook property: the first two Sobol dimensions form a (0,2)-sequence (Sobol 1967;
    // Niederreiter 1992), so for m = 8 each box 2^-j × 2^-(m-j) holds exactly one of the first 2^m points.
    const m = 8;
    const n = 2 ** m;
    for (let j = 0; j <= m; j++) {
      const counts = new Uint32Array(n);
      for (let i = 0; i < n; i++) {
        const a = Math.floor(sobolCoordinate(i, 0) * 2 ** j);
        const b = Math.floor(sobolCoordinate(i, 1) * 2 ** (m - j));
        counts[a * 2 ** (m - j) + b]! += 1;
      }
      expect(
        counts.every((c) => c === 1),
        `j = ${j}`,
      ).toBe(true);
    }
  });

  it('computes distant points from the index and rejects bad arguments', () => {
    const x = sobolCoordinate(2 ** 32 - 1, 2);
    expect(x).toBeGreaterThanOrEqual(0);
    expect(x).toBeLessThan(1);
    expect(() => sobolCoordinate(0, MAX_SOBOL_DIMENSIONS)).toThrow(RangeError);
    expect(() => sobolCoordinate(2 ** 32, 0)).toThrow(RangeError);
  });
});
