import { QUOTA_LABELS, type Quota, type QuotaKey, type QuotaUsage, type QuotaViolation } from '@driftgrid/domain';

const fmt = (n: number) => n.toLocaleString('en-US');

/**
 * Each limit against the usage plus the requested sweep, in the admin's words (QUOTA_LABELS): what
 * is already used and what this sweep would add are said separately. The per-sweep limit has no
 * usage; for running sweeps the request counts as one more sweep.
 */
export function findViolations(quota: Quota, usage: QuotaUsage, points: number): QuotaViolation[] {
  const out: QuotaViolation[] = [];
  const add = (limit: QuotaKey, used: number, requested: number, message: string) =>
    out.push({ limit, label: QUOTA_LABELS[limit].label, value: quota[limit], usage: used, requested, message });

  if (points > quota.maxPointsPerSweep) {
    add('maxPointsPerSweep', 0, points, `limit ${fmt(quota.maxPointsPerSweep)} points; this sweep has ${fmt(points)}`);
  }
  if (usage.runningSweeps + 1 > quota.maxRunningSweeps) {
    add(
      'maxRunningSweeps',
      usage.runningSweeps,
      1,
      `limit ${fmt(quota.maxRunningSweeps)}; ${fmt(usage.runningSweeps)} already queued or running; this sweep would add 1`,
    );
  }
  if (usage.pointsLast30Days + points > quota.maxPointsPer30Days) {
    add(
      'maxPointsPer30Days',
      usage.pointsLast30Days,
      points,
      `limit ${fmt(quota.maxPointsPer30Days)} points; ${fmt(usage.pointsLast30Days)} used in the last 30 days; this sweep would add ${fmt(points)}`,
    );
  }
  if (usage.storedPoints + points > quota.maxStoredPoints) {
    add(
      'maxStoredPoints',
      usage.storedPoints,
      points,
      `limit ${fmt(quota.maxStoredPoints)} points; ${fmt(usage.storedPoints)} stored; this sweep would add ${fmt(points)}`,
    );
  }
  return out;
}

/** "Points per sweep: limit 1,000 points; this sweep has 13,950" — one refusal as a sentence. */
export function violationSentence(v: QuotaViolation): string {
  return `${v.label}: ${v.message}`;
}
