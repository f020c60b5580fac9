import { Alert, Group, Progress, Stack, Text } from '@mantine/core';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../api/client.js';
import { queryKeys } from '../../api/queryKeys.js';
import { formatCount } from '../../lib/format.js';
import { StatusBadge } from '../StatusBadge/StatusBadge.js';

/** The part of the SPEC §6 sweep shape this component reads. */
export interface SweepProgressInfo {
  id: number;
  name: string;
  status: string;
  points: number;
  progress: { done: number; total: number };
  error?: string | null;
  provenance?: { computeMs?: number | null } | null;
}

const LIVE = new Set(['queued', 'running']);

/**
 * Compact live progress of one sweep: status in words and icon, a bar, points persisted / total.
 * Polls GET /api/sweeps/:id every second while the sweep is queued or running, then stops.
 * Test hooks: `sweep-progress-compact` (data-status, data-done, data-total), `sweep-progress-count`.
 */
export function SweepProgress({ sweepId }: { sweepId: number | string }) {
  const q = useQuery({
    queryKey: queryKeys.sweeps.detail(sweepId),
    queryFn: ({ signal }) => api.get<SweepProgressInfo>(`/sweeps/${sweepId}`, undefined, signal),
    refetchInterval: (query) => (query.state.data && !LIVE.has(query.state.data.status) ? false : 1000),
    staleTime: 0,
  });
  if (q.error) {
    return (
      <Alert color="red" variant="light" title="Progress unavailable">
        {(q.error as Error).message}
      </Alert>
    );
  }
  const s = q.data;
  const done = s?.progress.done ?? 0;
  const total = s?.progress.total ?? 0;
  const pct = total > 0 ? (100 * done) / total : 0;
  const live = s ? LIVE.has(s.status) : true;
  return (
    <Stack
      gap={4}
      data-testid="sweep-progress-compact"
      data-status={s?.status ?? 'loading'}
      data-done={done}
      data-total={total}
      aria-live="polite"
    >
      <Group justify="space-between" gap="xs">
        <StatusBadge
          status={s?.status ?? 'queued'}
          suffix={s?.status === 'running' ? `${Math.floor(pct)} %` : undefined}
        />
        <Text fz="sm" data-testid="sweep-progress-count" style={{ fontVariantNumeric: 'tabular-nums' }}>
          {formatCount(done)} / {formatCount(total)} points
        </Text>
      </Group>
      <Progress
        value={pct}
        animated={live && s?.status === 'running'}
        striped={live}
        aria-label={`${Math.floor(pct)} percent of points persisted`}
      />
      {s?.status === 'failed' && s.error ? (
        <Text fz="xs" c="red">
          {s.error}
        </Text>
      ) : null}
    </Stack>
  );
}
