import { mixKey } from '../sweep/sampling/hash.js';
import { quantileSorted } from './percentile.js';
import type { SaltelliOutputs } from './saltelli-outputs.js';

/**
 * First-order and total Sobol indices from a Saltelli design, with bootstrap confidence intervals.
 *
 * Estimators (A. Saltelli, P. Annoni, I. Azzini, F. Campolongo, M. Ratto, S. Tarantola, "Variance based
 * sensitivity analysis of model output. Design and estimator for the total sensitivity index",
 * Comput. Phys. Commun. 181 (2010) 259–270, Table 2):
 *   first order (Table 2 (b), Saltelli et al. 2010):  V_i  = (1/N) Σ_j f(B)_j · (f(A_B^i)_j − f(A)_j)
 *   total       (Table 2 (f), M. J. W. Jansen, "Analysis of variance designs for model output",
 *                Comput. Phys. Commun. 117 (1999) 35–43):  VT_i = (1/(2N)) Σ_j (f(A)_j − f(A_B^i)_j)²
 *   S_i = V_i / V(Y),  S_Ti = VT_i / V(Y),  V(Y) the variance of the 2N values f(A) ∪ f(B).
 * Outputs are centred on the mean of f(A) ∪ f(B) first: the estimators are unchanged in expectation and
 * the first-order sum no longer loses digits to a large mean (common practice).
 *
 * Confidence intervals: percentile bootstrap (B. Efron & R. J. Tibshirani, "An Introduction to the
 * Bootstrap", 1993, §13.3) over sample groups, resampled with replacement; resample r draws from a
 * Mulberry32 stream keyed by (seed, r) (a public-domain 32-bit generator, common practice), so the same
 * data give the same interval. Every estimator is a ratio of sums over groups, so a group's
 * sums are formed once and each resample only adds them. Above `maxUnits` groups, contiguous blocks of
 * groups are resampled instead (the work per resample stays bounded); the result says how many units.
 */

export interface SobolIndex {
  /** First-order index S_i; null when the output does not vary (V(Y) = 0). */
  first: number | null;
  firstCI: [number, number] | null;
  /** Total index S_Ti; null when the output does not vary. */
  total: number | null;
  totalCI: [number, number] | null;
}

export interface BootstrapSettings {
  /** Number of bootstrap resamples. */
  resamples: number;
  /** Two-sided confidence level of the percentile intervals. */
  level: number;
  seed: number;
  /** Resampled units: sample groups, or contiguous blocks of groups when there are more than maxUnits. */
  units: number;
}

export interface SobolEstimate {
  /** Complete sample groups used (N). */
  n: number;
  /** V(Y) of the output over f(A) ∪ f(B). */
  variance: number;
  indices: SobolIndex[];
  bootstrap: BootstrapSettings;
}

export interface SobolOptions {
  resamples?: number;
  level?: number;
  seed?: number;
  maxUnits?: number;
}

export const DEFAULT_RESAMPLES = 1000;
export const DEFAULT_LEVEL = 0.95;
export const DEFAULT_SEED = 1;
/** Bootstrap work ≈ resamples · units · (2d + 3) additions; this keeps it near a second at worst. */
const WORK_BUDGET = 2e8;
const MAX_UNITS = 2 ** 14;

interface Sums {
  count: Float64Array;
  y: Float64Array;
  y2: Float64Array;
  /** Per unit and input (unit-major): Σ f(B)(f(A_B^i) − f(A)) and Σ (f(A) − f(A_B^i))². */
  first: Float64Array;
  total: Float64Array;
}

function unitSums(o: SaltelliOutputs, units: number): Sums {
  const d = o.dims;
  const n = o.n;
  let mean = 0;
  for (let j = 0; j < n; j++) mean += o.fA[j]! + o.fB[j]!;
  mean /= 2 * n;
  const s: Sums = {
    count: new Float64Array(units),
    y: new Float64Array(units),
    y2: new Float64Array(units),
    first: new Float64Array(units * d),
    total: new Float64Array(units * d),
  };
  for (let u = 0; u < units; u++) {
    const j0 = Math.floor((u * n) / units);
    const j1 = Math.floor(((u + 1) * n) / units);
    let y = 0;
    let y2 = 0;
    for (let j = j0; j < j1; j++) {
      const a = o.fA[j]! - mean;
      const b = o.fB[j]! - mean;
      y += a + b;
      y2 += a * a + b * b;
      for (let i = 0; i < d; i++) {
        const ab = o.fAB[j * d + i]! - mean;
        s.first[u * d + i]! += b * (ab - a);
        s.total[u * d + i]! += (a - ab) * (a - ab);
      }
    }
    s.count[u] = j1 - j0;
    s.y[u] = y;
    s.y2[u] = y2;
  }
  return s;
}

/** Indices from summed terms; writes S_i and S_Ti into first/total at offset; returns V(Y). */
function ratios(
  count: number,
  y: number,
  y2: number,
  f: Float64Array,
  t: Float64Array,
  d: number,
  first: Float64Array,
  total: Float64Array,
  at: number,
): number {
  const m = y / (2 * count);
  const v = y2 / (2 * count) - m * m;
  for (let i = 0; i < d; i++) {
    first[at + i] = v > 0 ? f[i]! / count / v : Number.NaN;
    total[at + i] = v > 0 ? t[i]! / (2 * count) / v : Number.NaN;
  }
  return v;
}

function interval(values: Float64Array, level: number): [number, number] | null {
  const finite = values.filter((x) => Number.isFinite(x)).sort();
  if (finite.length === 0) return null;
  return [quantileSorted(finite, (1 - level) / 2), quantileSorted(finite, (1 + level) / 2)];
}

export function estimateSobolIndices(o: SaltelliOutputs, options: SobolOptions = {}): SobolEstimate {
  const d = o.dims;
  const resamples = options.resamples ?? DEFAULT_RESAMPLES;
  const level = options.level ?? DEFAULT_LEVEL;
  const seed = options.seed ?? DEFAULT_SEED;
  if (!Number.isInteger(resamples) || resamples < 1) throw new RangeError(`resamples ${resamples} must be ≥ 1`);
  if (!(level > 0 && level < 1)) throw new RangeError(`level ${level} must lie in (0, 1)`);
  if (o.n < 2) throw new RangeError(`at least 2 complete sample groups are needed, not ${o.n}`);
  const cap =
    options.maxUnits ?? Math.max(256, Math.min(MAX_UNITS, Math.floor(WORK_BUDGET / (resamples * (2 * d + 3)))));
  const units = Math.min(o.n, cap);
  const s = unitSums(o, units);

  // Point estimate over every group.
  const f = new Float64Array(d);
  const t = new Float64Array(d);
  let y = 0;
  let y2 = 0;
  for (let u = 0; u < units; u++) {
    y += s.y[u]!;
    y2 += s.y2[u]!;
    for (let i = 0; i < d; i++) {
      f[i]! += s.first[u * d + i]!;
      t[i]! += s.total[u * d + i]!;
    }
  }
  const first = new Float64Array(d);
  const total = new Float64Array(d);
  const variance = ratios(o.n, y, y2, f, t, d, first, total, 0);

  // Bootstrap: resample units with replacement.
  const bFirst = new Float64Array(resamples * d);
  const bTotal = new Float64Array(resamples * d);
  // One interleaved row per unit (count, Σy, Σy², first terms, total terms): one cache line per draw.
  const w = 3 + 2 * d;
  const packed = new Float64Array(units * w);
  for (let u = 0; u < units; u++) {
    packed[u * w] = s.count[u]!;
    packed[u * w + 1] = s.y[u]!;
    packed[u * w + 2] = s.y2[u]!;
    for (let i = 0; i < d; i++) {
      packed[u * w + 3 + i] = s.first[u * d + i]!;
      packed[u * w + 3 + d + i] = s.total[u * d + i]!;
    }
  }
  const acc = new Float64Array(w);
  for (let r = 0; r < resamples; r++) {
    let state = mixKey(seed, r, d) | 0;
    acc.fill(0);
    for (let k = 0; k < units; k++) {
      // Mulberry32 step.
      state = (state + 0x6d2b79f5) | 0;
      let z = Math.imul(state ^ (state >>> 15), 1 | state);
      z = (z + Math.imul(z ^ (z >>> 7), 61 | z)) ^ z;
      const base = Math.floor((((z ^ (z >>> 14)) >>> 0) / 4294967296) * units) * w;
      for (let c = 0; c < w; c++) acc[c] = acc[c]! + packed[base + c]!;
    }
    ratios(acc[0]!, acc[1]!, acc[2]!, acc.subarray(3, 3 + d), acc.subarray(3 + d), d, bFirst, bTotal, r * d);
  }

  const column = (b: Float64Array, i: number): Float64Array => {
    const c = new Float64Array(resamples);
    for (let r = 0; r < resamples; r++) c[r] = b[r * d + i]!;
    return c;
  };
  const varies = variance > 0;
  const indices: SobolIndex[] = Array.from({ length: d }, (_, i) => ({
    first: varies ? first[i]! : null,
    firstCI: varies ? interval(column(bFirst, i), level) : null,
    total: varies ? total[i]! : null,
    totalCI: varies ? interval(column(bTotal, i), level) : null,
  }));
  return { n: o.n, variance: Math.max(variance, 0), indices, bootstrap: { resamples, level, seed, units } };
}
