import { describe, expect, it } from 'vitest';
import { compileSweep } from '../compile.js';
import { safeParseSweepDefinition } from '../parse.js';
import { MAX_SALTELLI_DIMENSIONS, saltelliCoordinate, saltelliPointCount, saltelliRole } from './saltelli.js';
import { sobolCoordinate } from './sobol.js';

describe('Saltelli design (Saltelli et al. 2010 §3: matrices A, B and A_B^(i))', () => {
  it('lays out each sample group as A, A_B^(1..d), B from one 2d-dimensional Sobol point', () => {
    const d = 4;
    for (const j of [0, 1, 2, 37, 1000]) {
      const a = Array.from({ length: d }, (_, i) => sobolCoordinate(j, i));
      const b = Array.from({ length: d }, (_, i) => sobolCoordinate(j, d + i));
      const row = (r: number) => Array.from({ length: d }, (_, i) => saltelliCoordinate(j * (d + 2) + r, i, d));
      expect(row(0)).toEqual(a);
      expect(row(d + 1)).toEqual(b);
      for (let k = 0; k < d; k++) {
        // A_B^(k): column k from B, every other column from A.
        expect(row(1 + k)).toEqual(a.map((x, i) => (i === k ? b[k] : x)));
        expect(saltelliRole(j * (d + 2) + 1 + k, d)).toEqual({ group: j, matrix: 'AB', input: k });
      }
      expect(saltelliRole(j * (d + 2), d)).toEqual({ group: j, matrix: 'A', input: -1 });
      expect(saltelliRole(j * (d + 2) + d + 1, d)).toEqual({ group: j, matrix: 'B', input: -1 });
    }
    expect(saltelliPointCount(1024, 4)).toBe(1024 * 6);
  });

  it('keeps the Sobol stratification in every column of A and B over 2^k groups', () => {
    // Each 1-D projection of a Sobol sequence is a (0,1)-sequence (Niederreiter 1992 §4.5): the first
    // 2^k rows of A (and of B) put one value in each interval of length 2^-k.
    const d = 3;
    const n = 256;
    for (const r of [0, d + 1]) {
      for (let i = 0; i < d; i++) {
        const counts = new Uint32Array(n);
        for (let j = 0; j < n; j++) counts[Math.floor(saltelliCoordinate(j * (d + 2) + r, i, d) * n)]! += 1;
        expect(counts.every((c) => c === 1)).toBe(true);
      }
    }
  });

  it('rejects dimensions and indices outside the design', () => {
    expect(() => saltelliCoordinate(0, 0, MAX_SALTELLI_DIMENSIONS + 1)).toThrow(RangeError);
    expect(() => saltelliCoordinate(0, 3, 3)).toThrow(RangeError);
    expect(() => saltelliCoordinate(-1, 0, 3)).toThrow(RangeError);
    expect(MAX_SALTELLI_DIMENSIONS).toBeGreaterThanOrEqual(8);
  });
});

describe('sampling kind "saltelli" in a sweep definition', () => {
  const def = (samples: number, axes: unknown[]) => ({
    name: 'Sensitivity',
    model: 'cross-field',
    axes,
    sampling: { kind: 'saltelli', samples },
  });
  const axes = [
    { param: 'Te_eV', kind: 'linear', min: 2, max: 40 },
    { param: 'B_T', kind: 'log', min: 0.01, max: 1 },
    { param: 'Ln_m', kind: 'linear', min: 1, max: 10, unit: 'cm' },
  ];

  it('runs N·(d + 2) points, pure in the index, log axes in log space, units applied', () => {
    const c = compileSweep(def(64, axes));
    expect(c.totalPoints).toBe(64 * 5);
    for (const p of [0, 1, 7, 100, 319]) {
      const x = c.pointAt(p);
      expect(x.Te_eV).toBeCloseTo(2 + 38 * saltelliCoordinate(p, 0, 3), 12);
      expect(Math.log(x.B_T!)).toBeCloseTo(Math.log(0.01) + Math.log(100) * saltelliCoordinate(p, 1, 3), 12);
      expect(x.Ln_m).toBeCloseTo(0.01 + 0.09 * saltelliCoordinate(p, 2, 3), 12);
    }
    // Chunks agree with single points wherever they start.
    const chunk = c.evaluateChunk(93, 140);
    for (let k = 0; k < chunk.n; k++) expect(chunk.columns.B_T![k]).toBe(c.pointAt(93 + k).B_T);
  });

  it('names the samples field when N·(d + 2) exceeds the point limit, and too many axes', () => {
    const r = safeParseSweepDefinition(def(9_000_000, [...axes, { param: 'Ti_eV', kind: 'linear', min: 1, max: 10 }]));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      const e = r.errors.find((x) => x.path === 'sampling.samples');
      expect(e?.message).toBe(
        '9,000,000 samples × (4 axes + 2) make 54,000,000 points; at most 50,000,000 are allowed',
      );
    }
    const many = Array.from({ length: MAX_SALTELLI_DIMENSIONS + 1 }, (_, i) => ({
      param: `p${i}`,
      kind: 'linear',
      min: 0,
      max: 1,
    }));
    const m = safeParseSweepDefinition(def(10, many));
    expect(m.ok).toBe(false);
    if (!m.ok) expect(m.errors.some((x) => x.path === 'axes' && /at most 15 axes/.test(x.message))).toBe(true);
  });
});
