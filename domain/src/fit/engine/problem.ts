import type { CompiledModel } from '../types.js';

// The weighted least-squares problem the optimisers work on: residuals and Jacobian, with reused buffers.

/** Residuals and Jacobian of the weighted problem r = w·(y − f), with reused buffers. */
export class Problem {
  readonly n: number;
  readonly p: number;
  readonly w: Float64Array;
  readonly scale: Float64Array;
  private readonly f: Float64Array;
  private readonly fPlus: Float64Array;
  private readonly fMinus: Float64Array;
  private readonly pTmp: Float64Array;
  /** Column-scaled weighted Jacobian kept from the last linearisation (QR destroys `jac`). */
  readonly jScaled: Float64Array;
  evaluations = 0;

  constructor(
    readonly model: CompiledModel,
    readonly y: Float64Array,
    sigma: Float64Array | undefined,
  ) {
    this.n = model.n;
    this.p = model.paramNames.length;
    this.w = new Float64Array(this.n);
    for (let i = 0; i < this.n; i++) this.w[i] = sigma ? 1 / sigma[i]! : 1;
    // Typical size of each parameter, for finite-difference steps and the library's scaled space.
    this.scale = model.start.map((v) => (v !== 0 && Number.isFinite(v) ? Math.abs(v) : 1));
    this.f = new Float64Array(this.n);
    this.fPlus = new Float64Array(this.n);
    this.fMinus = new Float64Array(this.n);
    this.pTmp = new Float64Array(this.p);
    this.jScaled = new Float64Array(this.n * this.p);
  }

  /** Fills r with w·(y − f(p)); returns Σ r² (NaN if any point is not finite). */
  residuals(params: Float64Array, r: Float64Array): number {
    this.evaluations++;
    this.model.evaluate(params, this.f);
    let sum = 0;
    for (let i = 0; i < this.n; i++) {
      const ri = this.w[i]! * (this.y[i]! - this.f[i]!);
      r[i] = ri;
      sum += ri * ri;
    }
    return Number.isFinite(sum) ? sum : NaN;
  }

  /** Column-major weighted model Jacobian w·∂f/∂p: analytic, else central differences. */
  jacobian(params: Float64Array, jac: Float64Array): void {
    const { n, p } = this;
    if (this.model.jacobian) {
      this.model.jacobian(params, jac);
    } else {
      const { min, max } = this.model;
      for (let j = 0; j < p; j++) {
        this.pTmp.set(params);
        // Relative step ∛ε·|p| balances truncation O(h²) against rounding O(ε/h).
        let h = 6.055454e-6 * Math.max(Math.abs(params[j]!), 1e-3 * this.scale[j]!);
        let up = params[j]! + h <= max[j]!;
        let down = params[j]! - h >= min[j]!;
        if (!up && !down) {
          // Bounds closer than the step on both sides: a one-sided difference into the wider room.
          const roomUp = max[j]! - params[j]!;
          const roomDown = params[j]! - min[j]!;
          up = roomUp >= roomDown;
          down = !up;
          h = Math.max(roomUp, roomDown) / 2;
        }
        this.pTmp[j] = up ? params[j]! + h : params[j]!;
        this.model.evaluate(this.pTmp, this.fPlus);
        this.pTmp[j] = down ? params[j]! - h : params[j]!;
        this.model.evaluate(this.pTmp, this.fMinus);
        const span = (up ? h : 0) + (down ? h : 0);
        const off = j * n;
        for (let i = 0; i < n; i++) jac[off + i] = (this.fPlus[i]! - this.fMinus[i]!) / span;
      }
      this.evaluations += 2 * p;
    }
    for (let j = 0; j < p; j++) {
      const off = j * n;
      for (let i = 0; i < n; i++) jac[off + i] = jac[off + i]! * this.w[i]!;
    }
  }

  clamp(params: Float64Array): void {
    for (let j = 0; j < this.p; j++) params[j] = Math.min(Math.max(params[j]!, this.model.min[j]!), this.model.max[j]!);
  }
}

export function sumSquares(y: Float64Array, w: Float64Array): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += (w[i]! * y[i]!) ** 2;
  return s;
}
