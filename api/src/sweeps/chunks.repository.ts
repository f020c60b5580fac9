import { Inject, Injectable } from '@nestjs/common';
import type { Statement } from 'better-sqlite3';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import type { CHUNK_STATES } from '../db/schema.js';

export interface ChunkPlan {
  state: (typeof CHUNK_STATES)[number];
  i0: number;
  i1: number;
}

/** The sweep_chunks rows the results consumer reads and settles (prepared once: every chunk passes here). */
@Injectable()
export class ChunksRepository {
  private readonly st: { plan: Statement; done: Statement; failed: Statement };

  constructor(@Inject(DB_HANDLE) handle: OpenedDatabase) {
    const s = handle.sqlite;
    this.st = {
      plan: s.prepare('SELECT state, i0, i1 FROM sweep_chunks WHERE sweep_id = ? AND chunk_index = ?'),
      done: s.prepare(
        "UPDATE sweep_chunks SET state = 'done', worker_id = ?, compute_ms = ?, attempts = ?, error = NULL, updated_at = ? WHERE sweep_id = ? AND chunk_index = ?",
      ),
      failed: s.prepare(
        "UPDATE sweep_chunks SET state = 'failed', error = ?, worker_id = ?, updated_at = ? WHERE sweep_id = ? AND chunk_index = ? AND state != 'done'",
      ),
    };
  }

  /** The chunk's state and planned point range [i0, i1). */
  plan(sweepId: number, chunkIndex: number): ChunkPlan | undefined {
    return this.st.plan.get(sweepId, chunkIndex) as ChunkPlan | undefined;
  }

  markDone(
    sweepId: number,
    chunkIndex: number,
    run: { workerId: string; computeMs: number; attempts: number },
    now: number,
  ): void {
    this.st.done.run(run.workerId, run.computeMs, run.attempts, now, sweepId, chunkIndex);
  }

  /** Marks the chunk failed with its reason, unless it already completed. */
  markFailed(sweepId: number, chunkIndex: number, reason: string, workerId: string, now: number): void {
    this.st.failed.run(reason, workerId, now, sweepId, chunkIndex);
  }
}
