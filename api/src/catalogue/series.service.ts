import { Injectable } from '@nestjs/common';
import {
  compileSweep,
  getModel,
  ValidationError,
  type HeatmapSeries,
  type LineSeries,
  type ResolvedAxis,
  type SeriesAxis,
  type SeriesFlag,
  type SeriesQuery,
} from '@driftgrid/domain';
import { layoutOf } from '../sweeps/results-reader.js';
import { columnByName, compileFilter, parseFilter, type ResultFilter } from '../sweeps/results-query.js';
import { ROW_SPAN, type StoredColumn } from '../sweeps/sweep-layout.js';
import type { SweepRow } from '../sweeps/sweeps.repository.js';
import { gridStrides, sliceIndices, strideDigits } from './grid-index.js';
import { SeriesRepository, type Where } from './series.repository.js';

/** At most this many groups in a line plot (more lines than a legend can name). */
export const MAX_GROUPS = 20;
/** Bins per axis when a random design is shown as a heatmap. */
const MAX_BINS = 64;

interface Ctx {
  s: SweepRow;
  layout: StoredColumn[];
  base: number;
  axes: ResolvedAxis[];
  grid: boolean;
  filter: Where;
  flags: SeriesFlag[];
  invalidMask: number;
}

/**
 * Down-sampled plot data (SPEC §6 series). Choices, documented for the README:
 * - Grid sweeps plotted over swept inputs read exact points by index: inputs that are not plotted are
 *   held at a slice (`slice.<param>=k`, default k = 0, the first value) — or, for heatmaps with
 *   `agg=mean`, averaged over in one SQL GROUP BY. Axes longer than the budget are thinned by an
 *   even stride that keeps both ends.
 * - Anything else (random designs, x not swept) takes every k-th point by index, k = ⌈n / maxPoints⌉,
 *   then sorts by x; heatmaps of random designs bin x and y (log bins on log axes) and average z.
 * - A cell or point is flagged when a validity flag that invalidates the point is raised (the
 *   fraction is given for averaged cells, flagged when at least half its points are).
 */
@Injectable()
export class SeriesService {
  private readonly compiled = new Map<number, { axes: ResolvedAxis[]; grid: boolean }>();

  constructor(private readonly repo: SeriesRepository) {}

  series(s: SweepRow, q: SeriesQuery): LineSeries | HeatmapSeries {
    const ctx = this.context(s, q);
    return q.kind === 'heatmap' ? this.heatmap(ctx, q) : this.line(ctx, q);
  }

  private context(s: SweepRow, q: SeriesQuery): Ctx {
    const layout = layoutOf(s);
    const filter: ResultFilter = parseFilter(q.filter, layout);
    if (q.valid !== undefined) {
      columnByName(layout, 'valid', 'valid');
      filter.valid = { ...filter.valid, eq: q.valid };
    }
    const model = getModel(s.model);
    const flags = model.flags.map((f) => ({
      code: f.code,
      bit: f.bit,
      meaning: f.meaning,
      invalidates: f.invalidates,
    }));
    const invalidMask = model.flags.reduce((m, f) => (f.invalidates ? m | (1 << f.bit) : m), 0);
    return {
      s,
      layout,
      base: s.id * ROW_SPAN,
      ...this.design(s),
      filter: compileFilter(s.id, layout, filter),
      flags,
      invalidMask,
    };
  }

  /** The sweep's resolved axes (definitions are immutable, so compiled once per sweep). */
  private design(s: SweepRow): { axes: ResolvedAxis[]; grid: boolean } {
    let d = this.compiled.get(s.id);
    if (!d) {
      const c = compileSweep(JSON.parse(s.definition));
      d = { axes: c.axes, grid: c.definition.sampling.kind === 'grid' };
      if (this.compiled.size > 200) this.compiled.clear();
      this.compiled.set(s.id, d);
    }
    return d;
  }

  private column(ctx: Ctx, name: string, path: string): StoredColumn {
    const c = columnByName(ctx.layout, name, path);
    if (c.kind === 'flags')
      throw new ValidationError(`${path}: the flag mask cannot be plotted`, [
        { path, message: 'pick an input, output or derived column' },
      ]);
    return c;
  }

  private expr(ctx: Ctx, c: StoredColumn): string {
    return c.kind === 'index' ? `(id - ${ctx.base})` : c.slot;
  }

  private describe(ctx: Ctx, c: StoredColumn): SeriesAxis {
    const axis = ctx.axes.find((a) => a.param === c.name);
    return { name: c.name, unit: c.unit, kind: c.kind, meaning: c.meaning, ...(axis ? { axisKind: axis.kind } : {}) };
  }

  private axisIndex(ctx: Ctx, name: string): number {
    return ctx.axes.findIndex((a) => a.param === name);
  }

  /** Digits of the axes that are not plotted; checks every `slice.<param>`. */
  private fixedDigits(ctx: Ctx, q: SeriesQuery, free: number[]) {
    const fixed = ctx.axes.map(() => 0);
    const slice: LineSeries['slice'] = {};
    for (const [param, k] of Object.entries(q.slice)) {
      const a = this.axisIndex(ctx, param);
      const path = `slice.${param}`;
      if (a < 0)
        throw new ValidationError(`${path}: ${param} is not a swept input`, [
          { path, message: `swept inputs: ${ctx.axes.map((x) => x.param).join(', ')}` },
        ]);
      if (k >= ctx.axes[a].count)
        throw new ValidationError(`${path}: index ${k} is past the last value`, [
          { path, message: `at most ${ctx.axes[a].count - 1}` },
        ]);
      fixed[a] = k;
    }
    ctx.axes.forEach((a, k) => {
      if (!free.includes(k))
        slice[a.param] = { index: fixed[k], value: a.values ? a.values[fixed[k]] : Number.NaN, unit: a.unit };
    });
    return { fixed, slice };
  }

  private line(ctx: Ctx, q: SeriesQuery): LineSeries {
    const xc = this.column(ctx, q.x, 'x');
    const yc = this.column(ctx, q.y, 'y');
    const gc = q.groupBy ? this.column(ctx, q.groupBy, 'groupBy') : null;
    const exprs = [this.expr(ctx, xc), this.expr(ctx, yc), gc ? this.expr(ctx, gc) : 'NULL'];
    const xa = this.axisIndex(ctx, xc.name);
    const ga = gc ? this.axisIndex(ctx, gc.name) : -1;
    const head = {
      kind: 'line' as const,
      x: this.describe(ctx, xc),
      y: this.describe(ctx, yc),
      groupBy: gc ? this.describe(ctx, gc) : null,
      flags: ctx.flags,
      invalidMask: ctx.invalidMask,
    };

    let rows: (number | null)[][];
    let method: LineSeries['method'];
    let total: number;
    let slice: LineSeries['slice'] = {};
    if (q.groups && !(ctx.grid && ga >= 0 && xa >= 0))
      throw new ValidationError('groups: values can be picked when x and groupBy are swept inputs of a grid sweep', [
        { path: 'groups', message: 'plot against a swept input and group by another one, or leave groups out' },
      ]);
    if (ctx.grid && xa >= 0 && (!gc || ga >= 0)) {
      const groupDigits = ga >= 0 ? this.groupDigits(ctx.axes[ga].count, gc!.name, q.groups) : [];
      const groupCount = ga >= 0 ? groupDigits.length : 1;
      const free = ga >= 0 ? [ga, xa] : [xa];
      const fx = this.fixedDigits(ctx, q, free);
      slice = fx.slice;
      const xDigits = strideDigits(ctx.axes[xa].count, Math.floor(q.maxPoints / groupCount));
      const spec = [...(ga >= 0 ? [{ axis: ga, digits: groupDigits }] : []), { axis: xa, digits: xDigits }];
      const indices = sliceIndices(gridStrides(ctx.axes.map((a) => a.count)), fx.fixed, spec);
      rows = this.repo.atIndices(ctx.base, indices, exprs, ctx.filter);
      method = 'grid-slice';
      total = ctx.axes[xa].count * groupCount;
    } else {
      total = this.countFiltered(ctx);
      const k = Math.max(1, Math.ceil(total / q.maxPoints));
      rows = this.repo.strided(ctx.base, k, q.maxPoints, exprs, ctx.filter);
      method = 'stride';
    }

    const groups = new Map<number | null, [number | null, number | null, number, number][]>();
    for (const r of rows) {
      const g = gc ? r[3] : null;
      let list = groups.get(g);
      if (!list) {
        if (groups.size >= MAX_GROUPS) throw tooManyGroups(gc!.name, `more than ${MAX_GROUPS}`);
        groups.set(g, (list = []));
      }
      list.push([r[1], r[2], r[4] ?? 0, r[0]!]);
    }
    const out = [...groups.entries()]
      .sort((a, b) => (a[0] ?? Infinity) - (b[0] ?? Infinity))
      .map(([value, points]) => ({ value, points: points.sort((a, b) => (a[0] ?? Infinity) - (b[0] ?? Infinity)) }));
    return { ...head, groups: out, method, total, returned: rows.length, slice };
  }

  /** Grid digits of the groupBy axis to draw: the picked ones (checked), else all when there are few enough. */
  private groupDigits(count: number, name: string, picked: number[] | undefined): number[] {
    if (!picked) {
      if (count > MAX_GROUPS) throw tooManyGroups(name, count);
      return strideDigits(count, count);
    }
    const past = picked.find((k) => k >= count);
    if (past !== undefined)
      throw new ValidationError(`groups: value number ${past} is past the last value of ${name}`, [
        { path: 'groups', message: `${name} has ${count} values, numbered 0 to ${count - 1}` },
      ]);
    return picked;
  }

  private countFiltered(ctx: Ctx): number {
    // compileFilter always restricts to the sweep's rowid range ("id BETWEEN ? AND ?"); more means a filter.
    return ctx.filter.where !== 'id BETWEEN ? AND ?' ? this.repo.count(ctx.filter) : ctx.s.pointsDone;
  }

  private heatmap(ctx: Ctx, q: SeriesQuery): HeatmapSeries {
    const xc = this.column(ctx, q.x, 'x');
    const yc = this.column(ctx, q.y, 'y');
    const zc = this.column(ctx, q.z!, 'z');
    if (xc.name === yc.name)
      throw new ValidationError('x and y must differ', [{ path: 'y', message: 'pick a second input' }]);
    const xa = this.axisIndex(ctx, xc.name);
    const ya = this.axisIndex(ctx, yc.name);
    const head = {
      kind: 'heatmap' as const,
      z: this.describe(ctx, zc),
      flags: ctx.flags,
      invalidMask: ctx.invalidMask,
    };
    const zExpr = this.expr(ctx, zc);

    if (ctx.grid && xa >= 0 && ya >= 0) {
      const X = ctx.axes[xa];
      const Y = ctx.axes[ya];
      const step = Math.max(1, Math.ceil(Math.sqrt((X.count * Y.count) / q.maxPoints)));
      const xd = strideDigits(X.count, Math.ceil(X.count / step));
      const yd = strideDigits(Y.count, Math.ceil(Y.count / step));
      const strides = gridStrides(ctx.axes.map((a) => a.count));
      const xPos = new Map(xd.map((d, i) => [d, i]));
      const yPos = new Map(yd.map((d, i) => [d, i]));
      const x = { ...this.describe(ctx, xc), values: xd.map((d) => X.values![d]) };
      const y = { ...this.describe(ctx, yc), values: yd.map((d) => Y.values![d]) };
      const cells: HeatmapSeries['cells'] = [];
      let slice: HeatmapSeries['slice'] = {};
      const digit = (a: number) => `(((id - ${ctx.base}) / ${strides[a]}) % ${ctx.axes[a].count})`;
      if (q.agg === 'mean') {
        const keep = {
          where: `${digit(xa)} IN (SELECT value FROM json_each(?)) AND ${digit(ya)} IN (SELECT value FROM json_each(?))`,
          params: [] as unknown[],
        };
        const rows = this.repo.cellMeans(
          { where: digit(xa), params: [] },
          { where: digit(ya), params: [] },
          zExpr,
          ctx.invalidMask,
          ctx.filter,
          { ...keep, params: [JSON.stringify(xd), JSON.stringify(yd)] },
        );
        for (const [xi, yi, z, f] of rows)
          cells.push([xPos.get(xi!)!, yPos.get(yi!)!, z, (f ?? 0) >= 0.5 ? 1 : 0, f ?? 0, null]);
        return { ...head, x, y, cells: sortCells(cells), method: 'grid-mean', zRange: zRange(cells), slice };
      }
      const fx = this.fixedDigits(ctx, q, [xa, ya]);
      slice = fx.slice;
      const indices = sliceIndices(strides, fx.fixed, [
        { axis: xa, digits: xd },
        { axis: ya, digits: yd },
      ]);
      const rows = this.repo.atIndices(ctx.base, indices, [zExpr], ctx.filter);
      for (const [idx, z, mask] of rows) {
        const i = idx!;
        const bad = ((mask ?? 0) & ctx.invalidMask) !== 0 ? 1 : 0;
        cells.push([
          xPos.get(Math.floor(i / strides[xa]) % X.count)!,
          yPos.get(Math.floor(i / strides[ya]) % Y.count)!,
          z,
          bad,
          bad,
          i,
        ]);
      }
      return { ...head, x, y, cells: sortCells(cells), method: 'grid-slice', zRange: zRange(cells), slice };
    }

    // Random designs (or columns that are not swept): bin x and y, average z.
    const bins = Math.max(2, Math.min(MAX_BINS, Math.floor(Math.sqrt(q.maxPoints))));
    const bx = this.binning(ctx, xc, bins, 'x');
    const by = this.binning(ctx, yc, bins, 'y');
    const rows = this.repo.cellMeans(
      bx.expr,
      by.expr,
      zExpr,
      ctx.invalidMask,
      ctx.filter,
      bx.keep && by.keep ? { where: `${bx.keep} AND ${by.keep}`, params: [] } : undefined,
    );
    const cells: HeatmapSeries['cells'] = rows
      .filter((r) => r[0] !== null && r[1] !== null)
      .map(([xi, yi, z, f]) => [xi!, yi!, z, (f ?? 0) >= 0.5 ? 1 : 0, f ?? 0, null]);
    return {
      ...head,
      x: { ...this.describe(ctx, xc), values: bx.centres },
      y: { ...this.describe(ctx, yc), values: by.centres },
      cells: sortCells(cells),
      method: 'binned-mean',
      zRange: zRange(cells),
      slice: {},
    };
  }

  /** Bin index expression over the column's range; log bins when the column is swept on a log axis. */
  private binning(ctx: Ctx, c: StoredColumn, bins: number, path: string) {
    const e = this.expr(ctx, c);
    const axis = ctx.axes.find((a) => a.param === c.name);
    const log = axis?.kind === 'log';
    const r = axis ? [axis.min, axis.max] : this.repo.range(e, ctx.filter, false);
    if (!r)
      throw new ValidationError(`${path}: ${c.name} has no finite values to plot`, [
        { path, message: 'no finite values' },
      ]);
    const [lo, hi] = log ? [Math.log(r[0]), Math.log(r[1])] : r;
    const width = hi > lo ? (hi - lo) / bins : 1;
    const v = log ? `ln(${e})` : e;
    const centres = Array.from({ length: bins }, (_, i) =>
      log ? Math.exp(lo + (i + 0.5) * width) : lo + (i + 0.5) * width,
    );
    return {
      expr: { where: `MIN(${bins - 1}, MAX(0, CAST((${v} - ?) / ? AS INTEGER)))`, params: [lo, width] },
      keep: log ? `${e} > 0` : `${e} IS NOT NULL`,
      centres,
    };
  }
}

function tooManyGroups(name: string, n: number | string): ValidationError {
  return new ValidationError(`groupBy: ${name} has ${n} distinct values; at most ${MAX_GROUPS} lines are drawn`, [
    {
      path: 'groupBy',
      message: `at most ${MAX_GROUPS} groups; pick values with groups=…, group by an input with fewer values or filter first`,
    },
  ]);
}

function sortCells(cells: HeatmapSeries['cells']): HeatmapSeries['cells'] {
  return cells.sort((a, b) => a[1] - b[1] || a[0] - b[0]);
}

function zRange(cells: HeatmapSeries['cells']): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const c of cells) {
    if (c[2] === null) continue;
    if (c[2] < lo) lo = c[2];
    if (c[2] > hi) hi = c[2];
  }
  return lo <= hi ? [lo, hi] : null;
}
