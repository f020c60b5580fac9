import { Injectable, Logger } from '@nestjs/common';
import { decodeFloat64, decodeUint32, type ChunkResultPayload } from '@driftgrid/worker';
import { ACTIVE_STATES, getModel, isActiveState } from '@driftgrid/domain';
import { Clock } from '../common/clock.js';
import { Transactions } from '../db/transactions.js';
import { ChunksRepository } from './chunks.repository.js';
import { SweepNotifier } from './ports.js';
import { ResultsWriter } from './results-writer.repository.js';
import { ROW_SPAN, slotColumns, type StoredColumn } from './sweep-layout.js';
import { SweepsRepository } from './sweeps.repository.js';

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

  constructor(
    private readonly tx: Transactions,
    private readonly sweeps: SweepsRepository,
    private readonly chunks: ChunksRepository,
    private readonly results: ResultsWriter,
    private readonly clock: Clock,
    private readonly notifier: SweepNotifier,
  ) {}

  persist(p: ChunkResultPayload): 'stored' | 'duplicate' | 'dropped' {
    const now = this.clock.now();
    const outcome = this.tx.run(() => {
      const sweep = this.sweeps.findById(p.sweepId);
      if (!sweep || !isActiveState(sweep.status)) return 'dropped' as const;
      const chunk = this.chunks.plan(p.sweepId, p.chunkIndex);
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
      this.results.writeRows(
        slots.map((s) => s.slot),
        p.sweepId * ROW_SPAN + p.i0,
        flags,
        arrays,
        p.n,
      );

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

      this.chunks.markDone(
        p.sweepId,
        p.chunkIndex,
        { workerId: p.workerId, computeMs: p.computeMs, attempts: p.attempt },
        now,
      );
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
