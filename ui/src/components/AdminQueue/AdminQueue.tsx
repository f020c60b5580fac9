import { Alert, Anchor, Button, Group, Paper, Progress, SimpleGrid, Stack, Table, Text, Title } from '@mantine/core';
import {
  IconAlertTriangle,
  IconCircleCheck,
  IconCpu,
  IconHourglass,
  IconPlayerPause,
  IconPlayerPlay,
  IconRefresh,
  type Icon,
} from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import type { QueueChunkCounts } from '@driftgrid/domain';
import { useQueueControl, useQueueStatus } from '../../api/admin.js';
import { ApiError } from '../../api/client.js';
import { formatCount, formatPercent } from '../../lib/format.js';
import { formatDateTime } from '../../lib/formatDate.js';
import { StatusBadge } from '../StatusBadge/StatusBadge.js';

const CHUNK_CELLS: { key: keyof QueueChunkCounts; label: string; icon: Icon; meaning: string }[] = [
  { key: 'waiting', label: 'Chunks waiting', icon: IconHourglass, meaning: 'Handed to the queue, not yet picked up' },
  { key: 'computing', label: 'Chunks computing', icon: IconCpu, meaning: 'A worker is computing them now' },
  { key: 'retrying', label: 'Chunks retrying', icon: IconRefresh, meaning: 'Failed an attempt; tried again shortly' },
  { key: 'failed', label: 'Chunks failed', icon: IconAlertTriangle, meaning: 'Failed every attempt' },
];

function Cell({
  label,
  value,
  icon: Glyph,
  meaning,
  testId,
}: {
  label: string;
  value: number;
  icon: Icon;
  meaning: string;
  testId: string;
}) {
  return (
    <Paper withBorder p="sm" title={meaning}>
      <Group gap={6} wrap="nowrap">
        <Glyph size={16} aria-hidden />
        <Text fz="xs" c="dimmed">
          {label}
        </Text>
      </Group>
      <Text fz="xl" fw={600} className="dg-num" data-testid={testId} data-value={value}>
        {formatCount(value)}
      </Text>
    </Paper>
  );
}

/**
 * The queue in Driftgrid's words (GET /api/admin/queue): chunks waiting, computing, retrying and
 * failed, sweeps queued and running, chunks completed as SQLite counts them, and the control to
 * pause or resume handing out chunks. Test hooks: `queue-state` (data-paused), `queue-pause`,
 * `queue-resume`, `queue-chunks-<key>`, `queue-sweeps-running`, `queue-sweeps-queued`,
 * `queue-chunks-completed`, `queue-sweep-<id>`.
 */
export function AdminQueue() {
  const q = useQueueStatus({ retry: false });
  const control = useQueueControl();
  if (q.isPending)
    return (
      <Text c="dimmed" fz="sm">
        Loading the queue…
      </Text>
    );
  if (q.error)
    return (
      <Alert color="red" variant="light" title="Could not read the queue">
        {q.error.message}
      </Alert>
    );
  const s = q.data;
  return (
    <Stack gap="md" data-testid="admin-queue">
      <Paper withBorder p="md">
        <Group justify="space-between" wrap="wrap" gap="sm">
          <div data-testid="queue-state" data-paused={String(s.paused)}>
            <Group gap={6}>
              {s.paused ? <IconPlayerPause size={18} aria-hidden /> : <IconCircleCheck size={18} aria-hidden />}
              <Text fw={600}>{s.paused ? 'Paused' : 'Handing out chunks'}</Text>
            </Group>
            <Text fz="sm" c="dimmed">
              {s.paused
                ? 'No new chunk is handed to a worker; chunks being computed finish. Sweeps wait where they are.'
                : 'Workers pick up chunks as they come.'}{' '}
              {s.mode === 'embedded'
                ? 'Chunks are computed inside this server.'
                : 'Chunks are computed by workers sharing a Redis server.'}
            </Text>
          </div>
          {s.paused ? (
            <Button
              leftSection={<IconPlayerPlay size={16} />}
              onClick={() => control.mutate('resume')}
              loading={control.isPending}
              data-testid="queue-resume"
            >
              Resume
            </Button>
          ) : (
            <Button
              variant="light"
              color="ember"
              leftSection={<IconPlayerPause size={16} />}
              onClick={() => control.mutate('pause')}
              loading={control.isPending}
              data-testid="queue-pause"
            >
              Pause
            </Button>
          )}
        </Group>
        {control.error ? (
          <Text fz="sm" c="red" mt="xs">
            {control.error instanceof ApiError ? control.error.message : 'The queue did not answer.'}
          </Text>
        ) : null}
      </Paper>

      <SimpleGrid cols={{ base: 2, sm: 3, lg: 6 }}>
        {CHUNK_CELLS.map((c) => (
          <Cell
            key={c.key}
            label={c.label}
            value={s.chunks[c.key]}
            icon={c.icon}
            meaning={c.meaning}
            testId={`queue-chunks-${c.key}`}
          />
        ))}
        <Cell
          label="Sweeps running"
          value={s.sweepsRunning}
          icon={IconPlayerPlay}
          meaning="Sweeps with at least one chunk computed or computing"
          testId="queue-sweeps-running"
        />
        <Cell
          label="Sweeps queued"
          value={s.sweepsQueued}
          icon={IconHourglass}
          meaning="Sweeps waiting for their first chunk"
          testId="queue-sweeps-queued"
        />
      </SimpleGrid>
      <Text fz="sm" c="dimmed">
        <Text span className="dg-num" data-testid="queue-chunks-completed" data-value={s.chunks.completed}>
          {formatCount(s.chunks.completed)}
        </Text>{' '}
        chunks completed on this server so far, counted from the stored results.
      </Text>

      <div>
        <Title order={3} fz="h5" mb="xs">
          Sweeps with work outstanding
        </Title>
        {s.sweeps.length === 0 ? (
          <Text fz="sm" c="dimmed">
            None: every sweep has finished.
          </Text>
        ) : (
          <Table.ScrollContainer minWidth={640}>
            <Table verticalSpacing="xs" fz="sm">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Sweep</Table.Th>
                  <Table.Th>Owner</Table.Th>
                  <Table.Th>Status</Table.Th>
                  <Table.Th>Points</Table.Th>
                  <Table.Th>Submitted</Table.Th>
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {s.sweeps.map((w) => {
                  const fraction = w.progress.total > 0 ? w.progress.done / w.progress.total : 0;
                  return (
                    <Table.Tr key={w.id} data-testid={`queue-sweep-${w.id}`}>
                      <Table.Td>
                        <Anchor component={Link} to={`/sweeps/${w.id}`} fz="sm">
                          {w.name}
                        </Anchor>
                      </Table.Td>
                      <Table.Td>{w.owner}</Table.Td>
                      <Table.Td>
                        <StatusBadge
                          status={w.status}
                          suffix={w.status === 'running' ? formatPercent(fraction) : undefined}
                        />
                      </Table.Td>
                      <Table.Td miw={160}>
                        <Text fz="xs" className="dg-num">
                          {formatCount(w.progress.done)} of {formatCount(w.progress.total)}
                        </Text>
                        <Progress
                          value={fraction * 100}
                          size="sm"
                          aria-label={`${formatPercent(fraction)} of the points computed`}
                        />
                      </Table.Td>
                      <Table.Td className="dg-num">{formatDateTime(w.createdAt)}</Table.Td>
                    </Table.Tr>
                  );
                })}
              </Table.Tbody>
            </Table>
          </Table.ScrollContainer>
        )}
      </div>
    </Stack>
  );
}
