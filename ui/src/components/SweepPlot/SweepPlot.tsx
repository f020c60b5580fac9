import {
  Alert,
  Button,
  Group,
  Paper,
  SegmentedControl,
  Select,
  Stack,
  Switch,
  Text,
  useComputedColorScheme,
} from '@mantine/core';
import { IconDownload } from '@tabler/icons-react';
import { useEffect, useMemo, useRef, useState } from 'react';
import type { HeatmapSeries, LineSeries } from '@driftgrid/domain';
import { formatQuantity, prettyUnit } from '../../lib/format.js';
import { useSeries, type SweepView } from '../../api/sweeps.js';
import { heatmapOption, lineOption, type OverlaySeries, type Scales } from './chartOptions.js';
import { DatasetOverlay } from './DatasetOverlay.js';
import type { PlotAxisUnits } from './overlay.js';

type Chart = {
  dispose(): void;
  resize(): void;
  setOption(o: unknown, notMerge?: boolean): void;
  getDataURL(o: object): string;
};

/** Which plot fits the sweep: one swept input → a line; two or more → a heatmap over the first two. */
export function defaultPlot(sweep: Pick<SweepView, 'definition' | 'columns'>) {
  const axes = (sweep.definition.axes ?? []).map((a) => a.param);
  const outputs = sweep.columns
    .filter((c) => (c.kind === 'output' || c.kind === 'derived') && c.type !== 'boolean')
    .map((c) => c.name);
  const preferred = ['rho_i_over_Ln', 'vDi_ms', 'phi_V'].find((n) => outputs.includes(n)) ?? outputs[0] ?? '';
  return {
    kind: axes.length >= 2 ? ('heatmap' as const) : ('line' as const),
    axes,
    outputs,
    x: axes[0] ?? '',
    y: axes[1] ?? '',
    z: preferred,
  };
}

function download(url: string, name: string) {
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
}

/** Plots of one sweep: line or heatmap, log/linear per axis, hover read-out, PNG and SVG export. */
export function SweepPlot({ sweep }: { sweep: SweepView }) {
  const d = useMemo(() => defaultPlot(sweep), [sweep]);
  const inputs = sweep.columns.filter((c) => c.kind === 'input').map((c) => c.name);
  const logAxis = (name: string) => sweep.definition.axes?.find((a) => a.param === name)?.kind === 'log';
  const [kind, setKind] = useState<'line' | 'heatmap'>(d.kind);
  const [x, setX] = useState(d.x);
  const [y2, setY2] = useState(d.y); // heatmap y: a swept input
  const [out, setOut] = useState(d.z); // line y / heatmap z
  const [groupBy, setGroupBy] = useState<string | null>(d.axes[1] ?? null);
  const [mean, setMean] = useState(false);
  const [scales, setScales] = useState<Scales>({ x: logAxis(d.x), y: kind === 'heatmap' && logAxis(d.y), z: false });
  useEffect(() => setScales((s) => ({ ...s, x: logAxis(x) })), [x]); // eslint-disable-line react-hooks/exhaustive-deps
  useEffect(() => setScales((s) => ({ ...s, y: kind === 'heatmap' ? logAxis(y2) : false })), [kind, y2]); // eslint-disable-line react-hooks/exhaustive-deps

  const groupCount = (name: string | null) => {
    const a = sweep.definition.axes?.find((ax) => ax.param === name);
    return a ? (a.count ?? a.values?.length ?? 0) : 0;
  };
  const query =
    kind === 'heatmap'
      ? { kind, x, y: y2, z: out, maxPoints: 4000, ...(mean ? { agg: 'mean' } : {}) }
      : {
          kind,
          x,
          y: out,
          groupBy: groupBy && groupBy !== x && groupCount(groupBy) <= 20 ? groupBy : undefined,
          maxPoints: 2000,
        };
  const ready = !!x && !!out && (kind === 'line' || (!!y2 && y2 !== x));
  const { data, error, isFetching } = useSeries(sweep.id, query, ready && sweep.progress.done > 0);

  const ref = useRef<HTMLDivElement>(null);
  const chart = useRef<Chart | null>(null);
  const scheme = useComputedColorScheme('light');
  const text = scheme === 'dark' ? '#d5dde3' : '#27323a';
  const [overlay, setOverlay] = useState<OverlaySeries | null>(null);
  const unitOf = (name: string) => sweep.columns.find((c) => c.name === name)?.unit ?? '';
  const plotUnits = useMemo<PlotAxisUnits>(
    () => ({ x: { name: x, unit: unitOf(x) }, y: { name: out, unit: unitOf(out) } }),
    [x, out, sweep.columns],
  ); // eslint-disable-line react-hooks/exhaustive-deps
  const overlayScales = useMemo(() => ({ x: scales.x, y: scales.y }), [scales.x, scales.y]);
  const option = useMemo(() => {
    if (!data) return null;
    return data.kind === 'heatmap'
      ? heatmapOption(data as HeatmapSeries, scales, text)
      : lineOption(data as LineSeries, scales, text, kind === 'line' ? overlay : null);
  }, [data, scales, text, overlay, kind]);
  const latest = useRef(option);
  latest.current = option;

  useEffect(() => {
    let disposed = false;
    const onResize = () => chart.current?.resize();
    void import('./echarts.js').then(({ init }) => {
      if (disposed || !ref.current) return;
      chart.current = init(ref.current, undefined, { renderer: 'canvas' }) as unknown as Chart;
      if (latest.current) chart.current.setOption(latest.current, true);
      window.addEventListener('resize', onResize);
    });
    return () => {
      disposed = true;
      window.removeEventListener('resize', onResize);
      chart.current?.dispose();
      chart.current = null;
    };
  }, []); // eslint-disable-line react-hooks/exhaustive-deps
  useEffect(() => {
    if (option && chart.current) chart.current.setOption(option, true);
  }, [option]);

  const base = `sweep-${sweep.id}-${kind}-${x}-${kind === 'heatmap' ? `${y2}-${out}` : out}`;
  const exportPng = () => {
    if (chart.current)
      download(
        chart.current.getDataURL({
          type: 'png',
          pixelRatio: 2,
          backgroundColor: scheme === 'dark' ? '#1b2227' : '#ffffff',
        }),
        `${base}.png`,
      );
  };
  const exportSvg = async () => {
    if (!option) return;
    // The screen chart draws on canvas; SVG comes from a second, off-screen chart with the SVG renderer.
    const { init } = await import('./echarts.js');
    const host = document.createElement('div');
    host.style.cssText = `position:fixed;left:-10000px;top:0;width:${ref.current?.clientWidth ?? 900}px;height:${ref.current?.clientHeight ?? 480}px`;
    document.body.appendChild(host);
    const svg = init(host, undefined, { renderer: 'svg' }) as unknown as Chart;
    svg.setOption(option, true);
    download(svg.getDataURL({ type: 'svg' }), `${base}.svg`);
    svg.dispose();
    host.remove();
  };

  const numeric = sweep.columns
    .filter((c) => c.kind !== 'index' && c.kind !== 'flags' && c.type !== 'boolean')
    .map((c) => ({ value: c.name, label: `${c.name}${prettyUnit(c.unit) ? ` (${prettyUnit(c.unit)})` : ''}` }));
  const sweptOrInputs = (d.axes.length ? d.axes : inputs).map((n) => ({ value: n, label: n }));
  const slice = data?.slice ?? {};
  const nonPositive =
    data?.kind === 'line' &&
    (scales.x || scales.y) &&
    (data as LineSeries).groups.some((g) =>
      g.points.some((p) => (scales.x && (p[0] ?? 0) <= 0) || (scales.y && (p[1] ?? 0) <= 0)),
    );

  return (
    <Stack gap="sm">
      <Group gap="sm" align="flex-end" wrap="wrap">
        <SegmentedControl
          value={kind}
          onChange={(v) => setKind(v as typeof kind)}
          data={[
            { value: 'line', label: 'Line' },
            { value: 'heatmap', label: 'Heatmap', disabled: d.axes.length < 2 },
          ]}
          aria-label="Plot type"
        />
        <Select
          label="x"
          data={kind === 'heatmap' ? sweptOrInputs : numeric}
          value={x}
          onChange={(v) => v && setX(v)}
          w={170}
          allowDeselect={false}
        />
        {kind === 'heatmap' ? (
          <Select
            label="y"
            data={sweptOrInputs.filter((o) => o.value !== x)}
            value={y2}
            onChange={(v) => v && setY2(v)}
            w={170}
            allowDeselect={false}
          />
        ) : null}
        <Select
          label={kind === 'heatmap' ? 'Colour (z)' : 'y'}
          data={numeric}
          value={out}
          onChange={(v) => v && setOut(v)}
          w={200}
          searchable
          allowDeselect={false}
          data-testid="plot-output"
        />
        {kind === 'line' ? (
          <Select
            label="One line per"
            placeholder="No grouping"
            data={d.axes.filter((a) => a !== x).map((n) => ({ value: n, label: n }))}
            value={groupBy}
            onChange={setGroupBy}
            clearable
            w={170}
          />
        ) : null}
      </Group>
      <Group gap="lg" wrap="wrap">
        <Switch
          label="Log x"
          checked={scales.x}
          onChange={(e) => setScales({ ...scales, x: e.currentTarget.checked })}
          data-testid="log-x"
        />
        <Switch
          label="Log y"
          checked={scales.y}
          onChange={(e) => setScales({ ...scales, y: e.currentTarget.checked })}
          data-testid="log-y"
        />
        {kind === 'heatmap' ? (
          <>
            <Switch
              label="Log colour"
              checked={scales.z}
              onChange={(e) => setScales({ ...scales, z: e.currentTarget.checked })}
            />
            {d.axes.length > 2 ? (
              <Switch
                label="Average over the other inputs"
                checked={mean}
                onChange={(e) => setMean(e.currentTarget.checked)}
              />
            ) : null}
          </>
        ) : null}
        <Group gap="xs" ml="auto">
          <Button
            size="xs"
            variant="default"
            leftSection={<IconDownload size={14} />}
            onClick={exportPng}
            disabled={!option}
          >
            PNG
          </Button>
          <Button
            size="xs"
            variant="default"
            leftSection={<IconDownload size={14} />}
            onClick={() => void exportSvg()}
            disabled={!option}
          >
            SVG
          </Button>
        </Group>
      </Group>
      {kind === 'line' ? <DatasetOverlay plot={plotUnits} scales={overlayScales} onOverlay={setOverlay} /> : null}
      {error ? (
        <Alert color="red" title="The plot could not be drawn">
          {(error as Error).message}
        </Alert>
      ) : null}
      {sweep.progress.done === 0 ? (
        <Text fz="sm" c="dimmed">
          Nothing to plot yet: the first chunk of points has not been stored.
        </Text>
      ) : null}
      <Paper withBorder radius="md" p="xs">
        <div
          ref={ref}
          style={{ width: '100%', height: 480, opacity: isFetching ? 0.7 : 1 }}
          data-testid="sweep-plot"
          data-log-x={scales.x}
          data-log-y={scales.y}
          data-overlay-points={kind === 'line' && overlay ? overlay.points.length : 0}
          role="img"
          aria-label={`${kind} plot of ${out}`}
        />
      </Paper>
      <Text fz="xs" c="dimmed">
        {Object.keys(slice).length
          ? `Other swept inputs held at: ${Object.entries(slice)
              .map(([p, v]) => `${p} = ${formatQuantity(v.value, v.unit)}${v.index === 0 ? ' (first value)' : ''}`)
              .join(', ')}. `
          : ''}
        {data
          ? `${data.kind === 'heatmap' ? `${data.cells.length} cells` : `${(data as LineSeries).returned} points`} shown (${data.method}). Hatched or shaded: at least one validity flag is raised. Log axes drop values ≤ 0.`
          : ''}
        {nonPositive ? ' Some values are ≤ 0 and are left out on the log axis.' : ''}
      </Text>
    </Stack>
  );
}
