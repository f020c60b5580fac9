import { Paper, SimpleGrid, Text, useComputedColorScheme } from '@mantine/core';
import { useMemo } from 'react';
import { useChart } from '../../lib/chart/useChart.js';
import type { Profile } from '@driftgrid/domain';
import { formatNumber, formatQuantity, prettyUnit } from '../../lib/format.js';

export interface ProfilePlotProps {
  profile: Profile;
  /** Gaussian width a (m), drawn as a dashed vertical line on every panel. */
  a_m: number;
}

interface ProfileSeries {
  key: string;
  label: string;
}

interface Panel {
  title: string;
  unit: string;
  series: ProfileSeries[];
}

const PANELS: Panel[] = [
  { title: 'Electron density n', unit: 'm^-3', series: [{ key: 'n_m3', label: 'n' }] },
  { title: 'Pressure p', unit: 'Pa', series: [{ key: 'p_Pa', label: 'p' }] },
  {
    title: 'Azimuthal drifts (+ counter-clockwise from +z)',
    unit: 'm/s',
    series: [
      { key: 'vDe_ms', label: 'v_De' },
      { key: 'vDi_ms', label: 'v_Di' },
      { key: 'vE_ms', label: 'v_E' },
    ],
  },
  { title: 'Diamagnetic current density j_θ', unit: 'A/m^2', series: [{ key: 'jTheta_Am2', label: 'j_θ' }] },
  { title: 'Magnetic field B (pressure balance)', unit: 'T', series: [{ key: 'B_T', label: 'B' }] },
];

// Three well-separated hues of our palette family, distinguishable also by dash pattern.
const COLORS = ['#1f6f8b', '#c0612b', '#5b7f2a'];
const DASHES: ('solid' | 'dashed' | 'dotted')[] = ['solid', 'dashed', 'dotted'];

function ProfileChart({ panel, profile, a_m }: { panel: Panel; profile: Profile; a_m: number }) {
  const scheme = useComputedColorScheme('light');
  const option = useMemo(() => {
    const r = profile.r_m ?? [];
    const text = scheme === 'dark' ? '#d5dde3' : '#27323a';
    return {
      backgroundColor: 'transparent',
      animation: false,
      textStyle: { fontFamily: 'Fira Sans, sans-serif', color: text },
      grid: { left: 64, right: 16, top: 30, bottom: 40 },
      legend: panel.series.length > 1 ? { top: 0, right: 8, textStyle: { color: text } } : undefined,
      tooltip: {
        trigger: 'axis',
        valueFormatter: (v: number) => formatQuantity(v, panel.unit),
        axisPointer: { type: 'line' },
      },
      toolbox: {
        right: panel.series.length > 1 ? 160 : 8,
        feature: { saveAsImage: { type: 'svg', title: 'SVG', name: panel.series[0]!.key } },
      },
      xAxis: {
        type: 'value',
        name: 'r (m)',
        nameLocation: 'middle',
        nameGap: 26,
        min: 0,
        max: r[r.length - 1],
        axisLabel: { formatter: (v: number) => formatNumber(v, 3) },
      },
      yAxis: {
        type: 'value',
        name: prettyUnit(panel.unit),
        scale: panel.series[0]!.key === 'B_T',
        // B changes by parts in 10⁵ at low β: its ticks need more figures to differ.
        axisLabel: { formatter: (v: number) => formatNumber(v, panel.series[0]!.key === 'B_T' ? 7 : 3) },
      },
      series: panel.series.map((s, i) => ({
        type: 'line',
        name: s.label,
        showSymbol: false,
        lineStyle: { width: 2, color: COLORS[i], type: DASHES[i] },
        itemStyle: { color: COLORS[i] },
        data: r.map((x, k) => [x, profile[s.key]?.[k] ?? null]),
        markLine:
          i === 0
            ? {
                silent: true,
                symbol: 'none',
                lineStyle: { type: 'dashed', color: text, width: 1 },
                label: { formatter: `a = ${formatQuantity(a_m, 'm', 3)}`, color: text },
                data: [{ xAxis: a_m }],
              }
            : undefined,
      })),
    };
  }, [panel, profile, a_m, scheme]);
  const { ref } = useChart(option, { renderer: 'svg', dark: scheme === 'dark' });
  return (
    <Paper withBorder p="xs" radius="sm">
      <Text fz="sm" fw={500} mb={4}>
        {panel.title}{' '}
        <Text span c="dimmed" fz="xs">
          ({prettyUnit(panel.unit)})
        </Text>
      </Text>
      <div
        ref={ref}
        style={{ height: 220, width: '100%' }}
        role="img"
        aria-label={`${panel.title} against radius; dashed line at the width a`}
      />
    </Paper>
  );
}

/** Radial profiles of the Gaussian column (n, p, drifts, j_θ, B) with the width a marked on each. */
export function ProfilePlot({ profile, a_m }: ProfilePlotProps) {
  return (
    <div data-testid="profile-plot" data-a={a_m} data-nodes={profile.r_m?.length ?? 0}>
      <SimpleGrid cols={{ base: 1, lg: 2 }} spacing="sm">
        {PANELS.map((p) => (
          <ProfileChart key={p.title} panel={p} profile={profile} a_m={a_m} />
        ))}
      </SimpleGrid>
      <Text fz="xs" c="dimmed" mt={4}>
        Dashed vertical line: the Gaussian width a = {formatQuantity(a_m, 'm')}, where n has fallen to n₀/e.
      </Text>
    </div>
  );
}
