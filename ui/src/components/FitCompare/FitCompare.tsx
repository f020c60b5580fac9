import { Alert, Badge, Paper, ScrollArea, Stack, Table, Text, useComputedColorScheme } from '@mantine/core';
import { useMemo } from 'react';
import type { FitView } from '../../api/fits.js';
import { prettyUnit } from '../../lib/format.js';
import { axis, baseOption } from '../FitPlot/FitPlot.js';
import { useChart } from '../../lib/chart/useChart.js';
import { Num } from '../Num/Num.js';
import { FitStatus } from '../FitResult/FitStatus.js';
import { parameterUnit } from '../FitResult/param-units.js';
import { bestBy, residualSeries, sameData } from './compare-series.js';

const PALETTE = ['#1f6f8b', '#c0612b', '#5b8c3a', '#8a4fa3', '#b8860b', '#4a5a66'];
const SYMBOLS = ['circle', 'triangle', 'diamond', 'rect', 'pin', 'arrow'];

/**
 * Two or more fits side by side: parameters, goodness of fit and information criteria in one table,
 * the lowest AIC/BIC marked, and every fit's residuals on one shared axis. Test hooks: `fit-compare`,
 * `compare-col-<id>`, `compare-residuals` (data-series).
 */
export function FitCompare({ fits }: { fits: FitView[] }) {
  const scheme = useComputedColorScheme('light');
  const text = scheme === 'dark' ? '#d5dde3' : '#27323a';
  const resid = useMemo(() => residualSeries(fits), [fits]);
  const yUnit = fits[0]?.units?.[fits[0].y];
  const option = useMemo(
    () => ({
      ...baseOption(text, 'residuals-compared'),
      xAxis: axis(
        resid.axis +
          (resid.shared && fits[0]?.units?.[resid.axis] ? ` (${prettyUnit(fits[0].units[resid.axis]!)})` : ''),
        false,
      ),
      yAxis: axis('observed − fitted' + (yUnit && yUnit !== '1' ? ` (${prettyUnit(yUnit)})` : ''), false),
      series: resid.series.map((s, k) => ({
        type: 'scatter',
        name: s.name,
        // Shapes as well as colours, so overlapping residuals of close fits stay distinguishable.
        symbol: SYMBOLS[k % SYMBOLS.length],
        symbolSize: 6,
        itemStyle: { color: PALETTE[k % PALETTE.length] },
        data: s.data,
      })),
    }),
    [resid, text, yUnit, fits],
  );
  const { ref } = useChart(option, { renderer: 'svg', dark: scheme === 'dark' });
  const names = [...new Set(fits.flatMap((f) => f.parameters?.map((p) => p.name) ?? []))];
  const aicBest = bestBy(fits, 'aic');
  const bicBest = bestBy(fits, 'bic');
  const row = (label: string, cell: (f: FitView, i: number) => React.ReactNode, testId?: string) => (
    <Table.Tr data-testid={testId}>
      <Table.Th>{label}</Table.Th>
      {fits.map((f, i) => (
        <Table.Td key={f.id} ta="right">
          {cell(f, i)}
        </Table.Td>
      ))}
    </Table.Tr>
  );
  return (
    <Stack gap="md" data-testid="fit-compare">
      {!sameData(fits) ? (
        <Alert color="orange" variant="light" title="Not the same data">
          These fits use different sources or y columns; their AIC and BIC cannot be compared.
        </Alert>
      ) : null}
      <Paper withBorder radius="sm">
        <ScrollArea>
          <Table fz="sm" withColumnBorders>
            <Table.Thead>
              <Table.Tr>
                <Table.Th />
                {fits.map((f) => (
                  <Table.Th key={f.id} ta="right" data-testid={`compare-col-${f.id}`}>
                    #{f.id} {f.model} <FitStatus fit={f} />
                  </Table.Th>
                ))}
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {names.map((name) =>
                row(name, (f) => {
                  const p = f.parameters?.find((q) => q.name === name);
                  if (!p) return '—';
                  const unit = parameterUnit(f, p);
                  return (
                    <>
                      <Num value={p.value} sig={6} /> ± <Num value={p.stdError} sig={2} />
                      {unit && unit !== '1' ? ` ${prettyUnit(unit)}` : ''}
                      {p.fixed ? ' (fixed)' : ''}
                    </>
                  );
                }),
              )}
              {row('Free parameters', (f) => f.parameters?.filter((p) => !p.fixed).length ?? '—')}
              {row('Points', (f) => (
                <Num value={f.n} />
              ))}
              {row('R² (dimensionless)', (f) => (
                <Num value={f.r2} sig={6} />
              ))}
              {row(`RMSE${yUnit && yUnit !== '1' ? ` (${prettyUnit(yUnit)})` : ''}`, (f) => (
                <Num value={f.rmse} sig={4} />
              ))}
              {row('χ² (dimensionless)', (f) => (f.chi2 !== undefined ? <Num value={f.chi2} sig={5} /> : '—'))}
              {row(
                'AIC (dimensionless)',
                (f, i) => (
                  <>
                    <Num value={f.aic} sig={6} />
                    {i === aicBest && fits.length > 1 ? (
                      <Badge ml={6} size="xs" color="moss" variant="light" tt="none">
                        lowest
                      </Badge>
                    ) : null}
                  </>
                ),
                'compare-aic',
              )}
              {row(
                'BIC (dimensionless)',
                (f, i) => (
                  <>
                    <Num value={f.bic} sig={6} />
                    {i === bicBest && fits.length > 1 ? (
                      <Badge ml={6} size="xs" color="moss" variant="light" tt="none">
                        lowest
                      </Badge>
                    ) : null}
                  </>
                ),
                'compare-bic',
              )}
            </Table.Tbody>
          </Table>
        </ScrollArea>
      </Paper>
      <Text fz="xs" c="dimmed">
        Lower AIC or BIC is the better trade of fit against parameter count; a difference below about 2 says little
        (common practice). BIC penalises extra parameters more as the number of points grows.
      </Text>
      <Paper withBorder p="xs" radius="sm">
        <div
          ref={ref}
          data-testid="compare-residuals"
          data-series={resid.series.length}
          style={{ height: 300, width: '100%' }}
          role="img"
          aria-label={`residuals of ${fits.length} fits against ${resid.axis}`}
        />
      </Paper>
    </Stack>
  );
}
