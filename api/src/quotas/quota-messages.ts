import type { Quota, QuotaKey, QuotaUsage, QuotaViolation } from '@driftgrid/domain';

const fmt = (n: number) => n.toLocaleString('en-US');

/**
 * Each limit against the usage plus the requested sweep. Per sweep the "usage" is the sweep's own
 * size; for running sweeps the request counts as one more sweep.
 */
export function findViolations(quota: Quota, usage: QuotaUsage, points: number): QuotaViolation[] {
  const out: QuotaViolation[] = [];
  const add = (limit: QuotaKey, used: number, requested: number, message: string) =>
    out.push({ limit, value: quota[limit], usage: used, requested, message });

  if (points > quota.maxPointsPerSweep) {
    add(
      'maxPointsPerSweep',
      points,
      points,
      `maxPointsPerSweep is ${fmt(quota.maxPointsPerSweep)} points; this sweep has ${fmt(points)}`,
    );
  }
  if (usage.runningSweeps + 1 > quota.maxRunningSweeps) {
    add(
      'maxRunningSweeps',
      usage.runningSweeps,
      1,
      `maxRunningSweeps is ${fmt(quota.maxRunningSweeps)}; you already have ${fmt(usage.runningSweeps)} queued or running`,
    );
  }
  if (usage.pointsLast30Days + points > quota.maxPointsPer30Days) {
    add(
      'maxPointsPer30Days',
      usage.pointsLast30Days,
      points,
      `maxPointsPer30Days is ${fmt(quota.maxPointsPer30Days)} points; you have used ${fmt(usage.pointsLast30Days)} in the last 30 days and this sweep has ${fmt(points)}`,
    );
  }
  if (usage.storedPoints + points > quota.maxStoredPoints) {
    add(
      'maxStoredPoints',
      usage.storedPoints,
      points,
      `maxStoredPoints is ${fmt(quota.maxStoredPoints)} points; you store ${fmt(usage.storedPoints)} and this sweep has ${fmt(points)}`,
    );
  }
  return out;
}
