/** Small statistics helpers for the bench (no dependencies). */

export function median(xs: number[]): number {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** Nearest-rank percentile (p in 0..100). */
export function percentile(xs: number[], p: number): number {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const rank = Math.min(s.length, Math.max(1, Math.ceil((p / 100) * s.length)));
  return s[rank - 1]!;
}

export function max(xs: number[]): number {
  return xs.length ? Math.max(...xs) : NaN;
}

/** Runs fn `runs` times and returns every timing in ms plus the last value. */
export async function timed<T>(runs: number, fn: () => Promise<T> | T): Promise<{ ms: number[]; last: T }> {
  const ms: number[] = [];
  let last!: T;
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    last = await fn();
    ms.push(performance.now() - t0);
  }
  return { ms, last };
}
