import type { Quota, RoleName } from '@driftgrid/domain';

/**
 * Role defaults seeded when role_quotas is empty. Researchers get room for a few large scans a
 * month; admins more; reviewers 0 everywhere because reviewers never create sweeps.
 */
export const DEFAULT_ROLE_QUOTAS: Record<RoleName, Quota> = {
  admin: {
    maxPointsPerSweep: 10_000_000,
    maxRunningSweeps: 10,
    maxPointsPer30Days: 100_000_000,
    maxStoredPoints: 250_000_000,
  },
  researcher: {
    maxPointsPerSweep: 2_000_000,
    maxRunningSweeps: 3,
    maxPointsPer30Days: 20_000_000,
    maxStoredPoints: 50_000_000,
  },
  reviewer: { maxPointsPerSweep: 0, maxRunningSweeps: 0, maxPointsPer30Days: 0, maxStoredPoints: 0 },
};
