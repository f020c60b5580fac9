import { Inject, Injectable } from '@nestjs/common';
import { and, eq, inArray, isNull } from 'drizzle-orm';
import { DB } from '../db/db.module.js';
import type { Db } from '../db/database.js';
import { inTransaction } from '../db/transactions.js';
import { datasetShares, datasets, users } from '../db/schema.js';
import type { Cell } from './csv-reader.js';

export type DatasetRow = typeof datasets.$inferSelect;
export type NewDataset = typeof datasets.$inferInsert;

/** rowid = datasetId · 2^32 + row index: one dataset's rows are one contiguous range. */
const ROW_SPAN = 2 ** 32;
export function datasetRowRange(id: number): { lo: number; hi: number } {
  return { lo: id * ROW_SPAN, hi: (id + 1) * ROW_SPAN - 1 };
}

/** Rows read per batch when streaming a dataset (exports, columns): memory stays bounded. */
const BATCH = 2000;

export interface Viewer {
  id: number;
  role: string;
}

@Injectable()
export class DatasetsRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  private get sqlite() {
    return this.db.$client;
  }

  /** Inserts the metadata and every row in one transaction: a failure stores nothing. */
  insert(row: NewDataset, cells: Cell[][]): DatasetRow {
    return inTransaction(this.sqlite, () => {
      const d = this.db.insert(datasets).values(row).returning().get();
      const ins = this.sqlite.prepare('INSERT INTO dataset_rows (id, cells) VALUES (?, ?)');
      const base = d.id * ROW_SPAN;
      for (let i = 0; i < cells.length; i++) ins.run(base + i, JSON.stringify(cells[i]));
      return d;
    });
  }

  findById(id: number): DatasetRow | undefined {
    return this.db
      .select()
      .from(datasets)
      .where(and(eq(datasets.id, id), isNull(datasets.deletedAt)))
      .get();
  }

  isSharedWith(id: number, userId: number): boolean {
    return !!this.db
      .select({ u: datasetShares.userId })
      .from(datasetShares)
      .where(and(eq(datasetShares.datasetId, id), eq(datasetShares.userId, userId)))
      .get();
  }

  sharedWith(id: number): number[] {
    return this.db
      .select({ u: datasetShares.userId })
      .from(datasetShares)
      .where(eq(datasetShares.datasetId, id))
      .all()
      .map((r) => r.u);
  }

  ownerName(ownerId: number): string {
    return this.db.select({ name: users.name }).from(users).where(eq(users.id, ownerId)).get()?.name ?? 'unknown';
  }

  existingUserIds(ids: number[]): Set<number> {
    if (!ids.length) return new Set();
    return new Set(
      this.db
        .select({ id: users.id })
        .from(users)
        .where(inArray(users.id, ids))
        .all()
        .map((r) => r.id),
    );
  }

  /** The datasets a user may read (owner, admin: all, group visibility, shared), newest first. */
  list(viewer: Viewer, q: { page: number; pageSize: number; text?: string }): { items: DatasetRow[]; total: number } {
    const where: string[] = ['d.deleted_at IS NULL'];
    const params: (string | number)[] = [];
    if (viewer.role !== 'admin') {
      where.push(
        `(d.owner_id = ? OR d.visibility = 'group' OR EXISTS (SELECT 1 FROM dataset_shares s WHERE s.dataset_id = d.id AND s.user_id = ?))`,
      );
      params.push(viewer.id, viewer.id);
    }
    if (q.text) {
      where.push(`(d.name LIKE ? ESCAPE '\\' OR d.file_name LIKE ? ESCAPE '\\')`);
      const like = `%${q.text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      params.push(like, like);
    }
    const clause = where.join(' AND ');
    const total = (
      this.sqlite.prepare(`SELECT COUNT(*) AS n FROM datasets d WHERE ${clause}`).get(...params) as { n: number }
    ).n;
    const ids = this.sqlite
      .prepare(`SELECT d.id FROM datasets d WHERE ${clause} ORDER BY d.created_at DESC, d.id DESC LIMIT ? OFFSET ?`)
      .pluck()
      .all(...params, q.pageSize, (q.page - 1) * q.pageSize) as number[];
    const items = ids.length ? this.db.select().from(datasets).where(inArray(datasets.id, ids)).all() : [];
    const order = new Map(ids.map((id, i) => [id, i]));
    items.sort((a, b) => order.get(a.id)! - order.get(b.id)!);
    return { items, total };
  }

  rowsPage(id: number, page: number, pageSize: number): { row: number; cells: Cell[] }[] {
    const { lo, hi } = datasetRowRange(id);
    const rows = this.sqlite
      .prepare('SELECT id, cells FROM dataset_rows WHERE id BETWEEN ? AND ? ORDER BY id LIMIT ? OFFSET ?')
      .raw(true)
      .all(lo, hi, pageSize, (page - 1) * pageSize) as [number, string][];
    return rows.map(([rid, cells]) => ({ row: rid - lo, cells: JSON.parse(cells) as Cell[] }));
  }

  /**
   * Every row in order, read in keyset batches. No statement stays open between batches, so a slow
   * download never holds the shared connection (better-sqlite3 refuses writes while an iterator is open).
   */
  *iterateRows(id: number): Generator<Cell[]> {
    const { lo, hi } = datasetRowRange(id);
    const stmt = this.sqlite
      .prepare('SELECT id, cells FROM dataset_rows WHERE id > ? AND id <= ? ORDER BY id LIMIT ?')
      .raw(true);
    let after = lo - 1;
    for (;;) {
      const batch = stmt.all(after, hi, BATCH) as [number, string][];
      for (const [, cells] of batch) yield JSON.parse(cells) as Cell[];
      if (batch.length < BATCH) return;
      after = batch[batch.length - 1][0];
    }
  }

  setSharing(id: number, patch: { visibility?: 'private' | 'group'; userIds?: number[] }): void {
    inTransaction(this.sqlite, () => {
      if (patch.visibility)
        this.db.update(datasets).set({ visibility: patch.visibility }).where(eq(datasets.id, id)).run();
      if (patch.userIds) {
        this.db.delete(datasetShares).where(eq(datasetShares.datasetId, id)).run();
        const unique = [...new Set(patch.userIds)];
        if (unique.length)
          this.db
            .insert(datasetShares)
            .values(unique.map((userId) => ({ datasetId: id, userId })))
            .run();
      }
    });
  }

  /** Drops the rows and shares; the metadata row stays (marked deleted) so fits can still name their source. */
  delete(id: number, now: number): void {
    const { lo, hi } = datasetRowRange(id);
    inTransaction(this.sqlite, () => {
      this.sqlite.prepare('DELETE FROM dataset_rows WHERE id BETWEEN ? AND ?').run(lo, hi);
      this.db.delete(datasetShares).where(eq(datasetShares.datasetId, id)).run();
      this.db.update(datasets).set({ deletedAt: now }).where(eq(datasets.id, id)).run();
    });
  }
}
