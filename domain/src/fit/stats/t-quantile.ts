/**
 * Student-t quantiles for confidence intervals. Method: the two-sided tail probability of t is the
 * regularized incomplete beta I_x(ν/2, 1/2) with x = ν/(ν + t²) (Abramowitz & Stegun 26.7.1 with
 * 26.5.27), evaluated by its continued fraction (modified Lentz; A&S 26.5.8); the quantile is found by
 * bisection on t, which is monotone, to full double precision. Small and dependency-free.
 */

/** ln Γ(x) for x > 0, Lanczos approximation (g = 7, 9 terms; ~1e-15 relative). */
export function lnGamma(x: number): number {
  const c = [
    0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
    12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
  ];
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - lnGamma(1 - x);
  const z = x - 1;
  let a = c[0]!;
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += c[i]! / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

/** Continued fraction for I_x(a, b), valid (fast) for x < (a+1)/(a+b+2). */
function betaContinuedFraction(a: number, b: number, x: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 10_000; m++) {
    const m2 = 2 * m;
    let num = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + num * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + num / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    num = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + num * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + num / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return h;
}

/** Regularized incomplete beta I_x(a, b). */
export function regularizedBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log1p(-x));
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(a, b, x)) / a;
  return 1 - (front * betaContinuedFraction(b, a, 1 - x)) / b;
}

/** P(|T| > t) for Student's t with ν degrees of freedom. */
export function tTwoSidedTail(t: number, dof: number): number {
  return regularizedBeta(dof / (dof + t * t), dof / 2, 0.5);
}

/**
 * The quantile t with P(T ≤ t) = p (p in (0.5, 1)), e.g. tQuantile(0.975, ν) for a 95 % interval.
 * Non-integer ν is allowed (weighted fits report an integer anyway). NaN for ν ≤ 0.
 */
export function tQuantile(p: number, dof: number): number {
  if (!(dof > 0) || !(p > 0.5 && p < 1)) return NaN;
  const tail = 2 * (1 - p);
  let lo = 0;
  let hi = 1;
  while (tTwoSidedTail(hi, dof) > tail) hi *= 2; // bracket: the tail falls as t grows
  for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    if (tTwoSidedTail(mid, dof) > tail) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
