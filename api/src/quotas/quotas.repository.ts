import { Inject, Injectable } from '@nestjs/common';
import type Database from 'better-sqlite3';
import {
  ACTIVE_STATES,
  QUOTA_KEYS,
  type Quota,
  type QuotaUsage,
  type RoleName,
  type UserQuotaOverride,
} from '@driftgrid/domain';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';

export type OverrideFields = { [K in keyof Quota]: number | null };

/** Named placeholders for the active states (@active0, @active1, …), bound by `activeParams`. */
const ACTIVE_IN = ACTIVE_STATES.map((_, i) => `@active${i}`).join(', ');
const activeParams = Object.fromEntries(ACTIVE_STATES.map((s, i) => [`active${i}`, s]));

const COLS =
  'max_points_per_sweep AS maxPointsPerSweep, max_running_sweeps AS maxRunningSweeps, max_points_per_30_days AS maxPointsPer30Days, max_stored_points AS maxStoredPoints';

/**
 * All quota SQL, as prepared better-sqlite3 statements: synchronous, so the sweeps module can run
 * check-and-insert in one synchronous block (no other request interleaves in between).
 */
@Injectable()
export class QuotasRepository {
  private readonly sqlite: Database.Database;
  private readonly st: Record<string, Database.Statement>;

  constructor(@Inject(DB_HANDLE) handle: OpenedDatabase) {
    this.sqlite = handle.sqlite;
    const s = this.sqlite;
    this.st = {
      roleCount: s.prepare('SELECT COUNT(*) AS n FROM role_quotas'),
      role: s.prepare(`SELECT ${COLS} FROM role_quotas WHERE role = ?`),
      roles: s.prepare(`SELECT role, ${COLS} FROM role_quotas ORDER BY role`),
      upsertRole: s.prepare(
        `INSERT INTO role_quotas (role, max_points_per_sweep, max_running_sweeps, max_points_per_30_days, max_stored_points, updated_at)
         VALUES (@role, @maxPointsPerSweep, @maxRunningSweeps, @maxPointsPer30Days, @maxStoredPoints, @now)
         ON CONFLICT(role) DO UPDATE SET max_points_per_sweep = excluded.max_points_per_sweep, max_running_sweeps = excluded.max_running_sweeps,
           max_points_per_30_days = excluded.max_points_per_30_days, max_stored_points = excluded.max_stored_points, updated_at = excluded.updated_at`,
      ),
      user: s.prepare(`SELECT ${COLS} FROM user_quotas WHERE user_id = ?`),
      users: s.prepare(
        `SELECT q.user_id AS userId, u.email, u.name, u.role, ${COLS.replace(/max_/g, 'q.max_')} FROM user_quotas q JOIN users u ON u.id = q.user_id ORDER BY q.user_id`,
      ),
      upsertUser: s.prepare(
        `INSERT INTO user_quotas (user_id, max_points_per_sweep, max_running_sweeps, max_points_per_30_days, max_stored_points, updated_at)
         VALUES (@userId, @maxPointsPerSweep, @maxRunningSweeps, @maxPointsPer30Days, @maxStoredPoints, @now)
         ON CONFLICT(user_id) DO UPDATE SET max_points_per_sweep = excluded.max_points_per_sweep, max_running_sweeps = excluded.max_running_sweeps,
           max_points_per_30_days = excluded.max_points_per_30_days, max_stored_points = excluded.max_stored_points, updated_at = excluded.updated_at`,
      ),
      deleteUser: s.prepare('DELETE FROM user_quotas WHERE user_id = ?'),
      usage: s.prepare(
        `SELECT
           COALESCE(SUM(CASE WHEN status IN (${ACTIVE_IN}) THEN 1 ELSE 0 END), 0) AS runningSweeps,
           (SELECT COALESCE(SUM(points), 0) FROM quota_ledger WHERE user_id = @userId AND charged_at >= @since) AS pointsLast30Days,
           COALESCE(SUM(CASE WHEN status NOT IN ('draft', 'failed', 'cancelled') THEN points ELSE 0 END), 0) AS storedPoints
         FROM sweeps WHERE owner_id = @userId AND deleted_at IS NULL`,
      ),
      charge: s.prepare(
        'INSERT INTO quota_ledger (user_id, sweep_id, points, charged_at) VALUES (@userId, @sweepId, @points, @now)',
      ),
    };
  }

  roleCount(): number {
    return (this.st.roleCount.get() as { n: number }).n;
  }

  role(role: RoleName): Quota | undefined {
    return this.st.role.get(role) as Quota | undefined;
  }

  roles(): (Quota & { role: RoleName })[] {
    return this.st.roles.all() as (Quota & { role: RoleName })[];
  }

  upsertRole(role: RoleName, q: Quota, now: number): void {
    this.st.upsertRole.run({ role, ...q, now });
  }

  user(userId: number): OverrideFields | undefined {
    return this.st.user.get(userId) as OverrideFields | undefined;
  }

  overrides(): UserQuotaOverride[] {
    return this.st.users.all() as UserQuotaOverride[];
  }

  /** Stores an override; a row whose fields are all null is removed (nothing overridden). */
  saveUser(userId: number, fields: OverrideFields, now: number): void {
    if (QUOTA_KEYS.every((k) => fields[k] === null)) this.st.deleteUser.run(userId);
    else this.st.upsertUser.run({ userId, ...fields, now });
  }

  /** Appends to the points ledger; nothing ever updates or deletes a ledger row. */
  charge(userId: number, sweepId: number, points: number, now: number): void {
    this.st.charge.run({ userId, sweepId, points, now });
  }

  usage(userId: number, since: number): QuotaUsage {
    return this.st.usage.get({ userId, since, ...activeParams }) as QuotaUsage;
  }
}
