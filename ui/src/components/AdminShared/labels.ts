import type { Quota } from '@driftgrid/domain';
import type { Role } from '../../auth/session.js';

export const QUOTA_LABELS: Record<keyof Quota, { label: string; unit: string }> = {
  maxPointsPerSweep: { label: 'Points per sweep', unit: 'points' },
  maxRunningSweeps: { label: 'Sweeps queued or running at once', unit: 'sweeps' },
  maxPointsPer30Days: { label: 'Points per rolling 30 days', unit: 'points' },
  maxStoredPoints: { label: 'Stored points', unit: 'points' },
};

export const ROLES: readonly Role[] = ['admin', 'researcher', 'reviewer'];

/** Dates as the admin tables show them: local date and time to the minute. */
export function formatWhen(ms: number | null | undefined): string {
  if (ms === null || ms === undefined) return '—';
  return new Date(ms).toLocaleString(undefined, {
    year: 'numeric',
    month: 'short',
    day: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
  });
}
