import {
  Alert,
  Button,
  Group,
  MultiSelect,
  Paper,
  SegmentedControl,
  Select,
  Slider,
  Stack,
  Switch,
  Text,
  useComputedColorScheme,
} from '@mantine/core';
import { IconDownload } from '@tabler/icons-react';
import { useCallback, useMemo, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import {
  compileSweep,
  contourLines,
  getModel,
  regimeBoundaries,
  type HeatmapSeries,
  type LineSeries,
  type RegimeBoundary,
} from '@driftgrid/domain';
import { useLeadingRows, useResultRowReader, useSeries, useSeriesList, type SweepView } from '../../api/sweeps.js';
import { useChart } from '../../lib/chart/useChart.js';
import { formatCount, formatQuantity, prettyUnit } from '../../lib/format.js';
import {
  autoColourScale,
  CONTOUR_STYLES,
  heatmapOption,
  lineOption,
  scatterOption,
  type ColourScale,
  type ContourOverlay,
  type OverlaySeries,
  type ScatterPoint,
} from './chartOptions.js';
import { DatasetOverlay } from './DatasetOverlay.js';
import type { PlotAxisUnits } from './overlay.js';
import {
  axisOf,
  drawnGroups,
  heldAxes,
  MAX_GROUPS,
  readPlotState,
  seriesQuery,
  writePlotState,
  type PlotAxis,
  type PlotContext,
  type PlotState,
} from './plotState.js';
import { pointDetailHtml } from './pointDetail.js';

/** Points drawn in a scatter of a random design (read as result rows, every column). */
const SCATTER_POINTS = 2000;

/** What the plots need to know about a sweep: its axes with grid values, columns, flags and regimes. */
export function plotContext(sweep: Pick<SweepView, 'definition' | 'columns' | 'model'>): {
  ctx: PlotContext;
  regimes: RegimeBoundary[];
  flagNames: { bit: number; code: string }[];
  symbols: Record<string, string>;
} {
  let axes: PlotAxis[];
  let regimes: RegimeBoundary[] = [];
  let grid = (sweep.definition.sampling?.kind ?? 'grid') === 'grid';
  let flagNames: { bit: number; code: string }[];
  const symbols: Record<string, string> = {};
  try {
    const c = compileSweep({ ...sweep.definition, model: sweep.model });
    axes = c.axes.map((a) => ({
      param: a.param,
      unit: a.unit,
      kind: a.kind,
      count: a.count,
      values: a.values ? Array.from(a.values) : null,
    }));
    grid = c.definition.sampling.kind === 'grid';
    regimes = regimeBoundaries(c.model, c.thresholds);
    flagNames = c.model.flags.map((f) => ({ bit: f.bit, code: f.code }));
    for (const o of [...c.model.inputs, ...c.model.outputs]) symbols[o.name] = o.symbol;
  } catch {
    // A definition this ui cannot compile (an older model version): plot by column names alone.
    axes = (sweep.definition.axes ?? []).map((a) => ({
      param: a.param,
      unit: a.unit ?? '',
      kind: a.kind === 'log' ? 'log' : a.kind === 'list' ? 'list' : 'linear',
      count: a.kind === 'list' ? a.values.length : (a.count ?? 0),
      values: null,
    }));
    try {
      flagNames = getModel(sweep.model).flags.map((f) => ({ bit: f.bit, code: f.code }));
    } catch {
      flagNames = [];
    }
  }
  const numeric = sweep.columns
    .filter((c) => c.kind !== 'index' && c.kind !== 'flags' && c.type !== 'boolean')
    .map((c) => c.name);
  const outputs = sweep.columns.filter((c) => c.kind === 'output' || c.kind === 'derived').map((c) => c.name);
  const preferred =
    ['rho_i_over_Ln', 'vDi_ms', 'phi_V'].find((n) => outputs.includes(n)) ?? outputs[0] ?? numeric[0] ?? '';
  return { ctx: { axes, grid, numeric, preferred }, regimes, flagNames, symbols };
}

/** "ρ_i/L_n = 0.1" — the legend entry of a regime boundary. */
function boundaryLabel(b: RegimeBoundary, symbols: Record<string, string>): string {
  return `${symbols[b.output] ?? b.output} = ${formatQuantity(b.level, '')}`;
}

/** A heatmap series as a grid field for contouring: z[j][i] at (x[i], y[j]). */
function fieldOf(s: HeatmapSeries) {
  const z: (number | null)[][] = s.y.values.map(() => s.x.values.map(() => null));
  for (const [xi, yi, v] of s.cells) z[yi]![xi] = v;
  return { xs: s.x.values, ys: s.y.values, z };
}

function SlicePicker({
  axis,
  value,
  onChange,
  disabled,
}: {
  axis: PlotAxis;
  value: number;
  onChange: (k: number) => void;
  disabled: boolean;
}) {
  const label = (k: number) => (axis.values ? formatQuantity(axis.values[k], axis.unit) : `value ${k + 1}`);
  const title = `${axis.param} held at`;
  if (axis.count <= 12)
    return (
      <Select
        label={title}
        data={Array.from({ length: axis.count }, (_, k) => ({ value: String(k), label: label(k) }))}
        value={String(value)}
        onChange={(v) => v !== null && onChange(Number(v))}
        allowDeselect={false}
        disabled={disabled}
        w={190}
        data-testid={`slice-${axis.param}`}
      />
    );
  return (
    <Stack gap={2} w={240} data-testid={`slice-${axis.param}`}>
      <Text fz="sm" fw={500}>
        {title}{' '}
        <Text span fz="sm" fw={400} className="dg-num">
          {label(value)}
        </Text>
      </Text>
      <Slider
        min={0}
        max={axis.count - 1}
        step={1}
        value={value}
        onChange={onChange}
        label={label}
        disabled={disabled}
        aria-label={title}
        marks={[
          { value: 0, label: label(0) },
          { value: axis.count - 1, label: label(axis.count - 1) },
        ]}
        mb="md"
      />
    </Stack>
  );
}

/**
 * Plots of one sweep: a line (grouped by a swept input, the values to draw chosen), a heatmap over two swept
 * inputs (log colour when the data span decades, regime boundaries drawn where an ordering parameter equals
 * its threshold) or, for random designs, a scatter of two inputs coloured by an output. Swept inputs not on
 * the plot are held at a value the user picks. Everything is kept in the URL. Hovering a point shows every
 * input and output of it.
 */
export function SweepPlot({ sweep }: { sweep: SweepView }) {
  const { ctx, regimes: allRegimes, flagNames, symbols } = useMemo(() => plotContext(sweep), [sweep]);
  // A boundary can only cross the plot when its flag is raised at some points of the sweep but not all.
  const regimes = useMemo(
    () =>
      allRegimes.filter((r) => {
        const n = sweep.flagsSummary.byFlag[r.flag] ?? 0;
        return n > 0 && n < sweep.progress.done;
      }),
    [allRegimes, sweep.flagsSummary.byFlag, sweep.progress.done],
  );
  const [params, setParams] = useSearchParams();
  const state = useMemo(() => readPlotState(params, ctx), [params, ctx]);
  const update = useCallback(
    (patch: Partial<PlotState>) => setParams((p) => writePlotState(p, { ...state, ...patch }), { replace: true }),
    [setParams, state],
  );
  const scheme = useComputedColorScheme('light');
  const text = scheme === 'dark' ? '#d5dde3' : '#27323a';
  const readRow = useResultRowReader(sweep.id);
  const [overlay, setOverlay] = useState<OverlaySeries | null>(null);

  const columns = useMemo(() => new Map(sweep.columns.map((c) => [c.name, c])), [sweep.columns]);
  const unitOf = useCallback((name: string) => columns.get(name)?.unit ?? '', [columns]);
  // A model's own columns go by their symbol and name ("ρ_i/L_n · rho_i_over_Ln"); derived ones by name.
  const display = useCallback(
    (name: string) => (symbols[name] && symbols[name] !== name ? `${symbols[name]} · ${name}` : name),
    [symbols],
  );
  const symbolOnly = useCallback((name: string) => symbols[name] ?? name, [symbols]);
  const labelOf = (name: string) =>
    `${display(name)}${prettyUnit(unitOf(name)) ? ` (${prettyUnit(unitOf(name))})` : ''}`;
  const axisLog = (name: string) => axisOf(ctx, name)?.kind === 'log';
  const logX = state.log.x ?? axisLog(state.x);
  const logY = state.log.y ?? (state.kind === 'line' ? false : axisLog(state.y));
  const scales = useMemo(() => ({ x: logX, y: logY }), [logX, logY]);

  const query = useMemo(() => seriesQuery(state, ctx), [state, ctx]);
  const ready = sweep.progress.done > 0;
  const series = useSeries(sweep.id, query ?? {}, ready && query !== null);
  const data = query ? series.data : undefined;

  // Regime boundaries need their ordering parameter on the same grid: one more heatmap per parameter.
  const contourOutputs = useMemo(
    () =>
      state.kind === 'heatmap'
        ? [...new Set(regimes.map((r) => r.output))].filter((o) => o !== state.z && ctx.numeric.includes(o))
        : [],
    [state.kind, state.z, regimes, ctx.numeric],
  );
  const contourQueries = useMemo(
    () => contourOutputs.map((o) => ({ ...(query ?? {}), z: o })),
    [contourOutputs, query],
  );
  const contourData = useSeriesList(sweep.id, contourQueries, ready && state.kind === 'heatmap' && query !== null);
  const scatter = useLeadingRows(sweep.id, SCATTER_POINTS, ready && state.kind === 'scatter');

  const zValues = useMemo(() => {
    if (state.kind === 'heatmap' && data?.kind === 'heatmap') return (data as HeatmapSeries).cells.map((c) => c[2]);
    return [];
  }, [data, state.kind]);
  const colourChoice = autoColourScale(zValues);
  const colour: ColourScale =
    state.log.z === undefined ? colourChoice.auto : state.log.z && colourChoice.canLog ? colourChoice.canLog : 'linear';

  const contours = useMemo<ContourOverlay[]>(() => {
    if (state.kind !== 'heatmap' || data?.kind !== 'heatmap') return [];
    const main = data as HeatmapSeries;
    return regimes.flatMap((b, k) => {
      const src =
        b.output === state.z ? main : (contourData[contourOutputs.indexOf(b.output)] as HeatmapSeries | undefined);
      if (!src || src.kind !== 'heatmap') return [];
      const field = fieldOf(src);
      const positive = src.cells.every((c) => c[2] === null || c[2] > 0);
      const lines = contourLines(field, b.level, { logX: scales.x, logY: scales.y, logZ: positive && b.level > 0 });
      const style = CONTOUR_STYLES[k % CONTOUR_STYLES.length]!;
      return [{ name: boundaryLabel(b, symbols), lines, ...style }];
    });
  }, [state.kind, state.z, data, contourData, contourOutputs, regimes, scales, symbols]);

  const groups = state.kind === 'line' && state.groupBy ? drawnGroups(state, ctx) : null;
  const groupAxis = axisOf(ctx, state.groupBy);
  const groupNote =
    groups && groupAxis && !groups.all
      ? `${groups.digits.length} of ${groups.count} values of ${state.groupBy} drawn${state.groups ? ' (your choice)' : ', spread evenly'}`
      : undefined;

  // Hover: every input and output of the point under the cursor, fetched once per point and cached.
  const detail = useCallback(
    (idx: number | null, quick: string, ticket: string, done: (t: string, html: string) => void) => {
      if (idx === null) return quick;
      void readRow(idx).then((row) => {
        if (row) done(ticket, pointDetailHtml(row, sweep.columns, flagNames, quick));
      });
      return `${quick}<br/><span style="opacity:.7">Reading every value of this point…</span>`;
    },
    [readRow, sweep.columns, flagNames],
  );

  const scatterPoints = useMemo<ScatterPoint[]>(() => {
    if (state.kind !== 'scatter' || !scatter.data) return [];
    const num = (v: unknown) => (typeof v === 'number' ? v : null);
    return scatter.data.rows.flatMap((r) => {
      const x = num(r[state.x]);
      const y = num(r[state.y]);
      if (x === null || y === null) return [];
      return [{ x, y, z: num(r[state.z]), flagged: r.valid === false || r.valid === 0, row: r }];
    });
  }, [scatter.data, state.kind, state.x, state.y, state.z]);

  const option = useMemo(() => {
    if (state.kind === 'scatter') {
      if (!scatter.data) return null;
      const ax = (n: string) => ({ name: n, unit: unitOf(n), kind: columns.get(n)?.kind ?? 'input', meaning: '' });
      return scatterOption(
        scatterPoints,
        { x: ax(state.x), y: ax(state.y), z: ax(state.z) },
        { ...scales, z: false },
        text,
        (row) => pointDetailHtml(row, sweep.columns, flagNames),
        display,
        symbolOnly,
      );
    }
    if (!data) return null;
    return data.kind === 'heatmap'
      ? heatmapOption(data as HeatmapSeries, { ...scales, z: colour !== 'linear' }, text, {
          colour,
          contours,
          cellDetail: detail,
          label: display,
          barLabel: symbolOnly,
        })
      : lineOption(data as LineSeries, { ...scales, z: false }, text, state.kind === 'line' ? overlay : null, {
          note: groupNote,
          pointDetail: detail,
          label: display,
        });
  }, [
    state.kind,
    state.x,
    state.y,
    state.z,
    scatter.data,
    scatterPoints,
    data,
    scales,
    colour,
    contours,
    text,
    overlay,
    groupNote,
    detail,
    sweep.columns,
    flagNames,
    unitOf,
    columns,
    display,
    symbolOnly,
  ]);

  const chart = useChart(option, { dark: scheme === 'dark' });
  const base = `sweep-${sweep.id}-${state.kind}-${state.x}-${state.kind === 'line' ? state.z : `${state.y}-${state.z}`}`;
  const background = scheme === 'dark' ? '#1b2227' : '#ffffff';

  const plotUnits = useMemo<PlotAxisUnits>(
    () => ({ x: { name: state.x, unit: unitOf(state.x) }, y: { name: state.z, unit: unitOf(state.z) } }),
    [state.x, state.z, unitOf],
  );

  const axisNames = ctx.axes.map((a) => a.param);
  const axisOptions = axisNames.map((n) => ({ value: n, label: labelOf(n) }));
  const numericOptions = ctx.numeric.map((n) => ({ value: n, label: labelOf(n) }));
  const held = heldAxes(state, ctx);
  const error = state.kind === 'scatter' ? scatter.error : series.error;
  const isFetching = state.kind === 'scatter' ? scatter.isFetching : series.isFetching;
  const slice = data?.slice ?? {};
  const nonPositive =
    data?.kind === 'line' &&
    (scales.x || scales.y) &&
    (data as LineSeries).groups.some((g) =>
      g.points.some((p) => (scales.x && (p[0] ?? 0) <= 0) || (scales.y && (p[1] ?? 0) <= 0)),
    );
  const groupOptions =
    groupAxis?.values?.map((v, k) => ({ value: String(k), label: formatQuantity(v, groupAxis.unit) })) ?? [];

  return (
    <Stack gap="sm">
      <Group gap="sm" align="flex-end" wrap="wrap">
        <SegmentedControl
          value={state.kind}
          onChange={(v) => update({ kind: v as PlotState['kind'], x: state.x })}
          data={[
            { value: 'line', label: 'Line' },
            { value: 'heatmap', label: 'Heatmap', disabled: axisNames.length < 2 },
            { value: 'scatter', label: 'Scatter', disabled: axisNames.length < 2 },
          ]}
          aria-label="Plot type"
          data-testid="plot-kind"
        />
        <Select
          label="x"
          data={state.kind === 'line' ? numericOptions : axisOptions}
          value={state.x}
          onChange={(v) => v && update({ x: v, log: { ...state.log, x: undefined } })}
          w={180}
          searchable
          allowDeselect={false}
          data-testid="plot-x"
        />
        {state.kind !== 'line' ? (
          <Select
            label="y"
            data={axisOptions.filter((o) => o.value !== state.x)}
            value={state.y}
            onChange={(v) => v && update({ y: v, log: { ...state.log, y: undefined } })}
            w={180}
            allowDeselect={false}
            data-testid="plot-y"
          />
        ) : null}
        <Select
          label={state.kind === 'line' ? 'y' : 'Colour'}
          data={numericOptions}
          value={state.z}
          onChange={(v) => v && update({ z: v, log: { ...state.log, z: undefined } })}
          w={210}
          searchable
          allowDeselect={false}
          data-testid="plot-output"
        />
        {state.kind === 'line' && ctx.grid && axisOf(ctx, state.x) ? (
          <Select
            label="One line per"
            placeholder="No grouping"
            data={axisNames.filter((a) => a !== state.x).map((n) => ({ value: n, label: labelOf(n) }))}
            value={state.groupBy}
            onChange={(v) => update({ groupBy: v, groups: null })}
            clearable
            w={180}
            data-testid="plot-group-by"
          />
        ) : null}
      </Group>
      {held.length || groups ? (
        <Group gap="lg" align="flex-end" wrap="wrap" data-testid="slice-pickers">
          {groups && groupAxis?.values ? (
            <MultiSelect
              label={`Values of ${state.groupBy} drawn (at most ${MAX_GROUPS})`}
              data={groupOptions}
              value={groups.digits.map(String)}
              onChange={(v) => update({ groups: v.length ? v.map(Number).sort((a, b) => a - b) : null })}
              maxValues={MAX_GROUPS}
              searchable
              w={420}
              maxDropdownHeight={260}
              data-testid="plot-groups"
            />
          ) : null}

          {held.map((a) => (
            <SlicePicker
              key={a.param}
              axis={a}
              value={state.slice[a.param] ?? 0}
              onChange={(k) => update({ slice: { ...state.slice, [a.param]: k } })}
              disabled={state.mean}
            />
          ))}
          {state.kind === 'heatmap' ? (
            <Switch
              label="Average over these instead"
              checked={state.mean}
              onChange={(e) => update({ mean: e.currentTarget.checked })}
              data-testid="plot-average"
              mb={6}
            />
          ) : null}
        </Group>
      ) : null}
      <Group gap="lg" wrap="wrap">
        <Switch
          label="Log x"
          checked={scales.x}
          onChange={(e) => update({ log: { ...state.log, x: e.currentTarget.checked } })}
          data-testid="log-x"
        />
        <Switch
          label="Log y"
          checked={scales.y}
          onChange={(e) => update({ log: { ...state.log, y: e.currentTarget.checked } })}
          data-testid="log-y"
        />
        {state.kind === 'heatmap' ? (
          <Switch
            label={colourChoice.canLog === 'log-neg' ? 'Log colour (of −z)' : 'Log colour'}
            checked={colour !== 'linear'}
            disabled={!colourChoice.canLog}
            title={colourChoice.canLog ? '' : 'A log colour scale needs values of one sign and no zeros'}
            onChange={(e) => update({ log: { ...state.log, z: e.currentTarget.checked } })}
            data-testid="log-colour"
          />
        ) : null}
        <Group gap="xs" ml="auto">
          <Button
            size="xs"
            variant="default"
            leftSection={<IconDownload size={14} />}
            onClick={() => void chart.exportImage('png', `${base}.png`, background)}
            disabled={!option}
          >
            PNG
          </Button>
          <Button
            size="xs"
            variant="default"
            leftSection={<IconDownload size={14} />}
            onClick={() => void chart.exportImage('svg', `${base}.svg`, background)}
            disabled={!option}
          >
            SVG
          </Button>
        </Group>
      </Group>
      {state.kind === 'line' ? <DatasetOverlay plot={plotUnits} scales={scales} onOverlay={setOverlay} /> : null}
      {error ? (
        <Alert color="red" title="The plot could not be drawn">
          {error.message}
        </Alert>
      ) : null}
      {sweep.progress.done === 0 ? (
        <Text fz="sm" c="dimmed">
          Nothing to plot yet: the first chunk of points has not been stored.
        </Text>
      ) : null}
      <Paper withBorder radius="md" p="xs">
        <div
          ref={chart.ref}
          style={{ width: '100%', height: 500, opacity: isFetching ? 0.7 : 1 }}
          data-testid="sweep-plot"
          data-kind={state.kind}
          data-log-x={scales.x}
          data-log-y={scales.y}
          data-colour-scale={state.kind === 'heatmap' ? colour : undefined}
          data-contours={contours.map((c) => `${c.name}:${c.lines.length}`).join(';')}
          data-groups={groups ? groups.digits.join(',') : undefined}
          data-overlay-points={state.kind === 'line' && overlay ? overlay.points.length : 0}
          role="img"
          aria-label={`${state.kind} plot of ${state.z}`}
        />
      </Paper>
      <Text fz="xs" c="dimmed" data-testid="plot-caption">
        {groupNote ? `${groupNote}; pick others above. ` : ''}
        {state.kind !== 'scatter' && Object.keys(slice).length
          ? `${state.mean ? '' : 'Held at: '}${Object.entries(slice)
              .map(([p, v]) => `${p} = ${formatQuantity(v.value, v.unit)}`)
              .join(', ')}. `
          : ''}
        {state.kind === 'heatmap' && state.mean ? 'Each cell is the mean over the inputs not on the plot. ' : ''}
        {state.kind === 'heatmap' && colour !== 'linear' && state.log.z === undefined
          ? 'Log colour scale: the values span more than two decades. '
          : ''}
        {contours.length
          ? `Lines: where each ordering parameter equals its validity threshold (${contours.map((c) => c.name).join(', ')}). `
          : ''}
        {state.kind === 'scatter' && scatter.data
          ? `${formatCount(scatterPoints.length)} of ${formatCount(scatter.data.total)} points shown (the first by index). Triangles: at least one validity flag is raised. `
          : ''}
        {data && state.kind !== 'scatter'
          ? `${data.kind === 'heatmap' ? `${data.cells.length} cells` : `${(data as LineSeries).returned} points`} shown (${data.method}). Hatched or hollow: at least one validity flag is raised. Log axes drop values ≤ 0.`
          : ''}
        {nonPositive ? ' Some values are ≤ 0 and are left out on the log axis.' : ''} Hover a point for every input and
        output.
      </Text>
    </Stack>
  );
}
