/**
 * Small dense linear algebra for least squares with few parameters (p ≲ 20) and many rows.
 * Householder QR reduces the n×p problem to p×p, a one-sided Jacobi SVD of R then gives
 * singular values to full relative accuracy, so rank decisions and the covariance never go
 * through the explicitly squared normal matrix JᵀJ.
 */

/**
 * Householder QR of the column-major n×p matrix `a` (a[j*n + i] = A[i][j]), in place.
 * Applies the same reflections to `b` (length n). Returns R (p×p, row-major upper triangle).
 * Afterwards b[0..p) holds Qᵀb restricted to the column space and b[p..n) the orthogonal part.
 */
export function householderQr(a: Float64Array, n: number, p: number, b: Float64Array): Float64Array {
  const r = new Float64Array(p * p);
  for (let k = 0; k < p; k++) {
    const col = k * n;
    let sq = 0;
    for (let i = k; i < n; i++) sq += a[col + i]! * a[col + i]!;
    const norm = Math.sqrt(sq);
    if (norm === 0) {
      r[k * p + k] = 0;
      continue;
    }
    const alpha = a[col + k]! > 0 ? -norm : norm;
    // v = x - alpha e1, stored in place; vᵀv = 2 norm (norm + |x_k|)
    a[col + k] = a[col + k]! - alpha;
    const vtv = 2 * norm * (norm + Math.abs(a[col + k]! + alpha));
    if (vtv === 0) continue;
    for (let j = k + 1; j < p; j++) {
      const cj = j * n;
      let dot = 0;
      for (let i = k; i < n; i++) dot += a[col + i]! * a[cj + i]!;
      const f = (2 * dot) / vtv;
      for (let i = k; i < n; i++) a[cj + i] = a[cj + i]! - f * a[col + i]!;
    }
    let dotb = 0;
    for (let i = k; i < n; i++) dotb += a[col + i]! * b[i]!;
    const fb = (2 * dotb) / vtv;
    for (let i = k; i < n; i++) b[i] = b[i]! - fb * a[col + i]!;
    r[k * p + k] = alpha;
    for (let j = k + 1; j < p; j++) r[k * p + j] = a[j * n + k]!;
  }
  return r;
}

export interface Svd {
  /** Left singular vectors, p×p row-major (u[i*p + k] = U[i][k]). */
  u: Float64Array;
  /** Singular values, not sorted. */
  s: Float64Array;
  /** Right singular vectors, p×p row-major. */
  v: Float64Array;
}

/** One-sided Jacobi SVD of a square p×p row-major matrix (Hestenes). */
export function jacobiSvd(m: Float64Array, p: number): Svd {
  // Work on the columns of W = M·V; at convergence W = U·Σ.
  const w = Float64Array.from(m);
  const v = new Float64Array(p * p);
  for (let i = 0; i < p; i++) v[i * p + i] = 1;
  for (let sweep = 0; sweep < 60; sweep++) {
    let rotated = false;
    for (let j = 0; j < p - 1; j++) {
      for (let k = j + 1; k < p; k++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let i = 0; i < p; i++) {
          const wj = w[i * p + j]!;
          const wk = w[i * p + k]!;
          alpha += wj * wj;
          beta += wk * wk;
          gamma += wj * wk;
        }
        if (gamma === 0 || Math.abs(gamma) <= 1e-15 * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = Math.sign(zeta || 1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let i = 0; i < p; i++) {
          const wj = w[i * p + j]!;
          const wk = w[i * p + k]!;
          w[i * p + j] = c * wj - s * wk;
          w[i * p + k] = s * wj + c * wk;
          const vj = v[i * p + j]!;
          const vk = v[i * p + k]!;
          v[i * p + j] = c * vj - s * vk;
          v[i * p + k] = s * vj + c * vk;
        }
      }
    }
    if (!rotated) break;
  }
  const s = new Float64Array(p);
  const u = new Float64Array(p * p);
  for (let k = 0; k < p; k++) {
    let norm = 0;
    for (let i = 0; i < p; i++) norm = Math.hypot(norm, w[i * p + k]!);
    s[k] = norm;
    for (let i = 0; i < p; i++) u[i * p + k] = norm > 0 ? w[i * p + k]! / norm : 0;
  }
  return { u, s, v };
}

/** Reciprocal condition number σ_min/σ_max (0 when all singular values vanish). */
export function reciprocalCondition(s: Float64Array): number {
  let max = 0;
  let min = Infinity;
  for (const x of s) {
    if (x > max) max = x;
    if (x < min) min = x;
  }
  return max > 0 ? min / max : 0;
}

/**
 * Least squares min ‖A x − b‖ for a column-major n×p matrix (copied, not modified).
 * Columns are scaled to unit norm first so the rank test sees collinearity, not units.
 * Returns null when the scaled matrix is rank-deficient (σ_min/σ_max below `rcondLimit`).
 */
export function solveLeastSquares(
  aIn: Float64Array,
  n: number,
  p: number,
  bIn: ArrayLike<number>,
  rcondLimit = 1e-11,
): { x: Float64Array; rcond: number } | null {
  const a = Float64Array.from(aIn);
  const b = Float64Array.from(bIn);
  const scale = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let sq = 0;
    for (let i = 0; i < n; i++) sq += a[j * n + i]! * a[j * n + i]!;
    const norm = Math.sqrt(sq);
    scale[j] = norm > 0 ? norm : 1;
    for (let i = 0; i < n; i++) a[j * n + i] = a[j * n + i]! / scale[j]!;
  }
  const r = householderQr(a, n, p, b);
  const { u, s, v } = jacobiSvd(r, p);
  const rcond = reciprocalCondition(s);
  if (!(rcond >= rcondLimit)) return null;
  const x = new Float64Array(p);
  for (let k = 0; k < p; k++) {
    let utb = 0;
    for (let i = 0; i < p; i++) utb += u[i * p + k]! * b[i]!;
    const coef = utb / s[k]!;
    for (let j = 0; j < p; j++) x[j] = x[j]! + v[j * p + k]! * coef;
  }
  for (let j = 0; j < p; j++) x[j] = x[j]! / scale[j]!;
  return { x, rcond };
}
