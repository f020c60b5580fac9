import { lnGamma } from './t-quantile.js';

/**
 * Upper-tail probability of χ² with ν degrees of freedom, P(X > x) = Q(ν/2, x/2), the regularized upper
 * incomplete gamma function: by its series below a + 1 (A&S 6.5.29) and its continued fraction above
 * (A&S 6.5.31, modified Lentz), each summed to double precision.
 */
export function chiSquareUpperTail(x: number, dof: number): number {
  if (!(dof > 0) || Number.isNaN(x)) return NaN;
  if (x <= 0) return 1;
  if (x === Infinity) return 0;
  const a = dof / 2;
  const z = x / 2;
  const front = Math.exp(-z + a * Math.log(z) - lnGamma(a));
  if (z < a + 1) {
    // P(a, z) = e^(−z) z^a / Γ(a) · Σ z^k / (a (a+1) … (a+k))
    let term = 1 / a;
    let sum = term;
    for (let k = 1; k < 100_000; k++) {
      term *= z / (a + k);
      sum += term;
      if (term < sum * 1e-17) break;
    }
    return Math.max(0, 1 - front * sum);
  }
  const tiny = 1e-300;
  let b = z + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 100_000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return front * h;
}
