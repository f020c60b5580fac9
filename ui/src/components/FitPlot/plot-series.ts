import type { FitPlotData } from '../FitResult/fit-types.js';

export type Pair = [number, number];

export interface FitPlotSeries {
  /** 'curve': data and fitted curve against the one x; 'parity': predicted against observed. */
  kind: 'curve' | 'parity';
  xLabel: string;
  yLabel: string;
  observed: Pair[];
  fitted: Pair[];
  residuals: Pair[];
  residualXLabel: string;
  /** True when every plotted value is > 0, so log axes are possible. */
  logOk: boolean;
}

const ok = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

/**
 * What the fit plots draw. One x: data, the fitted curve (points in x order) and residuals against x.
 * Several x: predicted against observed (|y| when y is negative everywhere, so log–log works) with
 * residuals against the prediction.
 */
export function fitPlotSeries(plot: FitPlotData, yName: string): FitPlotSeries {
  const n = plot.y.length;
  if (plot.xNames.length === 1) {
    const xs = plot.x[plot.xNames[0]!] ?? [];
    const observed: Pair[] = [];
    const fitted: Pair[] = [];
    const residuals: Pair[] = [];
    for (let i = 0; i < n; i++) {
      const x = xs[i];
      if (!ok(x)) continue;
      if (ok(plot.y[i])) observed.push([x, plot.y[i]!]);
      if (ok(plot.fitted[i])) fitted.push([x, plot.fitted[i]!]);
      if (ok(plot.residuals[i])) residuals.push([x, plot.residuals[i]!]);
    }
    fitted.sort((a, b) => a[0] - b[0]);
    const logOk = observed.every(([x, y]) => x > 0 && y > 0) && fitted.every(([, y]) => y > 0);
    return {
      kind: 'curve',
      xLabel: plot.xNames[0]!,
      yLabel: yName,
      observed,
      fitted,
      residuals,
      residualXLabel: plot.xNames[0]!,
      logOk,
    };
  }
  const negative = plot.y.every((v) => !ok(v) || v < 0);
  const sign = negative ? -1 : 1;
  const observed: Pair[] = [];
  const residuals: Pair[] = [];
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const y = plot.y[i];
    const f = plot.fitted[i];
    if (!ok(y) || !ok(f)) continue;
    observed.push([sign * y, sign * f]);
    lo = Math.min(lo, sign * y, sign * f);
    hi = Math.max(hi, sign * y, sign * f);
    if (ok(plot.residuals[i])) residuals.push([f, plot.residuals[i]!]);
  }
  const label = negative ? `|${yName}|` : yName;
  const fitted: Pair[] = observed.length
    ? [
        [lo, lo],
        [hi, hi],
      ]
    : [];
  const logOk = observed.every(([a, b]) => a > 0 && b > 0);
  return {
    kind: 'parity',
    xLabel: `observed ${label}`,
    yLabel: `predicted ${label}`,
    observed,
    fitted,
    residuals,
    residualXLabel: `predicted ${yName}`,
    logOk,
  };
}
