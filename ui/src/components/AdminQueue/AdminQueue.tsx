import { Alert, Group, Paper, SimpleGrid, Text } from '@mantine/core';
import { useQueueStatus } from '../../api/admin.js';
import { ApiError } from '../../api/client.js';
import { formatCount } from '../../lib/format.js';

/**
 * Slot for the queue panel of the admin console. The sweeps engineer fills it (pause/resume,
 * cancel any sweep); until then it shows counts from GET /api/admin/queue when the route exists.
 */
export function AdminQueue() {
  const q = useQueueStatus({ retry: false });
  if (q.isPending)
    return (
      <Text c="dimmed" fz="sm">
        Loading the queue…
      </Text>
    );
  if (q.error) {
    const missing = q.error instanceof ApiError && q.error.status === 404;
    return (
      <Alert
        color="gray"
        variant="light"
        title={missing ? 'Queue controls are not available yet' : 'Could not read the queue'}
      >
        {missing
          ? 'This server does not offer queue administration yet. Sweeps still run; their states show in the catalogue.'
          : q.error.message}
      </Alert>
    );
  }
  const counts = (q.data.counts && typeof q.data.counts === 'object' ? q.data.counts : q.data) as Record<
    string,
    unknown
  >;
  const entries = Object.entries(counts).filter(([, v]) => typeof v === 'number') as [string, number][];
  return (
    <SimpleGrid cols={{ base: 2, sm: 4 }}>
      {entries.map(([k, v]) => (
        <Paper key={k} withBorder p="sm">
          <Text fz="xs" c="dimmed" tt="capitalize">
            {k}
          </Text>
          <Group gap={4}>
            <Text fz="xl" fw={600}>
              {formatCount(v)}
            </Text>
            <Text fz="xs" c="dimmed">
              jobs
            </Text>
          </Group>
        </Paper>
      ))}
    </SimpleGrid>
  );
}
