import { Alert, Anchor, Group, Loader, Select, Stack, Switch, Text } from '@mantine/core';
import { IconAlertTriangle } from '@tabler/icons-react';
import { useEffect, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { useDatasetList, useDatasetSeries } from '../../api/datasets.js';
import { prettyUnit } from '../../lib/format.js';
import type { OverlaySeries } from './chartOptions.js';
import {
  defaultOverlayColumns,
  numericColumns,
  overlaySummary,
  planOverlay,
  type OverlayScales,
  type PlotAxisUnits,
} from './overlay.js';

const LIST = { pageSize: 200 };

/** "an x column in eV" / "a dimensionless y column". */
const wanted = (axis: 'x' | 'y', unit: string) =>
  prettyUnit(unit)
    ? `${axis === 'x' ? 'an' : 'a'} ${axis} column in ${prettyUnit(unit)}`
    : `a dimensionless ${axis} column`;
const MAX_POINTS = 5000;

/**
 * "Overlay a dataset" on a line plot: pick one of the datasets the user may read and two of its
 * numeric columns; the points go to the parent (onOverlay) only when both units match the plot's.
 * Mismatched units give a warning naming both units instead of a misleading picture.
 */
export function DatasetOverlay({
  plot,
  scales,
  onOverlay,
}: {
  plot: PlotAxisUnits;
  scales: OverlayScales;
  onOverlay: (o: OverlaySeries | null) => void;
}) {
  const [on, setOn] = useState(false);
  const [datasetId, setDatasetId] = useState<string | null>(null);
  const [x, setX] = useState<string | null>(null);
  const [y, setY] = useState<string | null>(null);

  const list = useDatasetList(LIST, on);
  const datasets = list.data?.items ?? [];
  const dataset = datasets.find((d) => String(d.id) === datasetId) ?? null;
  const columns = dataset ? numericColumns(dataset.columns) : [];

  const pick = (id: string | null) => {
    setDatasetId(id);
    const d = datasets.find((ds) => String(ds.id) === id);
    const def = d ? defaultOverlayColumns(d.columns, { xUnit: plot.x.unit, yUnit: plot.y.unit }) : { x: null, y: null };
    setX(def.x);
    setY(def.y);
  };

  const series = useDatasetSeries(datasetId, x, y, { maxPoints: MAX_POINTS, enabled: on });
  const plan = useMemo(
    () => (series.data && on ? planOverlay(series.data, plot, scales) : null),
    [series.data, on, plot, scales],
  );
  const name = dataset ? `Dataset: ${dataset.name}` : '';
  const overlay = plan?.ok ? { name, points: plan.points } : null;
  const key = overlay
    ? `${name}|${overlay.points.length}|${overlay.points[0]?.join(',')}|${overlay.points.at(-1)?.join(',')}`
    : '';
  useEffect(() => {
    onOverlay(overlay);
    // eslint-disable-next-line react-hooks/exhaustive-deps -- keyed on the overlay's content, not its identity
  }, [key]);
  useEffect(
    () => () => {
      onOverlay(null);
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps -- clear the overlay once, on unmount
    [],
  );

  const columnOptions = columns.map((c) => ({
    value: c.name,
    label: `${c.name}${prettyUnit(c.canonicalUnit) ? ` (${prettyUnit(c.canonicalUnit)})` : ''}`,
  }));

  return (
    <Stack gap="xs" data-testid="dataset-overlay">
      <Switch
        label="Overlay a dataset"
        checked={on}
        onChange={(e) => setOn(e.currentTarget.checked)}
        data-testid="overlay-toggle"
      />
      {on ? (
        <>
          {list.isLoading ? <Loader size="xs" /> : null}
          {list.error ? (
            <Alert color="red" title="Datasets could not be listed">
              {(list.error as Error).message}
            </Alert>
          ) : null}
          {list.isSuccess && datasets.length === 0 ? (
            <Text fz="sm" c="dimmed" data-testid="overlay-empty">
              No datasets you can read yet. Upload measurements on the{' '}
              <Anchor component={Link} to="/datasets">
                Datasets
              </Anchor>{' '}
              page (a researcher's), or ask a colleague to share one.
            </Text>
          ) : null}
          {datasets.length ? (
            <Group gap="sm" align="flex-end" wrap="wrap">
              <Select
                label="Dataset"
                placeholder="Pick a dataset"
                data={datasets.map((d) => ({ value: String(d.id), label: `${d.name} (${d.rows} rows)` }))}
                value={datasetId}
                onChange={pick}
                searchable
                clearable
                w={260}
                data-testid="overlay-dataset"
              />
              <Select
                label={`Dataset x (plot: ${prettyUnit(plot.x.unit) || 'dimensionless'})`}
                data={columnOptions}
                value={x}
                onChange={setX}
                disabled={!dataset}
                allowDeselect={false}
                w={200}
                data-testid="overlay-x"
              />
              <Select
                label={`Dataset y (plot: ${prettyUnit(plot.y.unit) || 'dimensionless'})`}
                data={columnOptions}
                value={y}
                onChange={setY}
                disabled={!dataset}
                allowDeselect={false}
                w={200}
                data-testid="overlay-y"
              />
              {series.isFetching ? <Loader size="xs" mb={8} /> : null}
            </Group>
          ) : null}
          {dataset && columns.length === 0 ? (
            <Text fz="sm" c="dimmed">
              “{dataset.name}” has no numeric columns to plot.
            </Text>
          ) : null}
          {series.error ? (
            <Alert color="red" title="The dataset could not be read">
              {(series.error as Error).message}
            </Alert>
          ) : null}
          {plan && !plan.ok ? (
            <Alert
              color="yellow"
              icon={<IconAlertTriangle size={16} />}
              title="Not overlaid: the units differ"
              data-testid="overlay-warning"
            >
              {plan.mismatches.map((m) => m.charAt(0).toUpperCase() + m.slice(1)).join('; ')}. Both sides are in
              canonical units, so these are different quantities: pick {wanted('x', plot.x.unit)} and{' '}
              {wanted('y', plot.y.unit)}.
            </Alert>
          ) : null}
          {plan?.ok ? (
            <Text fz="xs" c="dimmed" data-testid="overlay-summary">
              {overlaySummary(plan, dataset?.name ?? '')}
            </Text>
          ) : null}
        </>
      ) : null}
    </Stack>
  );
}
