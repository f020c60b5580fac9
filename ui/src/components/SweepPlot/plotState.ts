/**
 * What the Plots tab shows, kept in the page's URL so a view can be bookmarked and shared: plot kind, axes,
 * the output, the grouping and which of its values are drawn, the value each other swept input is held at,
 * averaging, and explicit log-scale choices. Pure functions: read with defaults, write a change, and build
 * the series query the api takes.
 */
import { evenlySpread } from '@driftgrid/domain';

export type PlotKind = 'line' | 'heatmap' | 'scatter';

/** A swept input as the plot needs it (values only for grid and list axes). */
export interface PlotAxis {
  param: string;
  unit: string;
  kind: 'linear' | 'log' | 'list';
  count: number;
  values: number[] | null;
}

export interface PlotContext {
  axes: PlotAxis[];
  /** True for grid sweeps (every combination of axis values); false for random designs. */
  grid: boolean;
  /** Numeric columns that can be plotted as y or colour (outputs, derived, inputs). */
  numeric: string[];
  /** The output shown first. */
  preferred: string;
}

export interface PlotState {
  kind: PlotKind;
  x: string;
  /** Heatmap and scatter: the second input. */
  y: string;
  /** Line: y; heatmap and scatter: colour. */
  z: string;
  groupBy: string | null;
  /** Grid value numbers of groupBy to draw; null = the default pick. */
  groups: number[] | null;
  /** Grid value number each non-plotted swept input is held at (absent = 0, the first value). */
  slice: Record<string, number>;
  /** Heatmaps: average over the non-plotted inputs instead of slicing. */
  mean: boolean;
  /** Explicit scale choices; undefined = automatic (axis kind for x/y, data span for colour). */
  log: { x?: boolean; y?: boolean; z?: boolean };
}

/** Lines drawn by default when grouping by an input with many values. */
export const DEFAULT_GROUPS = 8;
/** Most lines the api draws in one plot. */
export const MAX_GROUPS = 20;

const bool = (v: string | null) => (v === '1' ? true : v === '0' ? false : undefined);

export function defaultKind(ctx: PlotContext): PlotKind {
  if (ctx.axes.length < 2) return 'line';
  return ctx.grid ? 'heatmap' : 'scatter';
}

export function readPlotState(params: URLSearchParams, ctx: PlotContext): PlotState {
  const axisNames = ctx.axes.map((a) => a.param);
  const kinds: PlotKind[] = ctx.axes.length >= 2 ? ['line', 'heatmap', 'scatter'] : ['line'];
  const rawKind = params.get('plot') as PlotKind | null;
  const kind = rawKind && kinds.includes(rawKind) ? rawKind : defaultKind(ctx);
  const xChoices = kind === 'line' ? [...axisNames, ...ctx.numeric] : axisNames;
  const x = pick(params.get('x'), xChoices, axisNames[0] ?? ctx.numeric[0] ?? '');
  const y = pick(
    params.get('y'),
    axisNames.filter((a) => a !== x),
    axisNames.find((a) => a !== x) ?? '',
  );
  const z = pick(params.get('z'), ctx.numeric, ctx.preferred);
  const groupable = axisNames.filter((a) => a !== x && axisOf(ctx, a)?.values);
  const rawBy = params.get('by');
  const groupBy =
    kind !== 'line' || !axisNames.includes(x)
      ? null
      : rawBy === 'none'
        ? null
        : pick(rawBy, groupable, groupable[0] ?? '') || null;
  const count = groupBy ? (axisOf(ctx, groupBy)?.count ?? 0) : 0;
  const rawGroups = params.get('g');
  const groups =
    groupBy && rawGroups
      ? [
          ...new Set(
            rawGroups
              .split(',')
              .map(Number)
              .filter((k) => Number.isInteger(k) && k >= 0 && k < count),
          ),
        ]
          .sort((a, b) => a - b)
          .slice(0, MAX_GROUPS)
      : null;
  const slice: Record<string, number> = {};
  for (const a of ctx.axes) {
    const raw = params.get(`at.${a.param}`);
    if (raw === null) continue;
    const k = Number(raw);
    if (Number.isInteger(k) && k >= 0 && k < a.count) slice[a.param] = k;
  }
  return {
    kind,
    x,
    y,
    z,
    groupBy,
    groups: groups && groups.length ? groups : null,
    slice,
    mean: kind === 'heatmap' && params.get('avg') === '1',
    log: { x: bool(params.get('logx')), y: bool(params.get('logy')), z: bool(params.get('logz')) },
  };
}

/** The URL parameters for a changed state (other parameters of the page, such as the tab, are kept). */
export function writePlotState(params: URLSearchParams, s: PlotState): URLSearchParams {
  const out = new URLSearchParams(params);
  for (const k of [...out.keys()])
    if (['plot', 'x', 'y', 'z', 'by', 'g', 'avg', 'logx', 'logy', 'logz'].includes(k) || k.startsWith('at.'))
      out.delete(k);
  out.set('plot', s.kind);
  out.set('x', s.x);
  if (s.kind !== 'line' && s.y) out.set('y', s.y);
  out.set('z', s.z);
  if (s.kind === 'line') out.set('by', s.groupBy ?? 'none');
  if (s.kind === 'line' && s.groupBy && s.groups) out.set('g', s.groups.join(','));
  for (const [p, k] of Object.entries(s.slice)) out.set(`at.${p}`, String(k));
  if (s.mean) out.set('avg', '1');
  for (const k of ['x', 'y', 'z'] as const) if (s.log[k] !== undefined) out.set(`log${k}`, s.log[k] ? '1' : '0');
  return out;
}

export function axisOf(ctx: PlotContext, name: string | null): PlotAxis | undefined {
  return name ? ctx.axes.find((a) => a.param === name) : undefined;
}

/** The grid values of groupBy that are drawn, and whether that is every value. */
export function drawnGroups(s: PlotState, ctx: PlotContext): { digits: number[]; count: number; all: boolean } {
  const count = axisOf(ctx, s.groupBy)?.count ?? 0;
  const digits = s.groups ?? evenlySpread(count, DEFAULT_GROUPS);
  return { digits, count, all: digits.length === count };
}

/** Swept inputs not on the plot: each gets a picker of the value it is held at (grid sweeps only). */
export function heldAxes(s: PlotState, ctx: PlotContext): PlotAxis[] {
  if (!ctx.grid || s.kind === 'scatter') return [];
  const shown = new Set([s.x, s.kind === 'heatmap' ? s.y : (s.groupBy ?? '')]);
  // A line plot against a column that is not swept reads strided points, not a slice.
  if (!ctx.axes.some((a) => a.param === s.x)) return [];
  return ctx.axes.filter((a) => !shown.has(a.param));
}

/** The api's series query for the state (null for a scatter, which reads result rows). */
export function seriesQuery(s: PlotState, ctx: PlotContext): Record<string, string | number> | null {
  if (s.kind === 'scatter' || !s.x || !s.z) return null;
  const slice: Record<string, number> = {};
  if (!(s.kind === 'heatmap' && s.mean))
    for (const a of heldAxes(s, ctx)) slice[`slice.${a.param}`] = s.slice[a.param] ?? 0;
  if (s.kind === 'heatmap') {
    if (!s.y || s.y === s.x) return null;
    return { kind: 'heatmap', x: s.x, y: s.y, z: s.z, maxPoints: 4000, ...(s.mean ? { agg: 'mean' } : slice) };
  }
  const q: Record<string, string | number> = { kind: 'line', x: s.x, y: s.z, maxPoints: 2000, ...slice };
  if (s.groupBy && ctx.grid && axisOf(ctx, s.x)) {
    q.groupBy = s.groupBy;
    q.groups = drawnGroups(s, ctx).digits.join(',');
  }
  return q;
}

function pick(v: string | null, allowed: readonly string[], fallback: string): string {
  return v !== null && allowed.includes(v) ? v : fallback;
}
