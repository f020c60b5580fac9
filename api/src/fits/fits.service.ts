import { Inject, Injectable, Logger, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import {
  NotFoundError,
  ValidationError,
  fitModel,
  type DomainError,
  type FitCreatedView,
  type FitRequest,
  type FitResult,
  type FitView,
  type PageOf,
} from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { buildStoredResult, engineInput, probeWindow, type StoredFitResult } from './fit-result.js';
import { FitRunner } from './fit-runner.js';
import { FitSources, type FitData, type SourceKind } from './fit-sources.js';
import type { FitListQuery } from './dto/fit.dto.js';
import { FitsRepository, type FitRow } from './fits.repository.js';

/** From this many points on, a fit is queued and answered with 202 (issue 6: "long fits"). */
export const QUEUED_FIT_POINTS = 100_000;

/**
 * Progress of a queued fit, by stage (the engine reports no per-iteration progress): the data were
 * read during the request, the fit runs, the result is stored.
 */
const PROGRESS = { queued: 0.05, running: 0.1, fitted: 0.95, done: 1 } as const;

const INTERRUPTED = 'The server stopped before this fit finished; run it again.';

function parseSourceId(raw: string): number {
  const id = Number(raw);
  if (!/^\d+$/.test(raw) || !Number.isSafeInteger(id) || id < 1) {
    throw new ValidationError(`source.id: must be a positive integer, got "${raw.slice(0, 32)}"`, [
      { path: 'source.id', message: 'must be a positive integer' },
    ]);
  }
  return id;
}

@Injectable()
export class FitsService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('Fits');
  private readonly pending = new Set<Promise<void>>();
  private closing = false;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly repo: FitsRepository,
    private readonly sources: FitSources,
    private readonly runner: FitRunner,
    private readonly clock: Clock,
  ) {}

  /** A fit left queued or running by a stopped process is marked failed (its data lived in memory). */
  onApplicationBootstrap(): void {
    for (const f of this.repo.unfinished()) {
      this.repo.update(f.id, { status: 'failed', error: INTERRUPTED, finishedAt: this.clock.now() });
    }
  }

  async onModuleDestroy(): Promise<void> {
    this.closing = true;
    await this.runner.close();
    await Promise.allSettled([...this.pending]);
  }

  /** Runs a fit (or queues it when long) and stores it with its request, versions and owner. */
  async create(user: AuthUser, req: FitRequest): Promise<{ status: 201 | 202; body: FitCreatedView }> {
    const kind = req.source.kind as SourceKind;
    const sourceId = parseSourceId(req.source.id);
    const { data, region } = probeWindow(req, await this.sources.load(user, kind, sourceId, req));
    if (data.n === 0) {
      throw new ValidationError(
        `y: too few points: no rows left after the filter${data.dropped ? ` and dropping ${data.dropped} row(s) with a missing value` : ''}`,
        [{ path: 'y', message: 'no points to fit' }],
      );
    }
    const { input, flipped } = engineInput(req, data);
    const storedRequest = { ...req, source: { kind, id: sourceId } };
    const base = {
      ownerId: user.id,
      sourceKind: kind,
      sourceId,
      model: req.model,
      request: JSON.stringify(storedRequest),
      appVersion: this.config.appVersion,
      sourceModelVersion: data.source.modelVersion,
      createdAt: this.clock.now(),
    };
    if (data.n >= QUEUED_FIT_POINTS) {
      const row = this.repo.insert({ ...base, status: 'queued', progress: PROGRESS.queued });
      this.track(this.runQueued(row.id, req, data, input, flipped, region));
      return {
        status: 202,
        body: { id: row.id, status: 'queued', progress: PROGRESS.queued, n: data.n, dropped: data.dropped },
      };
    }
    // Validation errors of the engine (too few points, singular, bad expression) are 400s and store nothing.
    const result = fitModel(input);
    const stored = buildStoredResult(req, data, result, flipped, region);
    const row = this.repo.insert({
      ...base,
      ...this.outcome(result, stored),
      progress: PROGRESS.done,
      finishedAt: this.clock.now(),
    });
    return { status: 201, body: this.present(row, true) };
  }

  private outcome(result: FitResult, stored: StoredFitResult) {
    return result.converged
      ? { status: 'completed' as const, result: JSON.stringify(stored), error: null }
      : { status: 'failed' as const, result: JSON.stringify(stored), error: `Did not converge: ${result.message}` };
  }

  private track(p: Promise<void>): void {
    this.pending.add(p);
    void p.finally(() => this.pending.delete(p));
  }

  private async runQueued(
    id: number,
    req: FitRequest,
    data: FitData,
    input: ReturnType<typeof engineInput>['input'],
    flipped: boolean,
    region: StoredFitResult['region'],
  ): Promise<void> {
    try {
      await new Promise<void>((r) => setImmediate(r));
      this.repo.update(id, { status: 'running', progress: PROGRESS.running });
      const result = await this.runner.run(input);
      this.repo.update(id, { progress: PROGRESS.fitted });
      const stored = buildStoredResult(req, data, result, flipped, region);
      this.repo.update(id, { ...this.outcome(result, stored), progress: PROGRESS.done, finishedAt: this.clock.now() });
    } catch (e) {
      const err = e as DomainError;
      const message =
        err instanceof ValidationError
          ? err.message
          : this.closing
            ? INTERRUPTED
            : 'The fit stopped with an internal error';
      if (!(err instanceof ValidationError) && !this.closing)
        this.logger.error(`fit ${id}: ${err?.stack ?? String(err)}`);
      try {
        this.repo.update(id, {
          status: 'failed',
          error: message,
          progress: PROGRESS.done,
          finishedAt: this.clock.now(),
        });
      } catch {
        // the database closed under us at shutdown; bootstrap marks the fit interrupted next time
      }
    }
  }

  /** A fit the user may see (same visibility as its source); 404 otherwise. */
  get(user: AuthUser, id: number) {
    const row = this.repo.findById(id);
    if (!row || !this.sourceReadable(user, row)) throw new NotFoundError(`Fit ${id} not found`);
    return this.present(row, true);
  }

  list(user: AuthUser, q: FitListQuery): PageOf<FitView> {
    const { items, total } = this.repo.list(user, q);
    return { items: items.map((r) => this.present(r, false)), total, page: q.page, pageSize: q.pageSize };
  }

  /**
   * Every finished fit of a source in the full shape, for a sweep's export (the caller has already
   * checked that the user may read the source).
   */
  forSource(kind: SourceKind, id: number) {
    return this.repo
      .ofSource(kind, id)
      .filter((r) => r.status === 'completed' || r.status === 'failed')
      .map((r) => this.present(r, true));
  }

  private sourceReadable(user: AuthUser, row: FitRow): boolean {
    return this.repo.list(user, { page: 1, pageSize: 1, sourceKind: row.sourceKind, sourceId: row.sourceId }).total > 0;
  }

  /** The SPEC §6 fit shape; the list leaves out the plot arrays and the covariance. */
  present(row: FitRow, full: boolean): FitView {
    const result = row.result ? (JSON.parse(row.result) as StoredFitResult) : null;
    const request = JSON.parse(row.request) as FitView['request'];
    const { plot, covariance, ...summary } = result ?? ({} as Partial<StoredFitResult>);
    return {
      id: row.id,
      status: row.status as FitView['status'],
      progress: row.progress,
      model: row.model as FitView['model'],
      source: { kind: row.sourceKind, id: row.sourceId, name: this.repo.sourceName(row.sourceKind, row.sourceId) },
      y: request.y,
      x: request.x,
      request,
      ...(result ? summary : {}),
      ...(full && result ? { plot, covariance } : {}),
      error: row.error,
      modelVersion: row.sourceModelVersion,
      appVersion: row.appVersion,
      owner: { id: row.ownerId, name: this.repo.userName(row.ownerId) },
      createdAt: new Date(row.createdAt).toISOString(),
      finishedAt: row.finishedAt ? new Date(row.finishedAt).toISOString() : null,
    };
  }
}
