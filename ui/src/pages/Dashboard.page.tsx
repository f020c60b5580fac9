import { Anchor, Badge, Card, Group, Progress, SimpleGrid, Skeleton, Stack, Text, Title } from '@mantine/core';
import { IconDatabase, IconMathFunction, IconPlus, IconStack2, IconTarget, type Icon } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { useMe, type Me, type Quota, type Role } from '../api/auth.js';
import { formatCount } from '../lib/format.js';

const ROLE_SUMMARY: Record<Role, string> = {
  admin: 'You manage users, roles, quotas, the job queue and the outgoing mailbox.',
  researcher: 'You define and run sweeps, upload datasets and fit reduced models; you see your own, shared and archived work.',
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
  { to: '/sweeps/new', label: 'New sweep', text: 'Scan a model over a grid or a random design.', icon: IconPlus, roles: ['researcher', 'admin'] },
  { to: '/catalogue', label: 'Catalogue', text: 'Find sweeps by model, status, owner or tag.', icon: IconStack2, roles: ['researcher', 'reviewer', 'admin'] },
  { to: '/single-point', label: 'Single point', text: 'Evaluate one parameter set and read its validity flags.', icon: IconTarget, roles: ['researcher', 'reviewer', 'admin'] },
  { to: '/datasets', label: 'Datasets', text: 'Upload measured profiles as CSV with units.', icon: IconDatabase, roles: ['researcher', 'admin'] },
  { to: '/fits', label: 'Fits', text: 'Fit scaling laws with standard errors.', icon: IconMathFunction, roles: ['researcher', 'reviewer', 'admin'] },
];

// Which usage figure is measured against which quota (SPEC §9).
const METERS: { quota: keyof Quota; usage: string; label: string }[] = [
  { quota: 'maxRunningSweeps', usage: 'runningSweeps', label: 'Sweeps running now' },
  { quota: 'maxPointsPer30Days', usage: 'pointsLast30Days', label: 'Points in the last 30 days' },
  { quota: 'maxStoredPoints', usage: 'storedPoints', label: 'Stored points' },
];

function UsageMeters({ me }: { me: Me }) {
  const rows = METERS.filter((m) => typeof me.quota?.[m.quota] === 'number');
  if (!me.quota || rows.length === 0) {
    return (
      <Text fz="sm" c="dimmed">
        No quota figures from the server yet. Once quotas are in force, your usage against each limit shows here.
      </Text>
    );
  }
  return (
    <Stack gap="sm">
      {rows.map((m) => {
        const limit = me.quota![m.quota]!;
        const used = me.usage?.[m.usage] ?? 0;
        const pct = limit > 0 ? Math.min(100, (used / limit) * 100) : 100;
        return (
          <div key={m.quota}>
            <Group justify="space-between" fz="sm" mb={4}>
              <Text fz="sm">{m.label}</Text>
              <Text fz="sm" className="dg-num">
                {formatCount(used)} of {formatCount(limit)}
              </Text>
            </Group>
            <Progress value={pct} color={pct >= 90 ? 'rust' : pct >= 70 ? 'ember' : 'tide'} aria-label={`${m.label}: ${formatCount(used)} of ${formatCount(limit)}`} />
          </div>
        );
      })}
      {typeof me.quota.maxPointsPerSweep === 'number' ? (
        <Text fz="xs" c="dimmed">
          Largest sweep you may submit: {formatCount(me.quota.maxPointsPerSweep)} points.
        </Text>
      ) : null}
    </Stack>
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
          <Card key={s.to} withBorder padding="md" radius="md" component={Link} to={s.to} aria-label={`${s.label}: ${s.text}`}>
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

      {me.role !== 'reviewer' ? (
        <Card withBorder padding="md" radius="md" maw={560}>
          <Title order={2} fz="h4" mb="sm">
            Your usage
          </Title>
          <UsageMeters me={me} />
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
