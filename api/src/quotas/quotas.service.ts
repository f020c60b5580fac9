import { Injectable, type OnModuleInit } from '@nestjs/common';
import {
  NotFoundError,
  QUOTA_KEYS,
  QuotaError,
  ROLE_NAMES,
  ValidationError,
  type Quota,
  type QuotaUsage,
  type QuotaVerdict,
  type QuotasDocument,
  type RoleName,
  type RoleQuotaPatch,
  type UserQuotaPatch,
} from '@driftgrid/domain';
import { AuditService } from '../admin/audit.service.js';
import { Clock } from '../common/clock.js';
import { Transactions } from '../db/transactions.js';
import { UsersRepository } from '../users/users.repository.js';
import { DEFAULT_ROLE_QUOTAS } from './quota-defaults.js';
import { findViolations, violationSentence } from './quota-messages.js';
import { QuotasRepository, type OverrideFields } from './quotas.repository.js';

export const ROLLING_WINDOW_MS = 30 * 24 * 3600_000;

/**
 * Quotas (SPEC §9). Every method is synchronous (better-sqlite3), so a caller can check and insert
 * a sweep in one synchronous block: concurrent submits cannot together pass max running sweeps.
 *
 * Usage:
 * - runningSweeps: status queued or running (sweeps table);
 * - pointsLast30Days: points charged in the quota_ledger table in the rolling 30 days. A sweep is
 *   charged once, when submitted (its compute is reserved from then on); deleting, cancelling or
 *   failing never removes the charge, so deleting cannot refund the quota;
 * - storedPoints: points of non-deleted sweeps that hold or will hold results — status not draft,
 *   failed or cancelled (queued and running sweeps count, as their results are on the way).
 * Lowering a quota never deletes data; it only refuses new sweeps until usage falls below it.
 */
@Injectable()
export class QuotasService implements OnModuleInit {
  constructor(
    private readonly repo: QuotasRepository,
    private readonly users: UsersRepository,
    private readonly audit: AuditService,
    private readonly clock: Clock,
    private readonly tx: Transactions,
  ) {}

  onModuleInit(): void {
    const now = this.clock.now();
    this.tx.run(() => {
      for (const role of ROLE_NAMES)
        if (!this.repo.role(role)) this.repo.upsertRole(role, DEFAULT_ROLE_QUOTAS[role], now);
    });
  }

  roleDefault(role: RoleName): Quota {
    return this.repo.role(role) ?? DEFAULT_ROLE_QUOTAS[role];
  }

  /** The role default with the user's non-null override fields on top. */
  effectiveQuota(userId: number, role: RoleName): Quota {
    const base = this.roleDefault(role);
    const o = this.repo.user(userId);
    if (!o) return { ...base };
    const q = { ...base };
    for (const k of QUOTA_KEYS) if (o[k] !== null && o[k] !== undefined) q[k] = o[k];
    return q;
  }

  /** Charges a submitted sweep's points to the ledger (call inside the submit transaction). */
  charge(userId: number, sweepId: number, points: number): void {
    this.repo.charge(userId, sweepId, points, this.clock.now());
  }

  usage(userId: number): QuotaUsage {
    return this.repo.usage(userId, this.clock.now() - ROLLING_WINDOW_MS);
  }

  verdict(userId: number, role: RoleName, points: number): QuotaVerdict {
    if (!Number.isSafeInteger(points) || points < 0) {
      throw new ValidationError('points must be a whole number of 0 or more', [
        { path: 'points', message: 'must be a whole number of 0 or more' },
      ]);
    }
    const violations = findViolations(this.effectiveQuota(userId, role), this.usage(userId), points);
    return { allowed: violations.length === 0, violations };
  }

  /** Throws QuotaError (HTTP 429) naming every limit the sweep would break, its value and the usage. */
  assertAllowed(userId: number, role: RoleName, points: number): void {
    const v = this.verdict(userId, role, points);
    if (v.allowed) return;
    throw new QuotaError(
      `Quota exceeded — ${v.violations.map(violationSentence).join('; ')}`,
      v.violations.map((x) => ({ path: x.limit, label: x.label, message: x.message })),
    );
  }

  document(): QuotasDocument {
    const defaults = Object.fromEntries(ROLE_NAMES.map((r) => [r, this.roleDefault(r)])) as Record<RoleName, Quota>;
    return { defaults, overrides: this.repo.overrides() };
  }

  setRoleDefault(actorId: number, role: RoleName, patch: RoleQuotaPatch): QuotasDocument {
    this.tx.run(() => {
      const before = this.roleDefault(role);
      const after = { ...before, ...patch };
      this.repo.upsertRole(role, after, this.clock.now());
      this.audit.record(actorId, 'quota.role', `role:${role}`, { before, after });
    });
    return this.document();
  }

  setUserOverride(actorId: number, userId: number, patch: UserQuotaPatch): QuotasDocument {
    this.tx.run(() => {
      const user = this.users.findById(userId);
      if (!user) throw new NotFoundError(`No user with id ${userId}`);
      const before: OverrideFields = this.repo.user(userId) ?? {
        maxPointsPerSweep: null,
        maxRunningSweeps: null,
        maxPointsPer30Days: null,
        maxStoredPoints: null,
      };
      const after: OverrideFields = { ...before };
      for (const k of QUOTA_KEYS) if (k in patch) after[k] = patch[k] ?? null;
      this.repo.saveUser(userId, after, this.clock.now());
      this.audit.record(actorId, 'quota.user', `user:${userId}`, { email: user.email, before, after });
    });
    return this.document();
  }
}
