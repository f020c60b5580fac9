/**
 * The electron-retardation region of a single-probe trace: from the lowest voltage up to the knee,
 * where the electron current stops growing exponentially (near the plasma potential). The knee is taken
 * where the smoothed dI/dV peaks: I'' > 0 throughout the retardation region and turns negative into
 * electron saturation, so dI/dV is largest at the knee (Hutchinson, Principles of Plasma Diagnostics,
 * electric probes chapter; from memory). Smoothing: a local straight line over a window of points.
 */
export interface ProbeRegion {
  vMin: number;
  vMax: number;
  automatic: boolean;
}

export function retardationRegion(v: ArrayLike<number>, current: ArrayLike<number>): ProbeRegion {
  const n = v.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => v[a]! - v[b]!);
  const vs = order.map((i) => v[i]!);
  const is = order.map((i) => current[i]!);
  const vMin = vs[0] ?? NaN;
  const last = vs[n - 1] ?? NaN;
  if (n < 8) return { vMin, vMax: last, automatic: true };
  const half = Math.max(2, Math.round(n / 30));
  let best = -Infinity;
  let knee = n - 1;
  for (let k = half; k < n - half; k++) {
    let sx = 0;
    let sy = 0;
    let sxx = 0;
    let sxy = 0;
    const m = 2 * half + 1;
    for (let q = k - half; q <= k + half; q++) {
      sx += vs[q]!;
      sy += is[q]!;
      sxx += vs[q]! * vs[q]!;
      sxy += vs[q]! * is[q]!;
    }
    const slope = (m * sxy - sx * sy) / (m * sxx - sx * sx);
    if (slope > best) {
      best = slope;
      knee = k;
    }
  }
  // A peak in the last window means the trace never leaves the retardation region: keep every point.
  if (knee >= n - half - 1) return { vMin, vMax: last, automatic: true };
  return { vMin, vMax: vs[knee]!, automatic: true };
}
