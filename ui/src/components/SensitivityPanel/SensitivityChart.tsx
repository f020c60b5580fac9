import { useComputedColorScheme } from '@mantine/core';
import type { SensitivityReport } from '@driftgrid/domain';
import { useMemo } from 'react';
import { useChart } from '../../lib/chart/useChart.js';
import { sensitivityChartOption, type ChartColours } from './chart-option.js';

// Our own pair, told apart by lightness as well as hue; the dark-scheme shades keep ≥ 3:1 on the background.
const LIGHT: ChartColours = {
  text: '#373a40',
  axis: '#868e96',
  first: '#1f6f8b',
  total: '#c0612b',
  whisker: '#212529',
};
const DARK: ChartColours = { text: '#c9c9c9', axis: '#5c5f66', first: '#5fb3d1', total: '#e8915e', whisker: '#f1f3f5' };

/** First-order and total indices per input as bars with interval whiskers (echarts loads lazily). */
export function SensitivityChart({ report, labels }: { report: SensitivityReport; labels: Record<string, string> }) {
  const scheme = useComputedColorScheme('light');
  const option = useMemo(
    () => sensitivityChartOption(report, labels, scheme === 'dark' ? DARK : LIGHT),
    [report, labels, scheme],
  );
  const { ref } = useChart(option, { renderer: 'svg', dark: scheme === 'dark' });
  return (
    <div
      ref={ref}
      data-testid="sensitivity-chart"
      role="img"
      aria-label={`Bar chart of first-order and total Sobol indices of ${report.output} per input`}
      style={{ width: '100%', height: 340 }}
    />
  );
}
