import { useComputedColorScheme } from '@mantine/core';
import type { SensitivityReport } from '@driftgrid/domain';
import { useEffect, useMemo, useRef } from 'react';
import { sensitivityChartOption, type ChartColours } from './chart-option.js';

type Chart = { dispose(): void; resize(): void; setOption(o: unknown): void };

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
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    let disposed = false;
    let chart: Chart | null = null;
    const onResize = () => chart?.resize();
    void import('./echarts.js').then(({ init }) => {
      if (disposed || !ref.current) return;
      chart = init(ref.current, scheme === 'dark' ? 'dark' : undefined, { renderer: 'svg' });
      chart.setOption(option);
      window.addEventListener('resize', onResize);
    });
    return () => {
      disposed = true;
      window.removeEventListener('resize', onResize);
      chart?.dispose();
    };
  }, [option, scheme]);
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
