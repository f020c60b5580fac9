import type { SensitivityReport } from '@driftgrid/domain';
import { formatNumber } from '../../lib/format.js';

export interface ChartColours {
  text: string;
  axis: string;
  first: string;
  total: string;
  whisker: string;
}

/** Each category holds two bars side by side with no gap: each is this share of the band wide. */
const BAR_SHARE = 0.3;

interface WhiskerApi {
  value(dim: number): number;
  coord(p: [number, number]): [number, number];
  size(p: [number, number]): [number, number];
}

/** A custom series drawing the interval [lo, hi] of each bar as a whisker with caps. */
function whiskers(name: string, side: -1 | 1, data: [number, number, number][], colour: string) {
  return {
    type: 'custom',
    name,
    silent: true,
    z: 10,
    data,
    encode: { x: 0, y: [1, 2] },
    renderItem: (_params: unknown, api: WhiskerApi) => {
      const i = api.value(0);
      const band = api.size([1, 0])[0];
      const x = api.coord([i, 0])[0] + (side * band * BAR_SHARE) / 2;
      const lo = api.coord([i, api.value(1)])[1];
      const hi = api.coord([i, api.value(2)])[1];
      const cap = Math.max(3, (band * BAR_SHARE) / 5);
      const style = { stroke: colour, lineWidth: 1.5 };
      return {
        type: 'group',
        children: [
          { type: 'line', shape: { x1: x, y1: lo, x2: x, y2: hi }, style },
          { type: 'line', shape: { x1: x - cap, y1: lo, x2: x + cap, y2: lo }, style },
          { type: 'line', shape: { x1: x - cap, y1: hi, x2: x + cap, y2: hi }, style },
        ],
      };
    },
  };
}

/**
 * Bar chart of first-order and total indices per input, whiskers at the bootstrap interval. Pure:
 * the report and colours in, an echarts option out. `labels` maps input names to what the axis shows.
 */
export function sensitivityChartOption(r: SensitivityReport, labels: Record<string, string>, c: ChartColours) {
  const inputs = r.indices.map((ix) => labels[ix.input] ?? ix.input);
  const level = Math.round(r.bootstrap.level * 100);
  const ci = (k: 'firstCI' | 'totalCI') =>
    r.indices.flatMap((ix, i): [number, number, number][] => (ix[k] ? [[i, ix[k][0], ix[k][1]]] : []));
  const lows = r.indices.flatMap((ix) => [ix.first ?? 0, ix.firstCI?.[0] ?? 0, ix.totalCI?.[0] ?? 0]);
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { fontFamily: 'Fira Sans, sans-serif', color: c.text },
    grid: { left: 64, right: 16, top: 40, bottom: 48 },
    legend: {
      top: 0,
      left: 8,
      textStyle: { color: c.text },
      data: ['First order', 'Total'],
    },
    tooltip: {
      trigger: 'axis',
      axisPointer: { type: 'shadow' },
      formatter: (items: { dataIndex: number }[]) => {
        const ix = r.indices[items[0]?.dataIndex ?? 0];
        if (!ix) return '';
        const range = (v: [number, number] | null) =>
          v ? ` (${level} %: ${formatNumber(v[0], 3)} to ${formatNumber(v[1], 3)})` : '';
        return [
          `<b>${inputs[items[0]?.dataIndex ?? 0]}</b>`,
          `First order ${formatNumber(ix.first, 3)}${range(ix.firstCI)}`,
          `Total ${formatNumber(ix.total, 3)}${range(ix.totalCI)}`,
        ].join('<br/>');
      },
    },
    xAxis: {
      type: 'category',
      data: inputs,
      axisLabel: { color: c.text },
      axisLine: { lineStyle: { color: c.axis } },
    },
    yAxis: {
      type: 'value',
      name: 'Sobol index (share of variance)',
      nameLocation: 'middle',
      nameGap: 44,
      min: Math.min(0, ...lows) < 0 ? (v: { min: number }) => Math.min(0, v.min) : 0,
      max: (v: { max: number }) => Math.max(1, v.max),
      axisLabel: { color: c.text, formatter: (v: number) => formatNumber(v, 2) },
      splitLine: { lineStyle: { color: c.axis, opacity: 0.35 } },
    },
    series: [
      {
        type: 'bar',
        name: 'First order',
        data: r.indices.map((ix) => ix.first),
        itemStyle: { color: c.first },
        barGap: '0%',
        barCategoryGap: `${Math.round((1 - 2 * BAR_SHARE) * 100)}%`,
      },
      { type: 'bar', name: 'Total', data: r.indices.map((ix) => ix.total), itemStyle: { color: c.total } },
      whiskers('First order interval', -1, ci('firstCI'), c.whisker),
      whiskers('Total interval', 1, ci('totalCI'), c.whisker),
    ],
  };
}
