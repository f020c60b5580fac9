import { ACTIVE_STATES } from '@driftgrid/domain';
import { Inject, Injectable } from '@nestjs/common';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { DB } from '../db/db.module.js';
import type { Db } from '../db/database.js';
import { inTransaction } from '../db/transactions.js';
import { sweepChunks, sweepShares, sweepTags, sweeps, type SweepStatus } from '../db/schema.js';
import { rowRange } from './sweep-layout.js';

export type SweepRow = typeof sweeps.$inferSelect;
export type NewSweep = typeof sweeps.$inferInsert;
export type ChunkRow = typeof sweepChunks.$inferSelect;

@Injectable()
export class SweepsRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  insert(row: NewSweep, tags: string[], chunks: { index: number; i0: number; i1: number }[], now: number): SweepRow {
    return inTransaction(this.db.$client, () => {
      const s = this.db.insert(sweeps).values(row).returning().get();
      if (tags.length)
        this.db
          .insert(sweepTags)
          .values([...new Set(tags)].map((tag) => ({ sweepId: s.id, tag })))
          .run();
      const ins = this.db.$client.prepare(
        'INSERT INTO sweep_chunks (sweep_id, chunk_index, i0, i1, state, attempts, updated_at) VALUES (?, ?, ?, ?, ?, 0, ?)',
      );
      for (const c of chunks) ins.run(s.id, c.index, c.i0, c.i1, 'queued', now);
      return s;
    });
  }

  /** Prepared once: every read of a sweep starts here, and building the query each time costs ~1 ms. */
  private byId?: { get(p: { id: number }): SweepRow | undefined };

  findById(id: number): SweepRow | undefined {
    this.byId ??= this.db
      .select()
      .from(sweeps)
      .where(eq(sweeps.id, sql.placeholder('id')))
      .prepare();
    return this.byId.get({ id });
  }

  tags(id: number): string[] {
    return this.db
      .select({ tag: sweepTags.tag })
      .from(sweepTags)
      .where(eq(sweepTags.sweepId, id))
      .all()
      .map((r) => r.tag);
  }

  sharedWith(id: number): number[] {
    return this.db
      .select({ u: sweepShares.userId })
      .from(sweepShares)
      .where(eq(sweepShares.sweepId, id))
      .all()
      .map((r) => r.u);
  }

  isSharedWith(id: number, userId: number): boolean {
    return !!this.db
      .select({ u: sweepShares.userId })
      .from(sweepShares)
      .where(and(eq(sweepShares.sweepId, id), eq(sweepShares.userId, userId)))
      .get();
  }

  update(id: number, patch: Partial<NewSweep>): void {
    this.db.update(sweeps).set(patch).where(eq(sweeps.id, id)).run();
  }

  /** Changes status only when the sweep is currently in one of `from` (compare-and-set). */
  transition(id: number, from: readonly SweepStatus[], patch: Partial<NewSweep> & { status: SweepStatus }): boolean {
    const r = this.db
      .update(sweeps)
      .set(patch)
      .where(and(eq(sweeps.id, id), inArray(sweeps.status, [...from])))
      .run();
    return r.changes > 0;
  }

  chunks(id: number, states?: readonly string[]): ChunkRow[] {
    const cond = states
      ? and(eq(sweepChunks.sweepId, id), inArray(sweepChunks.state, states as never))
      : eq(sweepChunks.sweepId, id);
    return this.db.select().from(sweepChunks).where(cond).orderBy(sweepChunks.chunkIndex).all();
  }

  setChunkStates(id: number, from: readonly string[], to: string, now: number): number {
    return this.db
      .update(sweepChunks)
      .set({ state: to as never, updatedAt: now })
      .where(and(eq(sweepChunks.sweepId, id), inArray(sweepChunks.state, from as never)))
      .run().changes;
  }

  /** Sweeps with work outstanding (re-enqueued at start). */
  unfinished(): SweepRow[] {
    return this.db.select().from(sweeps).where(inArray(sweeps.status, ACTIVE_STATES)).all();
  }

  /** Chunk rows of every sweep by state (`done`, `failed`, …): the admin queue page's true totals. */
  chunkStateCounts(): Record<string, number> {
    const rows = this.db.all<{ state: string; n: number }>(
      sql`SELECT state, COUNT(*) AS n FROM sweep_chunks GROUP BY state`,
    );
    return Object.fromEntries(rows.map((r) => [r.state, r.n]));
  }

  workerSummary(id: number): { id: string; chunks: number; points: number }[] {
    return this.db.all<{ id: string; chunks: number; points: number }>(sql`
      SELECT worker_id AS id, COUNT(*) AS chunks, SUM(i1 - i0) AS points FROM sweep_chunks
      WHERE sweep_id = ${id} AND state = 'done' AND worker_id IS NOT NULL GROUP BY worker_id ORDER BY worker_id`);
  }

  /** Deletes a sweep with its rows, chunks, tags and shares. */
  delete(id: number): void {
    const { lo, hi } = rowRange(id);
    inTransaction(this.db.$client, () => {
      this.db.$client.prepare('DELETE FROM results WHERE id BETWEEN ? AND ?').run(lo, hi);
      this.db.delete(sweeps).where(eq(sweeps.id, id)).run();
    });
  }
}
