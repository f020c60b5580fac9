import type { HeatmapSeries, LineSeries, SeriesAxis } from '@driftgrid/domain';
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

function axisName(a: SeriesAxis): string {
  const u = prettyUnit(a.unit);
  return u ? `${a.name} (${u})` : a.name;
}

function valueAxis(a: SeriesAxis, log: boolean, text: string) {
  return {
    type: log ? 'log' : 'value',
    name: axisName(a),
    nameLocation: 'middle',
    nameGap: 34,
    scale: true,
    axisLabel: { formatter: (v: number) => formatNumber(v, 3), color: text },
    splitLine: { lineStyle: { opacity: 0.25 } },
  };
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
export function lineOption(s: LineSeries, scales: Scales, text: string, overlay?: OverlaySeries | null) {
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
      if (!bad && start !== null) (bands.push([start, last!]), (start = null));
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
    grid: { left: 72, right: 24, top: 48, bottom: 52 },
    tooltip: {
      trigger: 'item',
      formatter: (p: {
        seriesName: string;
        data: { value: [number, number]; flagged?: boolean; overlay?: boolean };
      }) =>
        p.data.overlay
          ? `${p.seriesName} (dataset)<br/>${s.x.name} = ${formatQuantity(p.data.value[0], s.x.unit)}<br/>${s.y.name} = ${formatQuantity(p.data.value[1], s.y.unit)}`
          : `${p.seriesName}<br/>${s.x.name} = ${formatQuantity(p.data.value[0], s.x.unit)}<br/>${s.y.name} = ${formatQuantity(p.data.value[1], s.y.unit)}<br/>${p.data.flagged ? 'Flagged: outside the validity ordering' : 'Valid'}`,
    },
    xAxis: valueAxis(s.x, scales.x, text),
    yAxis: { ...valueAxis(s.y, scales.y, text), nameGap: 56, nameLocation: 'middle' },
    series,
  };
}

/** Heatmap on value (or log) axes: one rectangle per cell, viridis colour bar in z's unit, flagged cells hatched. */
export function heatmapOption(s: HeatmapSeries, scales: Scales, text: string) {
  const xe = cellEdges(s.x.values, scales.x);
  const ye = cellEdges(s.y.values, scales.y);
  const zv = (z: number | null) => (z === null ? null : scales.z ? (z > 0 ? Math.log10(z) : null) : z);
  const data = s.cells
    .map(([xi, yi, z, flagged, frac]) => ({
      value: [xe[xi], xe[xi + 1], ye[yi], ye[yi + 1], zv(z), flagged, s.x.values[xi], s.y.values[yi], z, frac],
    }))
    .filter((d) => d.value[4] !== null);
  const zs = data.map((d) => d.value[4] as number);
  const lo = zs.length ? Math.min(...zs) : 0;
  const hi = zs.length ? Math.max(...zs) : 1;
  const u = prettyUnit(s.z.unit);
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
  const tip = (p: { data: { value: number[] } }) => {
    const v = p.data.value;
    return `${s.x.name} = ${formatQuantity(v[6], s.x.unit)}<br/>${s.y.name} = ${formatQuantity(v[7], s.y.unit)}<br/>${s.z.name} = ${formatQuantity(v[8], s.z.unit)}<br/>${
      v[5] ? `Flagged (${Math.round(v[9] * 100)} % of the cell)` : 'Valid'
    }`;
  };
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { fontFamily: 'Fira Sans, sans-serif', color: text },
    legend: { top: 0, data: [FLAG_LABEL], textStyle: { color: text } },
    grid: { left: 72, right: 120, top: 40, bottom: 52 },
    tooltip: { trigger: 'item', formatter: tip },
    xAxis: { ...valueAxis(s.x, scales.x, text), min: xe[0], max: xe.at(-1), scale: false },
    yAxis: { ...valueAxis(s.y, scales.y, text), min: ye[0], max: ye.at(-1), scale: false, nameGap: 56 },
    visualMap: {
      type: 'continuous',
      dimension: 4,
      seriesIndex: 0,
      min: lo,
      max: hi === lo ? lo + 1 : hi,
      calculable: true,
      right: 8,
      top: 'middle',
      itemHeight: 220,
      inRange: { color: VIRIDIS },
      text: [`${scales.z ? 'log₁₀ ' : ''}${s.z.name}${u ? ` (${u})` : ''}`, ''],
      textStyle: { color: text },
      formatter: (v: number) => (scales.z ? formatNumber(10 ** v, 3) : formatNumber(v, 3)),
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
    ],
  };
}
