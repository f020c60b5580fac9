import { Group, Paper, SimpleGrid, Switch, Text, useComputedColorScheme } from '@mantine/core';
import { useMemo, useState } from 'react';
import { useChart } from '../../lib/chart/useChart.js';
import { formatNumber, prettyUnit } from '../../lib/format.js';
import type { FitPlotData } from '../FitResult/fit-types.js';
import { fitPlotSeries, type Pair } from './plot-series.js';
import { fitColours } from '../../theme/graphics.js';

export function axis(name: string, log: boolean) {
  return {
    type: log ? 'log' : 'value',
    name,
    nameLocation: 'middle',
    nameGap: 28,
    scale: true,
    axisLabel: { formatter: (v: number) => formatNumber(v, 3) },
  };
}

export function baseOption(text: string, file: string) {
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { fontFamily: 'Fira Sans, sans-serif', color: text },
    grid: { left: 72, right: 16, top: 34, bottom: 44 },
    legend: { top: 0, left: 8, textStyle: { color: text } },
    tooltip: {
      trigger: 'item',
      formatter: (p: { seriesName: string; value: Pair }) =>
        `${p.seriesName}<br/>${formatNumber(p.value[0], 5)}, ${formatNumber(p.value[1], 5)}`,
    },
    toolbox: { right: 8, feature: { saveAsImage: { type: 'svg', title: 'SVG', name: file } } },
  };
}

/**
 * Data with the fitted curve (one x), or predicted against observed on log–log (several x), and the
 * residuals. Points are the server's down-sampled set (at most 2,000). Test hook: `fit-plot` with
 * data-kind and data-points.
 */
export function FitPlot({
  plot,
  yName,
  unit,
  xUnit,
}: {
  plot: FitPlotData;
  yName: string;
  unit?: string;
  xUnit?: string;
}) {
  const scheme = useComputedColorScheme('light');
  // Scheme-aware colours: 3:1 against the card in both schemes (theme/graphics.ts).
  const { data: DATA, curve: FIT } = fitColours(scheme);
  const s = useMemo(() => fitPlotSeries(plot, yName), [plot, yName]);
  const [log, setLog] = useState(s.kind === 'parity' && s.logOk);
  const useLog = log && s.logOk;
  const text = scheme === 'dark' ? '#d5dde3' : '#27323a';
  const main = useMemo(
    () => ({
      ...baseOption(text, 'fit'),
      xAxis: axis(
        s.xLabel +
          (xUnit && s.kind === 'curve'
            ? ` (${prettyUnit(xUnit)})`
            : unit && s.kind === 'parity'
              ? ` (${prettyUnit(unit)})`
              : ''),
        useLog,
      ),
      yAxis: axis(s.yLabel + (unit ? ` (${prettyUnit(unit)})` : ''), useLog),
      series: [
        {
          type: 'scatter',
          name: s.kind === 'curve' ? 'data' : 'points',
          symbolSize: 5,
          itemStyle: { color: DATA },
          data: s.observed,
        },
        {
          type: 'line',
          name: s.kind === 'curve' ? 'fitted' : 'predicted = observed',
          showSymbol: false,
          lineStyle: { width: 2, color: FIT, type: s.kind === 'curve' ? 'solid' : 'dashed' },
          itemStyle: { color: FIT },
          data: s.fitted,
        },
      ],
    }),
    [s, useLog, text, unit, xUnit, DATA, FIT],
  );
  const resid = useMemo(
    () => ({
      ...baseOption(text, 'residuals'),
      xAxis: axis(
        s.residualXLabel +
          (s.kind === 'curve' ? (xUnit ? ` (${prettyUnit(xUnit)})` : '') : unit ? ` (${prettyUnit(unit)})` : ''),
        false,
      ),
      yAxis: axis('observed − fitted' + (unit ? ` (${prettyUnit(unit)})` : ''), false),
      series: [
        {
          type: 'scatter',
          name: 'residuals',
          symbolSize: 4,
          itemStyle: { color: DATA },
          data: s.residuals,
          markLine: {
            silent: true,
            symbol: 'none',
            lineStyle: { type: 'dashed', color: text, width: 1 },
            label: { show: false },
            data: [{ yAxis: 0 }],
          },
        },
      ],
    }),
    [s, text, unit, xUnit, DATA],
  );
  const { ref: mainRef } = useChart(main, { renderer: 'svg', dark: scheme === 'dark' });
  const { ref: residRef } = useChart(resid, { renderer: 'svg', dark: scheme === 'dark' });
  return (
    <div data-testid="fit-plot" data-kind={s.kind} data-points={s.observed.length}>
      <Group justify="space-between" mb={4}>
        <Text fz="xs" c="dimmed">
          {plot.shown < plot.total
            ? `Every ${Math.ceil(plot.total / plot.shown)}th of ${plot.total} points shown.`
            : `All ${plot.total} points shown.`}
          {s.kind === 'parity' ? ' Several inputs: predicted against observed; the dashed line is a perfect fit.' : ''}
        </Text>
        <Switch
          size="xs"
          label="Log axes"
          checked={useLog}
          disabled={!s.logOk}
          onChange={(e) => setLog(e.currentTarget.checked)}
          title={s.logOk ? '' : 'Log axes need positive values'}
        />
      </Group>
      <SimpleGrid cols={{ base: 1, md: 2 }} spacing="sm">
        <Paper withBorder p="xs" radius="sm">
          <div
            ref={mainRef}
            style={{ height: 260, width: '100%' }}
            role="img"
            aria-label={
              s.kind === 'curve'
                ? `${yName} against ${s.xLabel} with the fitted curve`
                : `predicted against observed ${yName}`
            }
          />
        </Paper>
        <Paper withBorder p="xs" radius="sm">
          <div
            ref={residRef}
            style={{ height: 260, width: '100%' }}
            role="img"
            aria-label={`residuals against ${s.residualXLabel}`}
          />
        </Paper>
      </SimpleGrid>
    </div>
  );
}
