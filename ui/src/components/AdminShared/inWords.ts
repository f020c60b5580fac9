import { formatCount } from '../../lib/format.js';

/** A count in words for meters: 950 → "950", 12_500 → "12.5 thousand", 2_000_000 → "2 million". */
export function inWords(n: number): string {
  if (!Number.isFinite(n)) return '—';
  const steps: [number, string][] = [
    [1e12, 'trillion'],
    [1e9, 'billion'],
    [1e6, 'million'],
    [1e3, 'thousand'],
  ];
  for (const [size, word] of steps) {
    if (Math.abs(n) >= size && Math.abs(n) >= 10_000) {
      const v = n / size;
      const text = Number.isInteger(v) ? String(v) : v.toFixed(v < 10 ? 2 : 1).replace(/\.?0+$/, '');
      return `${text} ${word}`;
    }
  }
  return formatCount(n);
}
