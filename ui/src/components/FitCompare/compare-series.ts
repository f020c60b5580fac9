import type { FitView } from '../../api/fits.js';

export type Pair = [number, number];

/**
 * Residuals of each fit against one shared axis: the first x column when every fit has the same one
 * (fits of the same data), else the fitted value. Points with a missing value are left out.
 */
export function residualSeries(fits: FitView[]): {
  axis: string;
  shared: boolean;
  series: { name: string; data: Pair[] }[];
} {
  const firstX = fits.map((f) => f.plot?.xNames[0]);
  const shared = firstX.length > 0 && firstX.every((x) => x !== undefined && x === firstX[0]);
  const axis = shared ? firstX[0]! : 'fitted value';
  return {
    axis,
    shared,
    series: fits.map((f) => {
      const p = f.plot;
      const data: Pair[] = [];
      if (p) {
        const xs = shared ? (p.x[axis] ?? []) : p.fitted;
        p.residuals.forEach((r, i) => {
          const x = xs[i];
          if (typeof r === 'number' && typeof x === 'number' && Number.isFinite(r) && Number.isFinite(x))
            data.push([x, r]);
        });
      }
      return { name: `#${f.id} ${f.model}`, data };
    }),
  };
}

/** Whether the fits are of the same data: same source and same y column. */
export function sameData(fits: FitView[]): boolean {
  return fits.every(
    (f) => f.source.kind === fits[0]!.source.kind && f.source.id === fits[0]!.source.id && f.y === fits[0]!.y,
  );
}

/** Indices of the lowest AIC and BIC (the preferred model by each criterion), or -1. */
export function bestBy(fits: FitView[], key: 'aic' | 'bic'): number {
  let best = -1;
  fits.forEach((f, i) => {
    const v = f[key];
    if (typeof v === 'number' && (best < 0 || v < (fits[best]![key] as number))) best = i;
  });
  return best;
}
