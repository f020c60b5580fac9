import { Inject, Injectable } from '@nestjs/common';
import {
  ACTIVE_STATES,
  ConflictError,
  checkSweep,
  planChunks,
  summariseSweepErrors,
  ValidationError,
  type CompiledSweep,
  type ErrorDetail,
  type SweepCreatedView,
  type SweepPreviewView,
} from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { Transactions } from '../db/transactions.js';
import { UsersRepository } from '../users/users.repository.js';
import { ChunkDispatcher } from './chunk-dispatcher.js';
import { QuotaGate } from './ports.js';
import { SweepAccess } from './sweep-access.js';
import { layoutColumns } from './sweep-layout.js';
import { presentSweep } from './sweep.presenter.js';
import { SweepsRepository, type SweepRow } from './sweeps.repository.js';
import { unknownKeys } from './unknown-keys.js';

/** Rows per second SQLite persists on this class of machine (refined from finished sweeps). */
const DEFAULT_PERSIST_RATE = 200_000;

@Injectable()
export class SweepsService {
  private persistRate = DEFAULT_PERSIST_RATE;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly repo: SweepsRepository,
    private readonly access: SweepAccess,
    private readonly dispatcher: ChunkDispatcher,
    private readonly quotas: QuotaGate,
    private readonly users: UsersRepository,
    private readonly clock: Clock,
    private readonly tx: Transactions,
  ) {}

  /** Everything the builder shows before submitting: counts, estimate, quota verdict, every error. */
  preview(user: AuthUser, raw: unknown): SweepPreviewView {
    const checked = checkSweep(raw);
    if (!checked.ok)
      return {
        ok: false,
        errors: checked.errors,
        points: null,
        chunks: null,
        estimate: null,
        quota: null,
        sample: null,
      };
    const unknown = unknownKeys(raw, checked.compiled.definition);
    if (unknown.length)
      return { ok: false, errors: unknown, points: null, chunks: null, estimate: null, quota: null, sample: null };
    const c = checked.compiled;
    const quota = this.quotas.verdict(user.id, user.role, c.totalPoints);
    const kernelRate = this.measureKernel(c);
    const seconds = c.totalPoints / kernelRate + c.totalPoints / this.persistRate;
    const sample = c.totalPoints > 0 ? c.evaluatePointAt(0) : null;
    return {
      ok: quota.allowed,
      errors: [] as ErrorDetail[],
      points: c.totalPoints,
      chunks: Math.ceil(c.totalPoints / this.config.chunkSize),
      estimate: {
        seconds,
        kernelPointsPerSecond: Math.round(kernelRate),
        persistRowsPerSecond: Math.round(this.persistRate),
      },
      quota,
      columns: c.columns,
      sample,
    };
  }

  /** Times the kernel on this very sweep (a few thousand points at most). */
  private measureKernel(c: CompiledSweep): number {
    const n = Math.min(2000, c.totalPoints);
    if (n === 0) return 1e6;
    const t0 = performance.now();
    c.evaluateChunk(0, n);
    const ms = Math.max(performance.now() - t0, 0.05);
    return (n / ms) * 1000;
  }

  /**
   * Submits a sweep. `enforceQuota: false` is for the demo seed only: it submits several example
   * sweeps at once on behalf of the demo researcher, which a user's own submissions may not.
   */
  async create(user: AuthUser, raw: unknown, opts: { enforceQuota?: boolean } = {}): Promise<SweepCreatedView> {
    const checked = checkSweep(raw);
    if (!checked.ok) throw new ValidationError(summariseSweepErrors(checked.errors), checked.errors);
    // The raw body is stored as the definition, so nothing unchecked may ride along in it.
    const unknown = unknownKeys(raw, checked.compiled.definition);
    if (unknown.length)
      throw new ValidationError(`Invalid sweep definition: ${unknown[0].path}: ${unknown[0].message}`, unknown);
    const c = checked.compiled;
    if (c.totalPoints < 1)
      throw new ValidationError('The sweep has no points', [{ path: 'axes', message: 'at least one point is needed' }]);
    const layout = layoutColumns(c.columns);
    const chunks = planChunks(c.totalPoints, this.config.chunkSize);
    const now = this.clock.now();
    const d = c.definition;
    // Quota check and insert in one synchronous transaction: concurrent submits cannot both pass.
    const row = this.tx.run(() => {
      if (opts.enforceQuota !== false) this.quotas.assertAllowed(user.id, user.role, c.totalPoints);
      const inserted = this.repo.insert(
        {
          ownerId: user.id,
          name: d.name,
          model: d.model,
          modelVersion: c.model.version,
          appVersion: this.config.appVersion,
          status: 'queued',
          definition: JSON.stringify(raw),
          columns: JSON.stringify(layout),
          visibility: d.visibility ?? 'private',
          points: c.totalPoints,
          chunkCount: chunks.length,
          createdAt: now,
        },
        d.tags ?? [],
        chunks,
        now,
      );
      this.quotas.charge(user.id, inserted.id, inserted.points);
      return inserted;
    });
    await this.dispatcher.enqueue(row);
    return { id: row.id, status: row.status, points: row.points };
  }

  get(user: AuthUser, id: number) {
    return this.present(this.access.readable(user, id));
  }

  present(s: SweepRow) {
    const owner = this.users.findById(s.ownerId);
    this.learnPersistRate(s);
    return presentSweep(s, {
      tags: this.repo.tags(s.id),
      owner: { id: s.ownerId, name: owner?.name ?? 'unknown', email: owner?.email ?? '' },
      workers: this.repo.workerSummary(s.id),
      sharedWith: this.repo.sharedWith(s.id),
    });
  }

  private learnPersistRate(s: SweepRow): void {
    if (s.status !== 'completed' || !s.startedAt || !s.finishedAt || s.points < 50_000) return;
    const rate = s.points / Math.max((s.finishedAt - s.startedAt) / 1000, 0.001);
    this.persistRate = 0.5 * this.persistRate + 0.5 * rate;
  }

  async cancel(user: AuthUser, id: number) {
    const s = this.access.manageable(user, id);
    const now = this.clock.now();
    const pending = this.tx.run(() => {
      if (!this.repo.transition(id, [...ACTIVE_STATES, 'draft'], { status: 'cancelled', finishedAt: now })) {
        throw new ConflictError(`Sweep ${id} is ${s.status}; only queued or running sweeps can be cancelled`);
      }
      const open = this.repo.chunks(id, ACTIVE_STATES).map((c) => c.chunkIndex);
      this.repo.setChunkStates(id, ACTIVE_STATES, 'cancelled', now);
      return open;
    });
    await this.dispatcher.withdraw(id, pending);
    return this.get(user, id);
  }

  async remove(user: AuthUser, id: number): Promise<void> {
    const s = this.access.manageable(user, id);
    if (s.status === 'archived') throw new ConflictError(`Sweep ${id} is archived and cannot be deleted`);
    let pending: number[] = [];
    if (s.status === 'queued' || s.status === 'running') {
      pending = this.repo.chunks(id, ACTIVE_STATES).map((c) => c.chunkIndex);
    }
    this.repo.delete(id);
    await this.dispatcher.withdraw(id, pending);
  }
}
