import type { HeatmapSeries, LineSeries, ResultRowView, SeriesAxis } from '@driftgrid/domain';
import { formatNumber, formatQuantity, prettyUnit } from '../../lib/format.js';
import { VIRIDIS } from './colormap.js';

export interface Scales {
  x: boolean;
  y: boolean;
  /** Colour scale (heatmaps): log10 of z. */
  z: boolean;
}

export const FLAG_LABEL = 'Flagged: a validity flag is raised';
const HATCH = 'rgba(120, 120, 120, 0.55)';

/** How a column is named on axes and colour bars (the plot passes symbol · name); the bare name by default. */
export type ColumnLabel = (name: string) => string;
const bareName: ColumnLabel = (name) => name;

function axisName(a: SeriesAxis, label: ColumnLabel): string {
  const u = prettyUnit(a.unit);
  return u ? `${label(a.name)} (${u})` : label(a.name);
}

function valueAxis(a: SeriesAxis, log: boolean, text: string, label: ColumnLabel = bareName) {
  return {
    type: log ? 'log' : 'value',
    name: axisName(a, label),
    nameLocation: 'middle',
    nameGap: 34,
    scale: true,
    axisLabel: { formatter: (v: number) => formatNumber(v, 3), color: text },
    splitLine: { lineStyle: { opacity: 0.25 } },
  };
}

function edgeAxis<T extends { axisLabel: object }>(a: T): T {
  return { ...a, axisLabel: { ...a.axisLabel, showMinLabel: false, showMaxLabel: false } };
}

/** Cell edges between neighbouring values: geometric midpoints on a log scale, arithmetic otherwise. */
export function cellEdges(values: readonly number[], log: boolean): number[] {
  const n = values.length;
  if (n === 0) return [];
  if (n === 1) return log ? [values[0] / 1.5, values[0] * 1.5] : [values[0] - 0.5, values[0] + 0.5];
  const mid = (a: number, b: number) => (log ? Math.sqrt(a * b) : (a + b) / 2);
  const edges = [0];
  for (let i = 1; i < n; i++) edges.push(mid(values[i - 1], values[i]));
  edges[0] = log ? (values[0] * values[0]) / edges[1] : 2 * values[0] - edges[1];
  edges.push(log ? (values[n - 1] * values[n - 1]) / edges[n - 1] : 2 * values[n - 1] - edges[n - 1]);
  return edges;
}

/** Points of a dataset drawn over a line plot (already in the plot's units and filtered for log axes). */
export interface OverlaySeries {
  name: string;
  points: [number, number][];
}

export const OVERLAY_COLOR = '#d9480f';

/**
 * Line plot: one line per group; flagged x-ranges shaded as a band with its own legend entry; an
 * optional dataset overlay as a scatter of diamonds (a shape of its own, not only a colour).
 */
export interface LineExtras {
  /** Said on the plot itself (e.g. which of many group values are drawn). */
  note?: string;
  /** Axis titles: how a column is named. */
  label?: ColumnLabel;
  pointDetail?: (
    idx: number | null,
    quick: string,
    ticket: string,
    done: (ticket: string, html: string) => void,
  ) => string;
}

export function lineOption(
  s: LineSeries,
  scales: Scales,
  text: string,
  overlay?: OverlaySeries | null,
  extras: LineExtras = {},
) {
  const keep = (p: [number | null, number | null, number, number]) =>
    p[0] !== null && p[1] !== null && (!scales.x || p[0] > 0) && (!scales.y || p[1]! > 0);
  const groupLabel = (v: number | null) =>
    s.groupBy ? `${s.groupBy.name} = ${formatQuantity(v, s.groupBy.unit)}` : s.y.name;
  const series: unknown[] = s.groups.map((g) => ({
    name: groupLabel(g.value),
    type: 'line',
    showSymbol: true,
    symbolSize: 4,
    data: g.points.filter(keep).map((p) => ({
      value: [p[0], p[1]],
      idx: p[3],
      flagged: (p[2] & s.invalidMask) !== 0,
      // Flagged points drawn hollow, so the state does not rest on colour.
      itemStyle: (p[2] & s.invalidMask) !== 0 ? { color: 'transparent', borderWidth: 1.5 } : undefined,
    })),
  }));
  // Contiguous runs of flagged points, over all groups, become shaded x-bands.
  const bands: [number, number][] = [];
  for (const g of s.groups) {
    let start: number | null = null;
    let last: number | null = null;
    for (const p of g.points.filter(keep)) {
      const bad = (p[2] & s.invalidMask) !== 0;
      if (bad && start === null) start = p[0];
      if (bad) last = p[0];
      if (!bad && start !== null) {
        bands.push([start, last!]);
        start = null;
      }
    }
    if (start !== null) bands.push([start, last!]);
  }
  series.push({
    name: FLAG_LABEL,
    type: 'line',
    data: [],
    itemStyle: { color: HATCH },
    lineStyle: { opacity: 0 },
    markArea: {
      silent: true,
      itemStyle: {
        color: 'rgba(140, 140, 140, 0.22)',
        decal: { symbol: 'line', dashArrayX: [1, 0], dashArrayY: [3, 5], rotation: Math.PI / 4, color: HATCH },
      },
      data: bands.map(([a, b]) => [{ xAxis: a }, { xAxis: b }]),
    },
  });
  if (overlay) {
    series.push({
      name: overlay.name,
      type: 'scatter',
      symbol: 'diamond',
      symbolSize: 7,
      itemStyle: { color: OVERLAY_COLOR, borderColor: '#ffffff', borderWidth: 0.5 },
      z: 5,
      data: overlay.points.map((p) => ({ value: p, overlay: true })),
    });
  }
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { fontFamily: 'Fira Sans, sans-serif', color: text },
    legend: { type: 'scroll', top: 0, textStyle: { color: text } },
    grid: { left: 72, right: 24, top: 48, bottom: extras.note ? 64 : 52 },
    title: extras.note
      ? { text: extras.note, bottom: 0, right: 8, textStyle: { fontSize: 11, fontWeight: 'normal', color: text } }
      : undefined,
    tooltip: {
      trigger: 'item',
      confine: true,
      extraCssText: 'max-width: 460px; white-space: normal;',
      formatter: (
        p: {
          seriesName: string;
          data: { value: [number, number]; idx?: number; flagged?: boolean; overlay?: boolean };
        },
        ticket: string,
        done: (t: string, html: string) => void,
      ) => {
        if (p.data.overlay)
          return `${p.seriesName} (dataset)<br/>${s.x.name} = ${formatQuantity(p.data.value[0], s.x.unit)}<br/>${s.y.name} = ${formatQuantity(p.data.value[1], s.y.unit)}`;
        const quick = `${p.seriesName}<br/>${s.x.name} = ${formatQuantity(p.data.value[0], s.x.unit)}<br/>${s.y.name} = ${formatQuantity(p.data.value[1], s.y.unit)}<br/>${p.data.flagged ? 'Flagged: outside the validity ordering' : 'Valid'}`;
        return extras.pointDetail ? extras.pointDetail(p.data.idx ?? null, quick, ticket, done) : quick;
      },
    },
    xAxis: valueAxis(s.x, scales.x, text, extras.label),
    yAxis: { ...valueAxis(s.y, scales.y, text, extras.label), nameGap: 56, nameLocation: 'middle' },
    series,
  };
}

/** How z maps to colour: linear, log10 z (all positive), or log10 |z| (all negative). */
export type ColourScale = 'linear' | 'log' | 'log-neg';

/**
 * The colour scale a heatmap picks by itself: logarithmic when the data keep one sign and their magnitudes
 * span more than two decades; `canLog` says whether a log scale is possible at all (one sign, no zeros).
 */
export function autoColourScale(zs: readonly (number | null)[]): { auto: ColourScale; canLog: ColourScale | null } {
  let lo = Infinity;
  let hi = 0;
  let pos = 0;
  let neg = 0;
  let zero = 0;
  for (const z of zs) {
    if (z === null || !Number.isFinite(z)) continue;
    if (z > 0) pos++;
    else if (z < 0) neg++;
    else zero++;
    const m = Math.abs(z);
    if (m > 0 && m < lo) lo = m;
    if (m > hi) hi = m;
  }
  const canLog: ColourScale | null = zero || (pos && neg) || !(pos || neg) ? null : pos ? 'log' : 'log-neg';
  return { auto: canLog && hi / lo > 100 ? canLog : 'linear', canLog };
}

/** A line drawn over a heatmap: where an ordering parameter equals its threshold. */
export interface ContourOverlay {
  name: string;
  lines: [number, number][][];
  color: string;
  dash: 'solid' | 'dashed' | 'dotted';
}

/** Contour colours: bright against every viridis colour, each with its own dash pattern as well. */
export const CONTOUR_STYLES: { color: string; dash: ContourOverlay['dash'] }[] = [
  { color: '#ff3b6b', dash: 'solid' },
  { color: '#ffffff', dash: 'dashed' },
  { color: '#00d8ff', dash: 'dotted' },
  { color: '#ff9f1c', dash: 'dashed' },
  { color: '#e0e0e0', dash: 'dotted' },
];

export interface HeatmapExtras {
  colour: ColourScale;
  /** Axis titles: how a column is named. */
  label?: ColumnLabel;
  /** The colour bar's title, which has little room beside the plot (the plot passes the bare symbol). */
  barLabel?: ColumnLabel;
  contours?: ContourOverlay[];
  /** Tooltip body for a cell (point index or null): the full row when it is known. */
  cellDetail?: (
    idx: number | null,
    quick: string,
    ticket: string,
    done: (ticket: string, html: string) => void,
  ) => string;
}

/** Heatmap on value (or log) axes: one rectangle per cell, viridis colour bar in z's unit, flagged cells hatched. */
export function heatmapOption(
  s: HeatmapSeries,
  scales: Scales,
  text: string,
  extras: HeatmapExtras = { colour: 'linear' },
) {
  const xe = cellEdges(s.x.values, scales.x);
  const ye = cellEdges(s.y.values, scales.y);
  const colour = extras.colour;
  const zv = (z: number | null) =>
    z === null
      ? null
      : colour === 'log'
        ? z > 0
          ? Math.log10(z)
          : null
        : colour === 'log-neg'
          ? z < 0
            ? Math.log10(-z)
            : null
          : z;
  const data = s.cells
    .map(([xi, yi, z, flagged, frac, idx]) => ({
      value: [
        xe[xi],
        xe[xi + 1],
        ye[yi],
        ye[yi + 1],
        zv(z),
        flagged,
        s.x.values[xi],
        s.y.values[yi],
        z,
        frac,
        idx ?? -1,
      ],
    }))
    .filter((d) => d.value[4] !== null);
  const zs = data.map((d) => d.value[4] as number);
  const lo = zs.length ? Math.min(...zs) : 0;
  const hi = zs.length ? Math.max(...zs) : 1;
  const rect =
    (fill: 'cell' | 'hatch') =>
    (params: unknown, api: { value(i: number): number; coord(p: number[]): number[]; visual(k: string): string }) => {
      const [x0, y0] = api.coord([api.value(0), api.value(2)]);
      const [x1, y1] = api.coord([api.value(1), api.value(3)]);
      const shape = { x: Math.min(x0, x1), y: Math.min(y0, y1), width: Math.abs(x1 - x0), height: Math.abs(y1 - y0) };
      if (fill === 'cell') return { type: 'rect', shape, style: { fill: api.visual('color') } };
      if (!api.value(5)) return null;
      return {
        type: 'group',
        children: [
          { type: 'rect', shape, style: { fill: 'rgba(255,255,255,0.28)' } },
          {
            type: 'line',
            shape: { x1: shape.x, y1: shape.y + shape.height, x2: shape.x + shape.width, y2: shape.y },
            style: { stroke: HATCH, lineWidth: 1 },
          },
        ],
      };
    };
  const tip = (
    p: { seriesType: string; seriesName: string; data: { value: number[] } },
    ticket: string,
    done: (t: string, html: string) => void,
  ) => {
    if (p.seriesType === 'line') return `${p.seriesName}<br/>(regime boundary)`;
    const v = p.data.value;
    const quick = `${s.x.name} = ${formatQuantity(v[6], s.x.unit)}<br/>${s.y.name} = ${formatQuantity(v[7], s.y.unit)}<br/>${s.z.name} = ${formatQuantity(v[8], s.z.unit)}${s.method === 'grid-slice' ? '' : ' (mean of the cell)'}<br/>${
      v[5] ? `Flagged (${Math.round(v[9] * 100)} % of the cell)` : 'Valid'
    }`;
    return extras.cellDetail ? extras.cellDetail(v[10] >= 0 ? v[10] : null, quick, ticket, done) : quick;
  };
  const scaleWord = colour === 'log' ? ', log scale' : colour === 'log-neg' ? ', log scale of −z' : '';
  const contourSeries = (extras.contours ?? []).flatMap((c) =>
    c.lines.map((line) => ({
      name: c.name,
      type: 'line',
      data: line,
      showSymbol: false,
      symbol: 'none',
      silent: false,
      z: 10,
      color: c.color,
      lineStyle: { color: c.color, width: 2.5, type: c.dash, shadowColor: 'rgba(0,0,0,0.85)', shadowBlur: 3 },
      itemStyle: { color: c.color },
      tooltip: { show: true },
    })),
  );
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { fontFamily: 'Fira Sans, sans-serif', color: text },
    legend: {
      type: 'scroll',
      top: 0,
      left: 8,
      right: 8,
      data: [FLAG_LABEL, ...(extras.contours ?? []).filter((c) => c.lines.length).map((c) => c.name)],
      textStyle: { color: text },
    },
    // Room on the right for the colour bar and its labels, which sit beside the bar, never over the plot.
    grid: { left: 72, right: 150, top: 44, bottom: 52 },
    tooltip: { trigger: 'item', formatter: tip, confine: true, extraCssText: 'max-width: 460px; white-space: normal;' },
    // The axes end at cell edges: their end labels would be odd numbers crowding the next tick.
    xAxis: { ...edgeAxis(valueAxis(s.x, scales.x, text, extras.label)), min: xe[0], max: xe.at(-1), scale: false },
    yAxis: {
      ...edgeAxis(valueAxis(s.y, scales.y, text, extras.label)),
      min: ye[0],
      max: ye.at(-1),
      scale: false,
      nameGap: 56,
    },
    visualMap: {
      type: 'continuous',
      dimension: 4,
      seriesIndex: 0,
      min: lo,
      max: hi === lo ? lo + 1 : hi,
      calculable: true,
      right: 8,
      top: 56,
      bottom: 60,
      itemWidth: 16,
      itemHeight: 200,
      align: 'left',
      inRange: { color: VIRIDIS },
      text: [`${axisName(s.z, extras.barLabel ?? bareName)}${scaleWord}`, ''],
      textGap: 12,
      textStyle: { color: text },
      formatter: (v: number) =>
        colour === 'log'
          ? formatNumber(10 ** v, 3)
          : colour === 'log-neg'
            ? formatNumber(-(10 ** v), 3)
            : formatNumber(v, 3),
    },
    series: [
      {
        name: s.z.name,
        type: 'custom',
        renderItem: rect('cell'),
        encode: { x: [0, 1], y: [2, 3], tooltip: [4] },
        data,
      },
      {
        name: FLAG_LABEL,
        type: 'custom',
        renderItem: rect('hatch'),
        encode: { x: [0, 1], y: [2, 3] },
        data,
        itemStyle: { color: HATCH },
        tooltip: { show: false },
        silent: true,
      },
      ...contourSeries,
    ],
  };
}

/** One point of a scatter of a random design: two inputs, a colour output, flagged or not. */
export interface ScatterPoint {
  x: number;
  y: number;
  z: number | null;
  flagged: boolean;
  row: ResultRowView;
}

export function scatterOption(
  points: readonly ScatterPoint[],
  axes: { x: SeriesAxis; y: SeriesAxis; z: SeriesAxis },
  scales: Scales,
  text: string,
  detail: (row: ResultRowView) => string,
  label: ColumnLabel = bareName,
  barLabel: ColumnLabel = bareName,
) {
  const keep = points.filter((p) => (!scales.x || p.x > 0) && (!scales.y || p.y > 0));
  const zs = keep.map((p) => p.z).filter((z): z is number => z !== null && Number.isFinite(z));
  const lo = zs.length ? Math.min(...zs) : 0;
  const hi = zs.length ? Math.max(...zs) : 1;
  const item = (p: ScatterPoint) => ({ value: [p.x, p.y, p.z], row: p.row });
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { fontFamily: 'Fira Sans, sans-serif', color: text },
    legend: { top: 0, left: 8, data: ['Valid', FLAG_LABEL], textStyle: { color: text } },
    grid: { left: 72, right: 150, top: 44, bottom: 52 },
    tooltip: {
      trigger: 'item',
      confine: true,
      extraCssText: 'max-width: 460px; white-space: normal;',
      formatter: (p: { data: { row: ResultRowView } }) => detail(p.data.row),
    },
    xAxis: valueAxis(axes.x, scales.x, text, label),
    yAxis: { ...valueAxis(axes.y, scales.y, text, label), nameGap: 56 },
    visualMap: {
      type: 'continuous',
      dimension: 2,
      seriesIndex: [0, 1],
      min: lo,
      max: hi === lo ? lo + 1 : hi,
      calculable: true,
      right: 8,
      top: 56,
      bottom: 60,
      itemWidth: 16,
      itemHeight: 200,
      align: 'left',
      inRange: { color: VIRIDIS },
      text: [axisName(axes.z, barLabel), ''],
      textGap: 12,
      textStyle: { color: text },
      formatter: (v: number) => formatNumber(v, 3),
    },
    series: [
      {
        name: 'Valid',
        type: 'scatter',
        symbol: 'circle',
        symbolSize: 7,
        data: keep.filter((p) => !p.flagged).map(item),
      },
      {
        name: FLAG_LABEL,
        type: 'scatter',
        // Flagged points: a hollow-looking triangle with a dark outline, so the state does not rest on colour.
        symbol: 'triangle',
        symbolSize: 9,
        itemStyle: { borderColor: text, borderWidth: 1.2, opacity: 0.9 },
        data: keep.filter((p) => p.flagged).map(item),
      },
    ],
  };
}
