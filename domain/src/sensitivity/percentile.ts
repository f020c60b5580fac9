/**
 * The q-quantile (0 ≤ q ≤ 1) of sorted values by linear interpolation between order statistics
 * (Hyndman & Fan 1996, definition 7; the default of R and NumPy — common practice).
 */
export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}
