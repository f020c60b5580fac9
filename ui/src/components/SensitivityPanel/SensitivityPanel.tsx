import { Alert, Group, Paper, Select, Skeleton, Stack, Text } from '@mantine/core';
import { IconAlertTriangle, IconInfoCircle } from '@tabler/icons-react';
import { getModel } from '@driftgrid/domain';
import { lazy, Suspense, useMemo, useState } from 'react';
import { ApiError } from '../../api/client.js';
import { useSensitivity } from '../../api/sensitivity.js';
import { ACTIVE, type SweepView } from '../../api/sweeps.js';
import { formatCount, formatNumber, prettyUnit } from '../../lib/format.js';
import { SensitivityTable } from './SensitivityTable.js';

// The chart module pulls in echarts: it loads with the first chart drawn.
const SensitivityChart = lazy(() => import('./SensitivityChart.js').then((m) => ({ default: m.SensitivityChart })));

/** Outputs worth analysing: numeric outputs and derived columns. */
function outputChoices(sweep: SweepView) {
  return sweep.columns
    .filter((c) => (c.kind === 'output' || c.kind === 'derived') && (c.type === 'float' || c.type === 'boolean'))
    .map((c) => ({
      value: c.name,
      label: `${c.name}${prettyUnit(c.unit) ? ` (${prettyUnit(c.unit)})` : ''}`,
      group: c.kind === 'derived' ? 'Derived' : 'Model outputs',
    }));
}

/** `T_e (Te_eV)`: the model's symbol for an input, with its column name. */
function inputLabels(sweep: SweepView): Record<string, string> {
  try {
    return Object.fromEntries(
      getModel(sweep.model).inputs.map((s) => [
        s.name,
        s.symbol && s.symbol !== s.name ? `${s.symbol} (${s.name})` : s.name,
      ]),
    );
  } catch {
    return {};
  }
}

/** A preferred first pick: the fluid-ordering parameter when the model has it. */
const PREFERRED = ['rho_i_over_Ln'];

/**
 * Sensitivity tab of a Saltelli-design sweep: pick an output, see how much of its variance each swept
 * input explains alone (first order) and with interactions (total), as bars with interval whiskers and
 * as a table. Test hooks: `sensitivity-output`, `sensitivity-chart`, `sensitivity-table`,
 * `sensitivity-row-<input>` (data-first, data-total).
 */
export function SensitivityPanel({ sweep }: { sweep: SweepView }) {
  const choices = useMemo(() => outputChoices(sweep), [sweep]);
  const labels = useMemo(() => inputLabels(sweep), [sweep]);
  const [output, setOutput] = useState<string | null>(
    () => choices.find((c) => PREFERRED.includes(c.value))?.value ?? choices[0]?.value ?? null,
  );
  const live = ACTIVE.includes(sweep.status);
  const { data, error, isLoading, isFetching } = useSensitivity(sweep.id, output, live);
  const groups = useMemo(() => {
    const by = new Map<string, { value: string; label: string }[]>();
    for (const c of choices) by.set(c.group, [...(by.get(c.group) ?? []), { value: c.value, label: c.label }]);
    return [...by].map(([group, items]) => ({ group, items }));
  }, [choices]);
  const sampling = sweep.definition.sampling;
  const samples = sampling && 'samples' in sampling ? sampling.samples : 0;
  const dims = sweep.definition.axes?.length ?? 0;

  return (
    <Stack gap="md" data-testid="sensitivity-panel">
      <Group align="flex-end" wrap="wrap" gap="md">
        <Select
          label="Output"
          description="Which result column to explain"
          data={groups}
          value={output}
          onChange={setOutput}
          searchable
          allowDeselect={false}
          w={320}
          data-testid="sensitivity-output"
        />
        <Text fz="sm" c="dimmed" maw={560}>
          Design: {formatCount(samples)} sample groups × ({dims} inputs + 2) = {formatCount(sweep.points)} points.
          {live ? ' The sweep is still computing; the indices use the groups finished so far.' : ''}
        </Text>
      </Group>

      {error ? (
        <Alert
          color={error instanceof ApiError && error.status === 409 ? 'yellow' : 'red'}
          variant="light"
          icon={<IconAlertTriangle size={16} />}
          title="No indices for this output yet"
        >
          {error.message}
        </Alert>
      ) : null}

      {isLoading ? <Skeleton h={340} /> : null}

      {data ? (
        <Stack gap="sm" style={{ opacity: isFetching && data.output !== output ? 0.6 : 1 }}>
          {data.variance === 0 ? (
            <Alert color="gray" variant="light" icon={<IconInfoCircle size={16} />} title="This output does not vary">
              {data.output} takes the same value at every point of the design, so no input drives it.
            </Alert>
          ) : (
            <Paper withBorder p="sm" radius="sm">
              <Suspense fallback={<Skeleton h={340} />}>
                <SensitivityChart report={data} labels={labels} />
              </Suspense>
            </Paper>
          )}
          <SensitivityTable report={data} labels={labels} />
          <Text fz="xs" c="dimmed" data-testid="sensitivity-method">
            First order: the share of the variance of {data.output} that the input explains on its own. Total: the share
            it takes part in, alone or together with other inputs; total minus first order is what it does only through
            interactions. Bars are estimates from {formatCount(data.n)} complete sample groups
            {data.dropped ? ` (${formatCount(data.dropped)} left out: not computed yet or not a finite value)` : ''};
            whiskers are {Math.round(data.bootstrap.level * 100)} % percentile-bootstrap intervals (
            {formatCount(data.bootstrap.resamples)} resamples of{' '}
            {data.bootstrap.units < data.n ? `${formatCount(data.bootstrap.units)} blocks of groups` : 'the groups'},
            seed {data.bootstrap.seed}). Output variance {formatNumber(data.variance, 3)}
            {prettyUnit(data.unit) ? ` (${prettyUnit(data.unit)})²` : ''}. Estimators: first order after Saltelli et al.
            2010, total after Jansen 1999.
          </Text>
        </Stack>
      ) : null}
    </Stack>
  );
}
