/**
 * QuotasService against real SQLite (a temp file with the project's migrations): effective quotas,
 * usage from the sweeps table, verdicts naming the limit, its value and the usage, and the
 * synchronous check-and-insert that keeps concurrent submits under max running sweeps.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { QuotaError } from '@driftgrid/domain';
import { AuditRepository } from '../../api/src/admin/audit.repository.js';
import { AuditService } from '../../api/src/admin/audit.service.js';
import { Clock } from '../../api/src/common/clock.js';
import { openDatabase, type OpenedDatabase } from '../../api/src/db/database.js';
import { Transactions } from '../../api/src/db/transactions.js';
import { QuotasRepository } from '../../api/src/quotas/quotas.repository.js';
import { QuotasService, ROLLING_WINDOW_MS } from '../../api/src/quotas/quotas.service.js';
import { UsersRepository } from '../../api/src/users/users.repository.js';

class ManualClock extends Clock {
  t = Date.UTC(2026, 5, 1);
  now(): number {
    return this.t;
  }
}

let dir: string;
let h: OpenedDatabase;
let clock: ManualClock;
let quotas: QuotasService;
let rosa: number;
let remy: number;
let adminId: number;

/** A sweep row as the submit path leaves it: submitted sweeps are charged to the points ledger. */
function addSweep(
  ownerId: number,
  points: number,
  status: string,
  createdAt = clock.now(),
  deletedAt: number | null = null,
): number {
  const id = Number(
    h.sqlite
      .prepare(
        `INSERT INTO sweeps (owner_id, name, model, model_version, app_version, status, definition, columns, points, chunk_count, created_at, deleted_at)
         VALUES (?, 'argon column scan', 'cross-field', '1', '0.1.0', ?, '{}', '[]', ?, 1, ?, ?)`,
      )
      .run(ownerId, status, points, createdAt, deletedAt).lastInsertRowid,
  );
  if (status !== 'draft')
    h.sqlite
      .prepare('INSERT INTO quota_ledger (user_id, sweep_id, points, charged_at) VALUES (?, ?, ?, ?)')
      .run(ownerId, id, points, createdAt);
  return id;
}

beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'driftgrid-quotas-'));
  h = openDatabase(path.join(dir, 'q.db'));
  clock = new ManualClock();
  const users = new UsersRepository(h.db);
  const mk = (email: string, role: 'admin' | 'researcher' | 'reviewer') =>
    users.insert({
      email,
      name: email,
      role,
      passwordHash: 'x',
      active: true,
      createdAt: clock.now(),
      updatedAt: clock.now(),
    }).id;
  adminId = mk('ada@example.com', 'admin');
  rosa = mk('rosa@example.com', 'researcher');
  remy = mk('remy@example.com', 'reviewer');
  quotas = new QuotasService(
    new QuotasRepository(h),
    users,
    new AuditService(new AuditRepository(h.db), clock),
    clock,
    new Transactions(h.sqlite),
  );
  quotas.onModuleInit();
});
afterAll(() => {
  h.sqlite.close();
  fs.rmSync(dir, { recursive: true, force: true });
});
beforeEach(() => {
  h.sqlite.exec('DELETE FROM sweeps; DELETE FROM user_quotas; DELETE FROM quota_ledger;');
});

describe('QuotasService', () => {
  it('seeds role defaults once, reviewers at zero', () => {
    const doc = quotas.document();
    expect(doc.defaults.researcher).toEqual({
      maxPointsPerSweep: 2_000_000,
      maxRunningSweeps: 3,
      maxPointsPer30Days: 20_000_000,
      maxStoredPoints: 50_000_000,
    });
    expect(doc.defaults.reviewer).toEqual({
      maxPointsPerSweep: 0,
      maxRunningSweeps: 0,
      maxPointsPer30Days: 0,
      maxStoredPoints: 0,
    });
    expect(doc.defaults.admin.maxPointsPerSweep).toBeGreaterThan(doc.defaults.researcher.maxPointsPerSweep);
    quotas.setRoleDefault(adminId, 'researcher', { maxRunningSweeps: 4 });
    quotas.onModuleInit(); // a restart must not overwrite an admin's change
    expect(quotas.roleDefault('researcher').maxRunningSweeps).toBe(4);
    quotas.setRoleDefault(adminId, 'researcher', { maxRunningSweeps: 3 });
  });

  it('refuses a sweep one point over the per-sweep limit, naming the limit, its value and the size', () => {
    quotas.setUserOverride(adminId, rosa, { maxPointsPerSweep: 1000 });
    expect(quotas.verdict(rosa, 'researcher', 1000).allowed).toBe(true);
    const v = quotas.verdict(rosa, 'researcher', 1001);
    expect(v.allowed).toBe(false);
    expect(v.violations).toEqual([
      {
        limit: 'maxPointsPerSweep',
        label: 'Points per sweep',
        value: 1000,
        usage: 0,
        requested: 1001,
        message: 'limit 1,000 points; this sweep has 1,001',
      },
    ]);
    expect(() => quotas.assertAllowed(rosa, 'researcher', 1550)).toThrow(QuotaError);
    expect(() => quotas.assertAllowed(rosa, 'researcher', 1550)).toThrow(
      'Quota exceeded — Points per sweep: limit 1,000 points; this sweep has 1,550',
    );
  });

  it('a null override field falls back to the role default', () => {
    quotas.setUserOverride(adminId, rosa, { maxPointsPerSweep: 10, maxRunningSweeps: 1 });
    expect(quotas.effectiveQuota(rosa, 'researcher')).toMatchObject({
      maxPointsPerSweep: 10,
      maxRunningSweeps: 1,
      maxStoredPoints: 50_000_000,
    });
    quotas.setUserOverride(adminId, rosa, { maxPointsPerSweep: null });
    expect(quotas.effectiveQuota(rosa, 'researcher')).toMatchObject({
      maxPointsPerSweep: 2_000_000,
      maxRunningSweeps: 1,
    });
    quotas.setUserOverride(adminId, rosa, { maxRunningSweeps: null });
    expect(quotas.document().overrides).toEqual([]); // nothing left to override: the row is gone
  });

  it('computes usage from the sweeps table (running, stored) and the points ledger (rolling 30 days)', () => {
    const now = clock.now();
    addSweep(rosa, 100, 'queued');
    addSweep(rosa, 200, 'running');
    addSweep(rosa, 400, 'completed');
    addSweep(rosa, 800, 'archived', now - ROLLING_WINDOW_MS - 1); // outside the window, still stored
    addSweep(rosa, 1600, 'failed'); // spent compute in the window, holds no results
    addSweep(rosa, 3200, 'cancelled');
    addSweep(rosa, 6400, 'draft'); // never submitted
    addSweep(rosa, 12800, 'completed', now, now); // deleted
    addSweep(remy, 5, 'completed'); // someone else
    expect(quotas.usage(rosa)).toEqual({
      runningSweeps: 2,
      // The deleted sweep was charged when submitted: deleting refunds nothing.
      pointsLast30Days: 100 + 200 + 400 + 1600 + 3200 + 12800,
      storedPoints: 100 + 200 + 400 + 800,
    });
  });

  it('names the running, 30-day and stored limits with their usage', () => {
    quotas.setUserOverride(adminId, rosa, { maxRunningSweeps: 2, maxPointsPer30Days: 1000, maxStoredPoints: 1200 });
    addSweep(rosa, 300, 'queued');
    addSweep(rosa, 400, 'running');
    const v = quotas.verdict(rosa, 'researcher', 301);
    expect(v.violations.map((x) => x.limit)).toEqual(['maxRunningSweeps', 'maxPointsPer30Days']);
    expect(v.violations[0]).toMatchObject({
      value: 2,
      usage: 2,
      label: 'Sweeps queued or running at once',
      message: 'limit 2; 2 already queued or running; this sweep would add 1',
    });
    expect(v.violations[1]!.message).toBe('limit 1,000 points; 700 used in the last 30 days; this sweep would add 301');
    const stored = quotas.verdict(rosa, 'researcher', 501).violations.find((x) => x.limit === 'maxStoredPoints');
    expect(stored).toMatchObject({ value: 1200, usage: 700, requested: 501 });
  });

  it('the rolling window moves with the clock', () => {
    quotas.setUserOverride(adminId, rosa, { maxPointsPer30Days: 1000 });
    addSweep(rosa, 900, 'completed');
    expect(quotas.verdict(rosa, 'researcher', 200).allowed).toBe(false);
    clock.t += ROLLING_WINDOW_MS + 1;
    expect(quotas.verdict(rosa, 'researcher', 200).allowed).toBe(true);
    clock.t -= ROLLING_WINDOW_MS + 1;
  });

  it('a reviewer can never create: every size is refused', () => {
    for (const points of [0, 1, 1000]) {
      const v = quotas.verdict(remy, 'reviewer', points);
      expect(v.allowed).toBe(false);
      expect(v.violations.some((x) => x.limit === 'maxRunningSweeps' && x.value === 0)).toBe(true);
    }
  });

  it('lowering a quota never deletes data', () => {
    addSweep(rosa, 5000, 'completed');
    quotas.setUserOverride(adminId, rosa, { maxStoredPoints: 10 });
    expect((h.sqlite.prepare('SELECT COUNT(*) AS n FROM sweeps WHERE owner_id = ?').get(rosa) as { n: number }).n).toBe(
      1,
    );
    expect(quotas.usage(rosa).storedPoints).toBe(5000);
    expect(quotas.verdict(rosa, 'researcher', 1).violations[0]).toMatchObject({
      limit: 'maxStoredPoints',
      usage: 5000,
    });
  });

  it('check + insert in one synchronous transaction: concurrent submits cannot exceed max running sweeps', async () => {
    quotas.setUserOverride(adminId, rosa, { maxRunningSweeps: 3 });
    const submit = h.sqlite.transaction((points: number) => {
      quotas.assertAllowed(rosa, 'researcher', points);
      return addSweep(rosa, points, 'queued');
    });
    const results = await Promise.allSettled(
      Array.from(
        { length: 10 },
        (_, i) =>
          new Promise<number>((resolve, reject) =>
            setImmediate(() => {
              try {
                resolve(submit(10 + i));
              } catch (e) {
                reject(e as Error);
              }
            }),
          ),
      ),
    );
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(3);
    const refused = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
    expect(refused).toHaveLength(7);
    expect(
      refused.every(
        (r) => r.reason instanceof QuotaError && /Sweeps queued or running at once: limit 3;/.test(r.reason.message),
      ),
    ).toBe(true);
    expect(quotas.usage(rosa).runningSweeps).toBe(3);
  });

  it('records quota changes in the audit log and rejects bad input', () => {
    quotas.setRoleDefault(adminId, 'admin', { maxRunningSweeps: 12 });
    const last = h.sqlite
      .prepare("SELECT action, target, actor_id FROM audit_log WHERE action = 'quota.role' ORDER BY id DESC LIMIT 1")
      .get();
    expect(last).toEqual({ action: 'quota.role', target: 'role:admin', actor_id: adminId });
    expect(() => quotas.setUserOverride(adminId, 987654, { maxRunningSweeps: 1 })).toThrow(/No user with id 987654/);
    expect(() => quotas.verdict(rosa, 'researcher', -1)).toThrow(/points/);
  });
});
