import { formatCount } from '../../lib/format.js';

/**
 * What the Saltelli design costs, in words: N sample groups of d + 2 points each (matrices A and B
 * and one A_B^(i) per swept input; Saltelli et al. 2010).
 */
export function saltelliExplained(samplesText: string, axes: number): string {
  const n = Number(samplesText.trim());
  const what =
    'Sensitivity design for the Sensitivity tab: each sample group runs the model at two random points and at ' +
    'one point per swept input that mixes them, so N groups cost N × (inputs + 2) points.';
  if (!Number.isInteger(n) || n < 1 || axes < 1) return `${what} Powers of 2 (512, 1024, …) balance best.`;
  const power = Number.isInteger(Math.log2(n));
  return (
    `${what} Here ${formatCount(n)} × (${axes} + 2) = ${formatCount(n * (axes + 2))} points.` +
    (power ? '' : ` Powers of 2 (e.g. ${formatCount(2 ** Math.round(Math.log2(n)))}) balance best.`)
  );
}
