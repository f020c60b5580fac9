import { ACTIVE_STATES } from '@driftgrid/domain';
import { Inject, Injectable } from '@nestjs/common';
import { and, eq, inArray } from 'drizzle-orm';
import { DB } from '../db/db.module.js';
import type { Db } from '../db/database.js';
import { fits, users } from '../db/schema.js';

export type FitRow = typeof fits.$inferSelect;
export type NewFit = typeof fits.$inferInsert;

export interface Viewer {
  id: number;
  role: string;
}

/**
 * Which sources a viewer may read, as SQL over the fit row `f`. Mirrors SweepAccess.canRead and
 * DatasetsService.canRead (owner, admin, group visibility, archived sweeps, explicit shares);
 * deleted sources hide their fits.
 */
const READABLE_SOURCE = `(
  (f.source_kind = 'sweep' AND EXISTS (SELECT 1 FROM sweeps s WHERE s.id = f.source_id AND s.deleted_at IS NULL AND (
    s.owner_id = @uid OR s.status = 'archived' OR s.visibility = 'group'
    OR EXISTS (SELECT 1 FROM sweep_shares sh WHERE sh.sweep_id = s.id AND sh.user_id = @uid))))
  OR (f.source_kind = 'dataset' AND EXISTS (SELECT 1 FROM datasets d WHERE d.id = f.source_id AND d.deleted_at IS NULL AND (
    d.owner_id = @uid OR d.visibility = 'group'
    OR EXISTS (SELECT 1 FROM dataset_shares dh WHERE dh.dataset_id = d.id AND dh.user_id = @uid))))
)`;

const LIVE_SOURCE = `(
  (f.source_kind = 'sweep' AND EXISTS (SELECT 1 FROM sweeps s WHERE s.id = f.source_id AND s.deleted_at IS NULL))
  OR (f.source_kind = 'dataset' AND EXISTS (SELECT 1 FROM datasets d WHERE d.id = f.source_id AND d.deleted_at IS NULL))
)`;

/** All SQL of the fits feature. */
@Injectable()
export class FitsRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  insert(row: NewFit): FitRow {
    return this.db.insert(fits).values(row).returning().get();
  }

  findById(id: number): FitRow | undefined {
    return this.db.select().from(fits).where(eq(fits.id, id)).get();
  }

  update(id: number, patch: Partial<NewFit>): void {
    this.db.update(fits).set(patch).where(eq(fits.id, id)).run();
  }

  /** Every fit of one source, oldest first (for exports; no visibility check here). */
  ofSource(kind: 'sweep' | 'dataset', id: number): FitRow[] {
    return this.db
      .select()
      .from(fits)
      .where(and(eq(fits.sourceKind, kind), eq(fits.sourceId, id)))
      .orderBy(fits.id)
      .all();
  }

  /** Fits left queued or running by a process that stopped. */
  unfinished(): FitRow[] {
    return this.db.select().from(fits).where(inArray(fits.status, ACTIVE_STATES)).all();
  }

  list(
    viewer: Viewer,
    q: { page: number; pageSize: number; sourceKind?: string; sourceId?: number },
  ): { items: FitRow[]; total: number } {
    const where: string[] = [viewer.role === 'admin' ? LIVE_SOURCE : READABLE_SOURCE];
    const params: Record<string, string | number> = { uid: viewer.id };
    if (q.sourceKind) {
      where.push('f.source_kind = @kind');
      params.kind = q.sourceKind;
    }
    if (q.sourceId !== undefined) {
      where.push('f.source_id = @sid');
      params.sid = q.sourceId;
    }
    const clause = where.join(' AND ');
    const sqlite = this.db.$client;
    const total = (sqlite.prepare(`SELECT COUNT(*) AS n FROM fits f WHERE ${clause}`).get(params) as { n: number }).n;
    const ids = sqlite
      .prepare(
        `SELECT f.id AS id FROM fits f WHERE ${clause} ORDER BY f.created_at DESC, f.id DESC LIMIT @limit OFFSET @offset`,
      )
      .all({ ...params, limit: q.pageSize, offset: (q.page - 1) * q.pageSize }) as { id: number }[];
    if (!ids.length) return { items: [], total };
    const rows = this.db
      .select()
      .from(fits)
      .where(
        inArray(
          fits.id,
          ids.map((r) => r.id),
        ),
      )
      .all();
    const byId = new Map(rows.map((r) => [r.id, r]));
    return { items: ids.map((r) => byId.get(r.id)!).filter(Boolean), total };
  }

  userName(id: number): string {
    return this.db.select({ name: users.name }).from(users).where(eq(users.id, id)).get()?.name ?? 'unknown';
  }

  /** Display names of sources, for list rows. */
  sourceName(kind: 'sweep' | 'dataset', id: number): string | null {
    const table = kind === 'sweep' ? 'sweeps' : 'datasets';
    const r = this.db.$client.prepare(`SELECT name FROM ${table} WHERE id = ?`).get(id) as { name: string } | undefined;
    return r?.name ?? null;
  }
}
