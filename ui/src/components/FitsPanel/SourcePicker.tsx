import { Group, SegmentedControl, Select, Text } from '@mantine/core';
import { useDatasetList, type DatasetView } from '../../api/datasets.js';
import { useSweep, useSweepList } from '../../api/sweeps.js';
import type { FitSourceKind } from '../FitResult/fit-types.js';
import type { FitColumn } from './FitBuilder.js';

export interface PickedSource {
  source: { kind: FitSourceKind; id: number };
  columns: FitColumn[];
}

/** The columns of a sweep (from GET /api/sweeps/:id) or a dataset (from the dataset list). */
export function useSourceColumns(
  kind: FitSourceKind,
  id: number | null,
  datasets?: DatasetView[],
): FitColumn[] | undefined {
  const sweep = useSweep(id ?? 0, kind === 'sweep' && id !== null);
  if (id === null) return undefined;
  if (kind === 'sweep') return sweep.data?.columns;
  const d = datasets?.find((x) => x.id === id);
  return d?.columns.map((c) => ({
    name: c.name,
    unit: c.canonicalUnit,
    kind: c.kind === 'number' ? 'measured' : 'text',
  }));
}

/** Chooses what to fit on the Fits page: a finished sweep or an uploaded dataset. */
export function SourcePicker({
  kind,
  id,
  onKind,
  onId,
}: {
  kind: FitSourceKind;
  id: number | null;
  onKind: (k: FitSourceKind) => void;
  onId: (id: number | null) => void;
}) {
  const sweepParams = { status: 'completed,archived', pageSize: 200, sort: 'createdAt:desc' };
  const sweeps = useSweepList(sweepParams, kind === 'sweep');
  const datasets = useDatasetList({ pageSize: 200 }, kind === 'dataset');
  const data =
    kind === 'sweep'
      ? (sweeps.data?.items ?? []).map((s) => ({
          value: String(s.id),
          label: `#${s.id} ${s.name} (${s.points} points, ${s.status})`,
        }))
      : (datasets.data?.items ?? []).map((d) => ({
          value: String(d.id),
          label: `#${d.id} ${d.name} (${d.rows} rows)`,
        }));
  return (
    <Group align="flex-end" gap="sm" wrap="wrap">
      <SegmentedControl
        value={kind}
        onChange={(v) => {
          onKind(v as FitSourceKind);
          onId(null);
        }}
        data={[
          { value: 'sweep', label: 'Sweep results' },
          { value: 'dataset', label: 'Dataset' },
        ]}
        aria-label="Source kind"
      />
      <Select
        label={kind === 'sweep' ? 'Sweep (completed or archived)' : 'Dataset'}
        data-testid="fit-source"
        searchable
        w={420}
        placeholder={data.length ? 'Choose one' : kind === 'sweep' ? 'No finished sweeps yet' : 'No datasets yet'}
        data={data}
        value={id === null ? null : String(id)}
        onChange={(v) => onId(v ? Number(v) : null)}
      />
      {(kind === 'sweep' ? sweeps.error : datasets.error) ? (
        <Text c="red" fz="sm">
          {((kind === 'sweep' ? sweeps.error : datasets.error) as Error).message}
        </Text>
      ) : null}
    </Group>
  );
}
