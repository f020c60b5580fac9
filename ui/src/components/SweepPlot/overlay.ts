/**
 * Pure logic of the dataset overlay on a sweep's line plot: which dataset columns can go on which
 * axis, whether their units agree with the plot's, and which points survive a log axis.
 *
 * Both sides are in canonical units (SI, temperatures and energies in eV), so no conversion happens
 * here: a column either has the plot axis's unit and is drawn as stored, or it does not and the
 * overlay is refused with a warning (drawing volts against metres would be a picture of nothing).
 */
import type { DatasetColumn, DatasetSeries } from '@driftgrid/domain';

export interface PlotAxisUnits {
  x: { name: string; unit: string };
  y: { name: string; unit: string };
}

export interface OverlayScales {
  x: boolean;
  y: boolean;
}

/**
 * A unit string as a map from unit symbol to power, so that `V/m`, `V / m` and `V m^-1` compare
 * equal, and `1`, `''` and `dimensionless` all mean "no unit". Reads the forms our canonical units
 * and mathjs's SI fallback use: factors separated by spaces, `*` or `·`, powers as `^p`, and
 * everything after a `/` in the denominator.
 */
export function unitPowers(unit: string | null | undefined): Map<string, number> {
  const powers = new Map<string, number>();
  const text = (unit ?? '').trim();
  if (text === '' || text === '1' || text === 'dimensionless') return powers;
  const parts = text.replace(/[()]/g, ' ').split('/');
  parts.forEach((part, i) => {
    const sign = i === 0 ? 1 : -1;
    for (const token of part.split(/[\s*·]+/).filter(Boolean)) {
      const m = /^([^\s^]+?)(?:\^([+-]?\d+(?:\.\d+)?))?$/.exec(token);
      const symbol = m?.[1] ?? token;
      const power = sign * (m?.[2] ? Number(m[2]) : 1);
      if (symbol === '1') continue;
      powers.set(symbol, (powers.get(symbol) ?? 0) + power);
    }
  });
  for (const [k, v] of powers) if (v === 0) powers.delete(k);
  return powers;
}

/** True when two canonical unit strings name the same unit (written either way). */
export function sameUnit(a: string | null | undefined, b: string | null | undefined): boolean {
  const pa = unitPowers(a);
  const pb = unitPowers(b);
  if (pa.size !== pb.size) return false;
  for (const [k, v] of pa) if (pb.get(k) !== v) return false;
  return true;
}

/** A unit for a sentence: "dimensionless" rather than an empty string. */
export function describeUnit(unit: string | null | undefined): string {
  return unitPowers(unit).size === 0 ? 'dimensionless' : (unit ?? '').trim();
}

/** Columns an overlay can use: numeric ones only (text columns cannot be plotted). */
export function numericColumns(columns: readonly DatasetColumn[]): DatasetColumn[] {
  return columns.filter((c) => c.kind === 'number');
}

/**
 * Default x and y columns for a dataset on a plot: the first numeric column in the plot's x unit,
 * and the first other numeric column in the plot's y unit. Where no column matches, the first
 * (for x) or the first remaining (for y) numeric column, so the user sees what the dataset holds
 * and the mismatch warning explains why it is not drawn. null when the dataset has no numbers.
 */
export function defaultOverlayColumns(
  columns: readonly DatasetColumn[],
  plot: { xUnit: string; yUnit: string },
): { x: string | null; y: string | null } {
  const nums = numericColumns(columns);
  if (nums.length === 0) return { x: null, y: null };
  const x = nums.find((c) => sameUnit(c.canonicalUnit, plot.xUnit)) ?? nums[0];
  const rest = nums.length > 1 ? nums.filter((c) => c !== x) : nums;
  const y = rest.find((c) => sameUnit(c.canonicalUnit, plot.yUnit)) ?? rest[0];
  return { x: x.name, y: y.name };
}

/** One sentence per axis whose units differ, e.g. "the dataset's x (r) is in m, the plot's x (Te) is in eV". */
export function unitMismatches(series: Pick<DatasetSeries, 'x' | 'y'>, plot: PlotAxisUnits): string[] {
  const out: string[] = [];
  for (const axis of ['x', 'y'] as const) {
    const d = series[axis];
    const p = plot[axis];
    if (!sameUnit(d.unit, p.unit)) {
      out.push(
        `the dataset's ${axis} (${d.name}) is in ${describeUnit(d.unit)}, the plot's ${axis} (${p.name}) is in ${describeUnit(p.unit)}`,
      );
    }
  }
  return out;
}

export type OverlayPlan =
  | { ok: true; points: [number, number][]; dropped: number; thinned: boolean; total: number }
  | { ok: false; mismatches: string[] };

/**
 * What to draw for a dataset series on a plot with the given units and scales: the points, or the
 * unit mismatches that stop it. On a log axis, points with a value ≤ 0 there are dropped and counted.
 */
export function planOverlay(series: DatasetSeries, plot: PlotAxisUnits, scales: OverlayScales): OverlayPlan {
  const mismatches = unitMismatches(series, plot);
  if (mismatches.length) return { ok: false, mismatches };
  const points: [number, number][] = [];
  let dropped = 0;
  const n = Math.min(series.points.x.length, series.points.y.length);
  for (let i = 0; i < n; i++) {
    const x = series.points.x[i];
    const y = series.points.y[i];
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    if ((scales.x && x <= 0) || (scales.y && y <= 0)) {
      dropped++;
      continue;
    }
    points.push([x, y]);
  }
  return { ok: true, points, dropped, thinned: series.n < series.total, total: series.total };
}

/** The read-out under the overlay controls, in words. */
export function overlaySummary(plan: Extract<OverlayPlan, { ok: true }>, datasetName: string): string {
  const shown = `${plan.points.length} point${plan.points.length === 1 ? '' : 's'} of “${datasetName}” drawn`;
  const thinned = plan.thinned ? ` (evenly thinned from ${plan.total} rows)` : '';
  const dropped = plan.dropped
    ? `; ${plan.dropped} point${plan.dropped === 1 ? '' : 's'} with a value ≤ 0 left out on the log axis`
    : '';
  return `${shown}${thinned}${dropped}.`;
}
