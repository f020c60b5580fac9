import { ACTIVE_STATES } from '@driftgrid/domain';
import { Alert, Group, Progress, Stack, Text } from '@mantine/core';
import { useSweepProgress } from '../../api/sweeps.js';
import { formatCount, formatPercent } from '../../lib/format.js';
import { StatusBadge } from '../StatusBadge/StatusBadge.js';

const LIVE = new Set<string>(ACTIVE_STATES);

/**
 * Compact live progress of one sweep: status in words and icon, a bar, points persisted / total.
 * Polls GET /api/sweeps/:id every second while the sweep is queued or running, then stops.
 * Test hooks: `sweep-progress-compact` (data-status, data-done, data-total), `sweep-progress-count`.
 */
export function SweepProgress({ sweepId }: { sweepId: number | string }) {
  const q = useSweepProgress(sweepId);
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
          suffix={s?.status === 'running' ? formatPercent(pct / 100) : undefined}
        />
        <Text fz="sm" data-testid="sweep-progress-count" style={{ fontVariantNumeric: 'tabular-nums' }}>
          {formatCount(done)} / {formatCount(total)} points
        </Text>
      </Group>
      <Progress
        value={pct}
        animated={live && s?.status === 'running'}
        striped={live}
        aria-label={`${formatPercent(pct / 100)} of points persisted`}
      />
      {s?.status === 'failed' && s.error ? (
        <Text fz="xs" c="red">
          {s.error}
        </Text>
      ) : null}
    </Stack>
  );
}
