import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Statement } from 'better-sqlite3';
import { decodeFloat64, decodeUint32, type ChunkResultPayload } from '@driftgrid/worker';
import { ACTIVE_STATES, getModel } from '@driftgrid/domain';
import { Clock } from '../common/clock.js';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import { SweepNotifier } from './ports.js';
import { ROW_SPAN, slotColumns, type StoredColumn } from './sweep-layout.js';
import { SweepsRepository } from './sweeps.repository.js';

/** Rows per INSERT statement: multi-row VALUES cuts per-statement overhead several-fold. */
const ROWS_PER_STATEMENT = 16;

export interface ChunkFailure {
  sweepId: number;
  chunkIndex: number;
  reason: string;
  workerId: string;
}

/**
 * Persists computed chunks. Idempotent: rows are keyed by sweepId·2^32 + idx (INSERT OR REPLACE) and a
 * chunk already `done` adds nothing to the counters, so a retried or duplicated result changes nothing.
 */
@Injectable()
export class SweepPersistence {
  private readonly logger = new Logger('SweepPersistence');
  private readonly statements = new Map<string, Statement>();

  constructor(
    @Inject(DB_HANDLE) private readonly handle: OpenedDatabase,
    private readonly sweeps: SweepsRepository,
    private readonly clock: Clock,
    private readonly notifier: SweepNotifier,
  ) {}

  private insertStatement(slots: string[], rows: number): Statement {
    const key = `${slots.join(',')}|${rows}`;
    let st = this.statements.get(key);
    if (!st) {
      const one = `(${new Array(slots.length + 2).fill('?').join(',')})`;
      st = this.handle.sqlite.prepare(
        `INSERT OR REPLACE INTO results (id, flags, ${slots.join(', ')}) VALUES ${new Array(rows).fill(one).join(',')}`,
      );
      this.statements.set(key, st);
    }
    return st;
  }

  persist(p: ChunkResultPayload): 'stored' | 'duplicate' | 'dropped' {
    const now = this.clock.now();
    const outcome = this.sweeps.transaction(() => {
      const sweep = this.sweeps.findById(p.sweepId);
      if (!sweep || (sweep.status !== 'queued' && sweep.status !== 'running')) return 'dropped' as const;
      const chunk = this.handle.sqlite
        .prepare('SELECT state, i0, i1 FROM sweep_chunks WHERE sweep_id = ? AND chunk_index = ?')
        .get(p.sweepId, p.chunkIndex) as { state: string; i0: number; i1: number } | undefined;
      if (!chunk || chunk.state === 'cancelled') return 'dropped' as const;
      if (chunk.i0 !== p.i0 || chunk.i1 - chunk.i0 !== p.n)
        throw new Error(`chunk ${p.chunkIndex} of sweep ${p.sweepId} does not match its plan`);
      if (chunk.state === 'done') return 'duplicate' as const;

      const layout = JSON.parse(sweep.columns) as StoredColumn[];
      const slots = slotColumns(layout);
      const arrays = slots.map((s) => {
        const enc = p.columns[s.name];
        if (enc === undefined) throw new Error(`chunk result lacks column ${s.name}`);
        return decodeFloat64(enc);
      });
      const flags = decodeUint32(p.flags);
      const slotNames = slots.map((s) => s.slot);
      const width = slotNames.length + 2;
      const base = p.sweepId * ROW_SPAN + p.i0;
      const full = this.insertStatement(slotNames, ROWS_PER_STATEMENT);
      const params = new Array(width * ROWS_PER_STATEMENT);
      let r = 0;
      for (; r + ROWS_PER_STATEMENT <= p.n; r += ROWS_PER_STATEMENT) {
        for (let k = 0; k < ROWS_PER_STATEMENT; k++) fillRow(params, k * width, base + r + k, flags, arrays, r + k);
        full.run(params);
      }
      if (r < p.n) {
        const rest = p.n - r;
        const tail = this.insertStatement(slotNames, rest);
        const tp = new Array(width * rest);
        for (let k = 0; k < rest; k++) fillRow(tp, k * width, base + r + k, flags, arrays, r + k);
        tail.run(tp);
      }

      // Flag statistics for the overview (how many points fall outside the ordering and why).
      const model = getModel(sweep.model);
      const counts = JSON.parse(sweep.flagCounts) as Record<string, number>;
      let invalid = 0;
      const invalidMask = model.flags.filter((f) => f.invalidates).reduce((m, f) => m | (1 << f.bit), 0);
      const perBit = new Array<number>(32).fill(0);
      for (let i = 0; i < p.n; i++) {
        const f = flags[i];
        if (f & invalidMask) invalid++;
        for (let m = f, b = 0; m; m >>>= 1, b++) if (m & 1) perBit[b]++;
      }
      for (const f of model.flags) if (perBit[f.bit]) counts[f.code] = (counts[f.code] ?? 0) + perBit[f.bit];

      this.handle.sqlite
        .prepare(
          "UPDATE sweep_chunks SET state = 'done', worker_id = ?, compute_ms = ?, attempts = ?, error = NULL, updated_at = ? WHERE sweep_id = ? AND chunk_index = ?",
        )
        .run(p.workerId, p.computeMs, p.attempt, now, p.sweepId, p.chunkIndex);
      const done = sweep.pointsDone + p.n;
      const complete = done >= sweep.points;
      this.sweeps.update(p.sweepId, {
        pointsDone: done,
        invalidPoints: sweep.invalidPoints + invalid,
        flagCounts: JSON.stringify(counts),
        computeMs: sweep.computeMs + p.computeMs,
        status: complete ? 'completed' : 'running',
        startedAt: sweep.startedAt ?? now,
        ...(complete ? { finishedAt: now } : {}),
      });
      return complete ? ('completed' as const) : ('stored' as const);
    });
    if (outcome === 'completed') {
      const s = this.sweeps.findById(p.sweepId)!;
      void this.notifier
        .sweepFinished({ sweepId: s.id, ownerId: s.ownerId, name: s.name, status: 'completed' })
        .catch((e) => this.logger.warn(`notify failed: ${(e as Error).message}`));
      return 'stored';
    }
    return outcome;
  }

  /** A chunk that exhausted its attempts fails the sweep, keeping the reason. */
  fail(f: ChunkFailure): void {
    const now = this.clock.now();
    const failed = this.sweeps.transaction(() => {
      this.handle.sqlite
        .prepare(
          "UPDATE sweep_chunks SET state = 'failed', error = ?, worker_id = ?, updated_at = ? WHERE sweep_id = ? AND chunk_index = ? AND state != 'done'",
        )
        .run(f.reason.slice(0, 2000), f.workerId, now, f.sweepId, f.chunkIndex);
      return this.sweeps.transition(f.sweepId, ACTIVE_STATES, {
        status: 'failed',
        error: `chunk ${f.chunkIndex}: ${f.reason}`.slice(0, 2000),
        finishedAt: now,
      });
    });
    if (failed) {
      const s = this.sweeps.findById(f.sweepId)!;
      void this.notifier
        .sweepFinished({ sweepId: s.id, ownerId: s.ownerId, name: s.name, status: 'failed', error: s.error })
        .catch(() => undefined);
    }
  }
}

function fillRow(
  params: unknown[],
  at: number,
  id: number,
  flags: Uint32Array,
  arrays: Float64Array[],
  i: number,
): void {
  params[at] = id;
  params[at + 1] = flags[i];
  for (let c = 0; c < arrays.length; c++) {
    const v = arrays[c][i];
    // SQLite stores ±Infinity as REAL but has no NaN: NaN is stored as NULL (answered as "NaN").
    params[at + 2 + c] = Number.isNaN(v) ? null : v;
  }
}
