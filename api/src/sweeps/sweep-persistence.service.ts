import { Injectable, Logger } from '@nestjs/common';
import { decodeFloat64, decodeUint32, type ChunkResultPayload } from '@driftgrid/worker';
import { ACTIVE_STATES, getModel, isActiveState } from '@driftgrid/domain';
import { Clock } from '../common/clock.js';
import { Transactions } from '../db/transactions.js';
import { ChunksRepository } from './chunks.repository.js';
import { SweepNotifier } from './ports.js';
import { ResultsWriter } from './results-writer.repository.js';
import { ROW_SPAN, slotColumns, type StoredColumn } from './sweep-layout.js';
import { SweepsRepository, type SweepRow } from './sweeps.repository.js';

export interface ChunkFailure {
  sweepId: number;
  chunkIndex: number;
  reason: string;
  workerId: string;
}

/**
 * Rows written per transaction. Writing runs on the api thread (SQLite has one writer), at roughly
 * 5–8 µs a row for a 40-column sweep: a whole 5,000-point chunk in one go would hold every request
 * for 30–40 ms; slices of 500 hold it for a few ms each, with the event loop free in between.
 */
export const ROWS_PER_SLICE = 500;

type Outcome = 'stored' | 'duplicate' | 'dropped';

/**
 * Persists computed chunks. Idempotent: rows are keyed by sweepId·2^32 + idx (INSERT OR REPLACE) and a
 * chunk already `done` adds nothing to the counters, so a retried or duplicated result changes nothing.
 * A chunk's rows are written in slices, each its own transaction, then one last transaction checks
 * again that the sweep and chunk still take them and counts the chunk done; if they no longer do
 * (cancelled or deleted meanwhile), the rows just written are removed again.
 */
@Injectable()
export class SweepPersistence {
  private readonly logger = new Logger('SweepPersistence');

  constructor(
    private readonly tx: Transactions,
    private readonly sweeps: SweepsRepository,
    private readonly chunks: ChunksRepository,
    private readonly results: ResultsWriter,
    private readonly clock: Clock,
    private readonly notifier: SweepNotifier,
  ) {}

  /**
   * The sweep that takes a chunk's result, or why it is not (or no longer) taken. Throws when the
   * result contradicts the chunk's plan.
   */
  private taker(p: ChunkResultPayload): { sweep: SweepRow } | { refused: Exclude<Outcome, 'stored'> } {
    const sweep = this.sweeps.findById(p.sweepId);
    if (!sweep || !isActiveState(sweep.status)) return { refused: 'dropped' };
    const chunk = this.chunks.plan(p.sweepId, p.chunkIndex);
    if (!chunk || chunk.state === 'cancelled') return { refused: 'dropped' };
    if (chunk.i0 !== p.i0 || chunk.i1 - chunk.i0 !== p.n)
      throw new Error(`chunk ${p.chunkIndex} of sweep ${p.sweepId} does not match its plan`);
    if (chunk.state === 'done') return { refused: 'duplicate' };
    return { sweep };
  }

  async persist(p: ChunkResultPayload): Promise<Outcome> {
    const early = this.taker(p);
    if ('refused' in early) return early.refused;
    const { sweep } = early;
    const layout = JSON.parse(sweep.columns) as StoredColumn[];
    const slots = slotColumns(layout);
    const arrays = slots.map((s) => {
      const enc = p.columns[s.name];
      if (enc === undefined) throw new Error(`chunk result lacks column ${s.name}`);
      return decodeFloat64(enc);
    });
    const flags = decodeUint32(p.flags);
    const slotNames = slots.map((s) => s.slot);
    const firstId = p.sweepId * ROW_SPAN + p.i0;
    for (let r = 0; r < p.n; r += ROWS_PER_SLICE) {
      const m = Math.min(ROWS_PER_SLICE, p.n - r);
      const part = arrays.map((a) => a.subarray(r, r + m));
      this.tx.run(() => this.results.writeRows(slotNames, firstId + r, flags.subarray(r, r + m), part, m));
      // Requests waiting meanwhile are answered before the next slice.
      if (r + m < p.n) await new Promise((resolve) => setImmediate(resolve));
    }

    const now = this.clock.now();
    const outcome = this.tx.run(() => {
      const last = this.taker(p);
      if ('refused' in last) {
        // Cancelled or deleted while the rows were written: they must not outlive their chunk.
        if (last.refused === 'dropped') this.results.deleteRows(firstId, p.n);
        return last.refused;
      }
      const current = last.sweep;
      const counts = JSON.parse(current.flagCounts) as Record<string, number>;
      const invalid = tallyFlags(current.model, flags, p.n, counts);
      this.chunks.markDone(
        p.sweepId,
        p.chunkIndex,
        { workerId: p.workerId, computeMs: p.computeMs, attempts: p.attempt },
        now,
      );
      const done = current.pointsDone + p.n;
      const complete = done >= current.points;
      this.sweeps.update(p.sweepId, {
        pointsDone: done,
        invalidPoints: current.invalidPoints + invalid,
        flagCounts: JSON.stringify(counts),
        computeMs: current.computeMs + p.computeMs,
        status: complete ? 'completed' : 'running',
        startedAt: current.startedAt ?? now,
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
    const failed = this.tx.run(() => {
      this.chunks.markFailed(f.sweepId, f.chunkIndex, f.reason.slice(0, 2000), f.workerId, now);
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

/**
 * Flag statistics for the overview (how many points fall outside the ordering and why): adds each
 * flag's count to `counts` and answers how many points carry an invalidating flag.
 */
function tallyFlags(modelId: string, flags: Uint32Array, n: number, counts: Record<string, number>): number {
  const model = getModel(modelId);
  const invalidMask = model.flags.filter((f) => f.invalidates).reduce((m, f) => m | (1 << f.bit), 0);
  const perBit = new Array<number>(32).fill(0);
  let invalid = 0;
  for (let i = 0; i < n; i++) {
    const f = flags[i];
    if (f & invalidMask) invalid++;
    for (let m = f, b = 0; m; m >>>= 1, b++) if (m & 1) perBit[b]++;
  }
  for (const f of model.flags) if (perBit[f.bit]) counts[f.code] = (counts[f.code] ?? 0) + perBit[f.bit];
  return invalid;
}
