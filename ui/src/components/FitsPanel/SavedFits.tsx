import { Anchor, Button, Checkbox, Group, Pagination, Paper, Table, Text } from '@mantine/core';
import { IconArrowsDiff } from '@tabler/icons-react';
import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useFitList } from '../../api/fits.js';
import { Num } from '../Num/Num.js';
import { FitStatus } from '../FitResult/FitStatus.js';
import { MODEL_LABEL, xList, type FitSourceKind, type FitView } from '../FitResult/fit-types.js';
import { formatDateTime } from '../../lib/formatDate.js';

const PAGE_SIZE = 20;

/** One line per parameter value ± error, compact, for list rows. */
export function ParameterSummary({ fit }: { fit: FitView }) {
  if (!fit.parameters)
    return (
      <Text fz="xs" c="dimmed">
        {fit.error ?? '—'}
      </Text>
    );
  return (
    <Group gap={10} wrap="wrap">
      {fit.parameters.map((p) => (
        <Text key={p.name} fz="xs" span>
          <Text span ff="monospace" fz="xs">
            {p.name}
          </Text>{' '}
          = <Num value={p.value} sig={5} /> ± <Num value={p.stdError} sig={2} />
        </Text>
      ))}
    </Group>
  );
}

/**
 * Saved fits of one source (or of every source the user can read when `source` is absent), newest
 * first. Test hook: rows `saved-fit-<id>`.
 */
export function SavedFits({
  source,
  selectedId,
  onSelect,
  showSource = false,
}: {
  source?: { kind: FitSourceKind; id: number };
  selectedId?: number | null;
  onSelect?: (id: number) => void;
  showSource?: boolean;
}) {
  const [page, setPage] = useState(1);
  const params = { ...(source ? { sourceKind: source.kind, sourceId: source.id } : {}), page, pageSize: PAGE_SIZE };
  const q = useFitList(params, { poll: true });
  const navigate = useNavigate();
  // Fits ticked for the side-by-side comparison (kept across pages of the list).
  const [picked, setPicked] = useState<number[]>([]);
  const toggle = (id: number) => setPicked((p) => (p.includes(id) ? p.filter((x) => x !== id) : [...p, id]));
  if (q.error)
    return (
      <Text c="red" fz="sm">
        Saved fits could not be loaded: {(q.error as Error).message}
      </Text>
    );
  if (!q.data)
    return (
      <Text fz="sm" c="dimmed">
        Loading saved fits…
      </Text>
    );
  const items = q.data.items;
  if (items.length === 0) {
    return (
      <Text fz="sm" c="dimmed" data-testid="saved-fits-empty">
        No saved fits {source ? `of this ${source.kind}` : 'yet'}. Every fit you run is saved here with its request,
        result and versions.
      </Text>
    );
  }
  return (
    <Paper withBorder radius="sm" data-testid="saved-fits">
      <Table highlightOnHover fz="sm" verticalSpacing={6}>
        <Table.Thead>
          <Table.Tr>
            <Table.Th>
              <Text fz="xs" span>
                Compare
              </Text>
            </Table.Th>
            <Table.Th>Fit</Table.Th>
            {showSource ? <Table.Th>Source</Table.Th> : null}
            <Table.Th>Model</Table.Th>
            <Table.Th>Parameters (value ± standard error)</Table.Th>
            <Table.Th ta="right">R²</Table.Th>
            <Table.Th>Status</Table.Th>
            <Table.Th>By, when</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {items.map((f) => (
            <Table.Tr
              key={f.id}
              data-testid={`saved-fit-${f.id}`}
              bg={f.id === selectedId ? 'var(--mantine-color-default-hover)' : undefined}
              style={{ cursor: onSelect ? 'pointer' : undefined }}
              onClick={() => onSelect?.(f.id)}
            >
              <Table.Td onClick={(e) => e.stopPropagation()}>
                <Checkbox
                  aria-label={`Compare fit ${f.id}`}
                  data-testid={`compare-pick-${f.id}`}
                  checked={picked.includes(f.id)}
                  onChange={() => toggle(f.id)}
                />
              </Table.Td>
              <Table.Td>
                <Anchor component={Link} to={`/fits/${f.id}`} onClick={(e) => e.stopPropagation()}>
                  #{f.id}
                </Anchor>
              </Table.Td>
              {showSource ? (
                <Table.Td>
                  <Anchor
                    component={Link}
                    to={f.source.kind === 'sweep' ? `/sweeps/${f.source.id}` : `/datasets/${f.source.id}`}
                    onClick={(e) => e.stopPropagation()}
                  >
                    {f.source.kind === 'sweep' ? 'Sweep' : 'Dataset'} {f.source.id}
                    {f.source.name ? ` · ${f.source.name}` : ''}
                  </Anchor>
                </Table.Td>
              ) : null}
              <Table.Td>
                {MODEL_LABEL[f.model] ?? f.model}
                <Text fz="xs" c="dimmed">
                  {f.y} against {xList(f.x).join(', ')}
                </Text>
              </Table.Td>
              <Table.Td>
                <ParameterSummary fit={f} />
              </Table.Td>
              <Table.Td ta="right">
                <Num value={f.r2} sig={6} />
              </Table.Td>
              <Table.Td style={{ whiteSpace: 'nowrap' }}>
                <FitStatus fit={f} />
              </Table.Td>
              <Table.Td>
                <Text fz="xs">{f.owner.name}</Text>
                <Text fz="xs" c="dimmed">
                  {formatDateTime(f.createdAt)}
                </Text>
              </Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
      <Group justify="space-between" p="xs">
        <Text fz="xs" c="dimmed">
          Tick two or more fits of the same data to compare their parameters, AIC/BIC and residuals.
        </Text>
        <Button
          size="compact-sm"
          variant="light"
          leftSection={<IconArrowsDiff size={14} />}
          disabled={picked.length < 2}
          data-testid="compare-fits"
          onClick={() => void navigate(`/fits/compare?ids=${picked.join(',')}`)}
        >
          Compare {picked.length >= 2 ? `${picked.length} fits` : ''}
        </Button>
      </Group>
      {q.data.total > PAGE_SIZE ? (
        <Group justify="flex-end" p="xs">
          <Pagination size="sm" total={Math.ceil(q.data.total / PAGE_SIZE)} value={page} onChange={setPage} />
        </Group>
      ) : null}
    </Paper>
  );
}
