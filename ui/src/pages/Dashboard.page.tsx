import { Anchor, Badge, Card, Group, SimpleGrid, Skeleton, Stack, Text, Title } from '@mantine/core';
import { IconDatabase, IconMathFunction, IconPlus, IconStack2, IconTarget, type Icon } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { CREATOR_ROLES, ROLE_NAMES } from '@driftgrid/domain';
import { useMe, type Role } from '../api/auth.js';
import { useAdminUsers, useQueueStatus } from '../api/admin.js';
import { QuotaMeters } from '../components/QuotaMeters/QuotaMeters.js';
import { useSweepList, type SweepSummary } from '../api/sweeps.js';
import { StatusBadge } from '../components/StatusBadge/StatusBadge.js';
import { formatCount, formatPercent } from '../lib/format.js';

const ROLE_SUMMARY: Record<Role, string> = {
  admin: 'You manage users, roles, quotas, the job queue and the outgoing mailbox.',
  researcher:
    'You define and run sweeps, upload datasets and fit reduced models; you see your own, shared and archived work.',
  reviewer: 'You read and download archived sweeps and the ones shared with you.',
};

interface Shortcut {
  to: string;
  label: string;
  text: string;
  icon: Icon;
  roles: readonly Role[];
}

const SHORTCUTS: Shortcut[] = [
  {
    to: '/sweeps/new',
    label: 'New sweep',
    text: 'Scan a model over a grid or a random design.',
    icon: IconPlus,
    roles: CREATOR_ROLES,
  },
  {
    to: '/catalogue',
    label: 'Catalogue',
    text: 'Find sweeps by model, status, owner or tag.',
    icon: IconStack2,
    roles: ROLE_NAMES,
  },
  {
    to: '/single-point',
    label: 'Single point',
    text: 'Evaluate one parameter set and read its validity flags.',
    icon: IconTarget,
    roles: ROLE_NAMES,
  },
  {
    to: '/datasets',
    label: 'Datasets',
    text: 'Upload measured profiles as CSV with units.',
    icon: IconDatabase,
    roles: CREATOR_ROLES,
  },
  {
    to: '/fits',
    label: 'Fits',
    text: 'Fit scaling laws with standard errors.',
    icon: IconMathFunction,
    roles: ROLE_NAMES,
  },
];

/** A short list of sweeps from the catalogue, each linking to its page. */
function SweepCard({
  title,
  query,
  empty,
  testId,
}: {
  title: string;
  query: Record<string, string | number>;
  empty: string;
  testId: string;
}) {
  const { data, isLoading } = useSweepList({ pageSize: 5, ...query });
  const params = new URLSearchParams(
    Object.entries(query)
      .filter(([k]) => k !== 'pageSize')
      .map(([k, v]) => [k, String(v)]),
  );
  return (
    <Card withBorder padding="md" radius="md" data-testid={testId}>
      <Group justify="space-between" mb="xs">
        <Title order={2} fz="h4">
          {title}
        </Title>
        {data && data.total > 0 ? (
          <Anchor component={Link} to={`/catalogue?${params}`} fz="sm">
            All {formatCount(data.total)}
          </Anchor>
        ) : null}
      </Group>
      {isLoading ? <Skeleton h={60} /> : null}
      {data && data.items.length === 0 ? (
        <Text fz="sm" c="dimmed">
          {empty}
        </Text>
      ) : null}
      <Stack gap={6}>
        {data?.items.map((s: SweepSummary) => (
          <Group key={s.id} justify="space-between" wrap="nowrap" gap="xs">
            <Anchor component={Link} to={`/sweeps/${s.id}`} fz="sm" truncate>
              {s.name}
            </Anchor>
            <StatusBadge
              status={s.status}
              suffix={s.status === 'running' || s.status === 'queued' ? formatPercent(s.progress.fraction) : undefined}
            />
          </Group>
        ))}
      </Stack>
    </Card>
  );
}

function AdminGlance() {
  const queue = useQueueStatus();
  const users = useAdminUsers({ pageSize: 1 });
  const q = queue.data;
  const cells: [string, number | undefined][] = [
    ['Chunks waiting', q?.chunks.waiting],
    ['Chunks computing', q?.chunks.computing],
    ['Chunks failed', q?.chunks.failed],
    ['Sweeps running', q?.sweepsRunning],
    ['Users', users.data?.total],
  ];
  return (
    <Card withBorder padding="md" radius="md" data-testid="admin-glance">
      <Group justify="space-between" mb="xs">
        <Title order={2} fz="h4">
          Queue and users
        </Title>
        <Anchor component={Link} to="/admin" fz="sm">
          Admin
        </Anchor>
      </Group>
      {queue.error ? (
        <Text fz="sm" c="red">
          {(queue.error as Error).message}
        </Text>
      ) : null}
      <SimpleGrid cols={{ base: 2, sm: 5 }}>
        {cells.map(([label, n]) => (
          <div key={label}>
            <Text fz="xs" c="dimmed">
              {label}
            </Text>
            <Text fz="lg" fw={500} className="dg-num">
              {n === undefined ? '—' : formatCount(n)}
            </Text>
          </div>
        ))}
      </SimpleGrid>
      {queue.data ? (
        <Text fz="xs" c="dimmed" mt="xs">
          {queue.data.paused ? 'Queue paused: no new chunks handed out' : 'Queue handing out chunks'} ·{' '}
          {queue.data.mode === 'embedded' ? 'computed inside this server' : 'computed by separate workers'}
        </Text>
      ) : null}
    </Card>
  );
}

export default function DashboardPage() {
  const { data: me, isLoading } = useMe();
  if (isLoading || !me) return <Skeleton h={120} />;
  const shortcuts = SHORTCUTS.filter((s) => s.roles.includes(me.role));
  return (
    <Stack gap="lg" maw={1100}>
      <div>
        <Title order={1} fz="h2">
          Dashboard
        </Title>
        <Group gap="xs" mt={6}>
          <Text data-testid="whoami" fw={500}>
            {me.name} · {me.role}
          </Text>
          <Badge variant="light" color="slate" tt="none">
            {me.email}
          </Badge>
        </Group>
        <Text c="dimmed" fz="sm" mt={4}>
          {ROLE_SUMMARY[me.role] ?? ''}
        </Text>
      </div>

      <SimpleGrid cols={{ base: 1, sm: 2, lg: 3 }} spacing="md">
        {shortcuts.map((s) => (
          <Card
            key={s.to}
            withBorder
            padding="md"
            radius="md"
            component={Link}
            to={s.to}
            aria-label={`${s.label}: ${s.text}`}
          >
            <Group gap="sm" wrap="nowrap" align="flex-start">
              <s.icon size={22} stroke={1.6} color="var(--mantine-color-anchor)" aria-hidden />
              <div>
                <Text fw={500}>{s.label}</Text>
                <Text fz="sm" c="dimmed">
                  {s.text}
                </Text>
              </div>
            </Group>
          </Card>
        ))}
      </SimpleGrid>

      {me.role === 'admin' ? <AdminGlance /> : null}

      {me.role === 'reviewer' ? (
        <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md">
          <SweepCard
            title="Recently archived"
            testId="recent-archived"
            query={{ scope: 'archived', sort: 'finishedAt:desc' }}
            empty="No sweep has been archived yet. Archived sweeps appear here for download."
          />
          <SweepCard
            title="Shared with me"
            testId="shared-with-me"
            query={{ scope: 'shared', sort: 'createdAt:desc' }}
            empty="Nobody has shared a sweep with you yet."
          />
        </SimpleGrid>
      ) : (
        <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md">
          <SweepCard
            title="Running now"
            testId="running-work"
            query={{ scope: 'mine', status: 'queued,running', sort: 'createdAt:desc' }}
            empty="Nothing of yours is queued or running. Start one from New sweep."
          />
          <SweepCard
            title="Recent sweeps"
            testId="recent-sweeps"
            query={{ scope: 'mine', sort: 'createdAt:desc' }}
            empty="You have not run a sweep yet. New sweep walks you through the first one."
          />
        </SimpleGrid>
      )}

      {me.role !== 'reviewer' ? (
        <Card withBorder padding="md" radius="md" maw={560}>
          <Title order={2} fz="h4" mb="sm">
            Your usage
          </Title>
          <QuotaMeters quota={me.quota} usage={me.usage} />
        </Card>
      ) : null}

      <Text fz="sm" c="dimmed">
        Scripts can use the same api as this page: create a personal token under{' '}
        <Anchor component={Link} to="/account/tokens" fz="sm">
          API tokens
        </Anchor>{' '}
        and read the reference at{' '}
        <Anchor href="/api/docs" fz="sm">
          /api/docs
        </Anchor>
        .
      </Text>
    </Stack>
  );
}
