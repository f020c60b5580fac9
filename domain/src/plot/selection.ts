/**
 * Which values of a swept axis a plot draws when it cannot draw them all: up to `max` indices spread
 * evenly over 0…count−1, both ends included (so the range of the axis stays visible).
 */
export function evenlySpread(count: number, max: number): number[] {
  const n = Math.max(0, Math.floor(count));
  const limit = Math.max(1, Math.floor(max));
  if (n <= limit) return Array.from({ length: n }, (_, i) => i);
  if (limit === 1) return [0];
  const out = new Set<number>();
  for (let i = 0; i < limit; i++) out.add(Math.round((i * (n - 1)) / (limit - 1)));
  return [...out].sort((a, b) => a - b);
}
