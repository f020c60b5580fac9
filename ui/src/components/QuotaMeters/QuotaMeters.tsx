import { Group, Progress, Stack, Text } from '@mantine/core';
import { QUOTA_LABELS } from '@driftgrid/domain';
import { formatCount, formatCountWords } from '../../lib/format.js';

export interface QuotaMetersProps {
  /** As GET /api/auth/me returns them; absent fields are skipped. */
  quota?: {
    maxPointsPerSweep?: number;
    maxRunningSweeps?: number;
    maxPointsPer30Days?: number;
    maxStoredPoints?: number;
  };
  usage?: { runningSweeps?: number; pointsLast30Days?: number; storedPoints?: number };
  /** Points of the sweep being built (builder preview): shown on top of the usage. */
  requested?: number;
}

interface Meter {
  key: string;
  label: string;
  used: number;
  limit: number;
  unit: string;
  extra?: number;
}

function Bar({ m }: { m: Meter }) {
  const extra = m.extra ?? 0;
  const pct = (v: number) => (m.limit > 0 ? Math.min(100, (v / m.limit) * 100) : v > 0 ? 100 : 0);
  const over = m.used + extra > m.limit;
  const color = over ? 'red' : pct(m.used + extra) >= 80 ? 'yellow' : 'tide';
  // Used and what this sweep would add are said apart: "1,200 used + 13,950 this sweep of 2 million points".
  const words = `${formatCountWords(m.used)} used${extra ? ` + ${formatCountWords(extra)} this sweep` : ''} of ${formatCountWords(m.limit)} ${m.unit}`;
  return (
    <div data-testid={`quota-${m.key}`}>
      <Group justify="space-between" gap="xs" mb={4}>
        <Text fz="sm" fw={500}>
          {m.label}
        </Text>
        <Text
          fz="sm"
          c={over ? 'red' : 'dimmed'}
          title={`${formatCount(m.used + extra)} of ${formatCount(m.limit)} ${m.unit}`}
        >
          {words}
        </Text>
      </Group>
      <Progress.Root size="md" aria-label={`${m.label}: ${words}`}>
        <Progress.Section value={pct(m.used)} color={color} />
        {extra ? (
          <Progress.Section value={Math.max(0, pct(m.used + extra) - pct(m.used))} color={color} striped />
        ) : null}
      </Progress.Root>
      {over ? (
        <Text fz="xs" c="red" mt={2}>
          {m.limit === 0 ? 'Your role cannot start sweeps.' : 'This would go over your limit; an admin can raise it.'}
        </Text>
      ) : null}
    </div>
  );
}

/** Usage against the quota limits (SPEC §9) as progress bars with the numbers in words. */
export function QuotaMeters({ quota, usage, requested }: QuotaMetersProps) {
  if (!quota)
    return (
      <Text fz="sm" c="dimmed">
        Quota information is not available.
      </Text>
    );
  const u = usage ?? {};
  const meters: Meter[] = [];
  if (quota.maxRunningSweeps !== undefined) {
    meters.push({
      key: 'maxRunningSweeps',
      label: QUOTA_LABELS.maxRunningSweeps.label,
      used: u.runningSweeps ?? 0,
      limit: quota.maxRunningSweeps,
      unit: 'sweeps',
      extra: requested !== undefined ? 1 : undefined,
    });
  }
  if (quota.maxPointsPer30Days !== undefined) {
    meters.push({
      key: 'maxPointsPer30Days',
      label: QUOTA_LABELS.maxPointsPer30Days.label,
      used: u.pointsLast30Days ?? 0,
      limit: quota.maxPointsPer30Days,
      unit: 'points',
      extra: requested,
    });
  }
  if (quota.maxStoredPoints !== undefined) {
    meters.push({
      key: 'maxStoredPoints',
      label: QUOTA_LABELS.maxStoredPoints.label,
      used: u.storedPoints ?? 0,
      limit: quota.maxStoredPoints,
      unit: 'points',
      extra: requested,
    });
  }
  return (
    <Stack gap="sm" data-testid="quota-meters">
      {meters.map((m) => (
        <Bar key={m.key} m={m} />
      ))}
      {quota.maxPointsPerSweep !== undefined ? (
        <Text
          fz="sm"
          c={requested !== undefined && requested > quota.maxPointsPerSweep ? 'red' : 'dimmed'}
          data-testid="quota-maxPointsPerSweep"
        >
          {QUOTA_LABELS.maxPointsPerSweep.label}: at most {formatCountWords(quota.maxPointsPerSweep)}
          {requested !== undefined ? `; this sweep has ${formatCountWords(requested)}` : ''}.
        </Text>
      ) : null}
    </Stack>
  );
}
