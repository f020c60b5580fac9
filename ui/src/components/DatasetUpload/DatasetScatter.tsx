import { Group, Paper, Select, Stack, Switch, Text, useComputedColorScheme } from '@mantine/core';
import { useMemo, useState } from 'react';
import { useChart } from '../../lib/chart/useChart.js';
import type { DatasetColumn } from '@driftgrid/domain';
import { formatNumber, prettyUnit } from '../../lib/format.js';
import { useDatasetSeries } from '../../api/datasets.js';

const axisName = (c: { name: string; unit: string }) =>
  prettyUnit(c.unit) ? `${c.name} [${prettyUnit(c.unit)}]` : c.name;

/** A quick scatter of two numeric columns (canonical units), echarts loaded on first draw. */
export function DatasetScatter({ datasetId, columns }: { datasetId: number; columns: DatasetColumn[] }) {
  const numeric = columns.filter((c) => c.kind === 'number');
  const [x, setX] = useState<string | null>(numeric[0]?.name ?? null);
  const [y, setY] = useState<string | null>(numeric[1]?.name ?? numeric[0]?.name ?? null);
  const [logX, setLogX] = useState(false);
  const [logY, setLogY] = useState(false);
  const series = useDatasetSeries(datasetId, x, y);
  const scheme = useComputedColorScheme('light');

  const option = useMemo(() => {
    const data = series.data;
    if (!data) return null;
    const text = scheme === 'dark' ? '#d5dde3' : '#27323a';
    const pts = data.points.x
      .map((v, i) => [v, data.points.y[i]])
      .filter(([a, b]) => (!logX || a > 0) && (!logY || b > 0));
    return {
      backgroundColor: 'transparent',
      animation: false,
      textStyle: { fontFamily: 'Fira Sans, sans-serif', color: text },
      grid: { left: 80, right: 24, top: 16, bottom: 56 },
      tooltip: {
        trigger: 'item',
        formatter: (p: { value: [number, number] }) =>
          `${data.x.name} = ${formatNumber(p.value[0])} ${prettyUnit(data.x.unit)}<br/>${data.y.name} = ${formatNumber(p.value[1])} ${prettyUnit(data.y.unit)}`,
      },
      xAxis: {
        type: logX ? 'log' : 'value',
        name: axisName(data.x),
        nameLocation: 'middle',
        nameGap: 32,
        scale: true,
        axisLabel: { formatter: (v: number) => formatNumber(v, 3) },
      },
      yAxis: {
        type: logY ? 'log' : 'value',
        name: axisName(data.y),
        nameLocation: 'middle',
        nameGap: 62,
        scale: true,
        axisLabel: { formatter: (v: number) => formatNumber(v, 3) },
      },
      series: [
        { type: 'scatter', symbolSize: 6, data: pts, itemStyle: { color: '#1f6f8b' }, large: pts.length > 5000 },
      ],
    };
  }, [series.data, scheme, logX, logY]);
  const { ref } = useChart(option, { dark: scheme === 'dark' });

  if (numeric.length === 0) {
    return (
      <Text size="sm" c="dimmed">
        This dataset has no numeric columns to plot.
      </Text>
    );
  }
  const options = numeric.map((c) => ({ value: c.name, label: axisName({ name: c.name, unit: c.canonicalUnit }) }));
  return (
    <Paper withBorder p="md">
      <Stack gap="sm">
        <Group gap="md" align="flex-end">
          <Select label="x" data={options} value={x} onChange={setX} allowDeselect={false} w={220} />
          <Switch label="log x" checked={logX} onChange={(e) => setLogX(e.currentTarget.checked)} />
          <Select label="y" data={options} value={y} onChange={setY} allowDeselect={false} w={220} />
          <Switch label="log y" checked={logY} onChange={(e) => setLogY(e.currentTarget.checked)} />
        </Group>
        <div
          ref={ref}
          style={{ width: '100%', height: 340 }}
          role="img"
          aria-label={`Scatter plot of ${y} against ${x}`}
        />
        {series.data ? (
          <Text size="xs" c="dimmed">
            {series.data.n} of {series.data.total} points with both values
            {series.data.n < series.data.total ? ' (thinned evenly)' : ''}.
          </Text>
        ) : null}
      </Stack>
    </Paper>
  );
}

export default DatasetScatter;
