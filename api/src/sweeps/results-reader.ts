import { Inject, Injectable, Logger } from '@nestjs/common';
import { SETTLED_STATES } from '@driftgrid/domain';
import type { ResultsPage } from '@driftgrid/domain';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import { HeavyReads } from '../reads/heavy-reads.js';
import { covers, OrderCache, orderKey } from '../reads/order-cache.js';
import { shapeRows, type OrderTask } from '../reads/read-tasks.js';
import { columnByName, parseSort, type ResultFilter } from './results-query.js';
import { ResultsRepository } from './results.repository.js';
import { columnViews, layoutOf } from './sweep-layout.js';
import type { SweepRow } from './sweeps.repository.js';

export { layoutOf };

/** Sweeps whose stored rows no longer change (their sorted orders may be cached). */
const SETTLED = new Set<string>(SETTLED_STATES);

/**
 * Whole orders built in the background at once (each holds one pool thread): the rest of the pool stays
 * free for the pages users wait for. A view asked for while the builder is full is built on a later ask.
 */
const MAX_BACKGROUND_BUILDS = 1;
/** The per-user slot key of background builds (no user has a negative id), so they never take a user's slot. */
const BACKGROUND_USER = -1;

export interface ResultsPageQuery {
  page: number;
  pageSize: number;
  sort?: string;
  filter: ResultFilter;
}

/**
 * Reads stored results for tables, plots and fits. What is cheap is read here on the api's
 * connection: a page of a complete sweep in index order (a rowid range) and any page of a sorted view
 * whose order is cached (a few rowid look-ups). Everything else — filters, whole columns, a page of a
 * sorted view whose order is not cached yet (SQLite's ORDER BY … LIMIT on a pool thread) — goes to the
 * heavy-read pool, bounded in time and per user (api/src/reads). After such a page, the view's whole
 * order is built in the background on the pool (once per view, a bounded number at a time) and cached,
 * so later pages are look-ups.
 */
@Injectable()
export class ResultsReader {
  private readonly logger = new Logger('ResultsReader');
  private readonly repo: ResultsRepository;
  /** Background order builds in progress, by order-cache key (one per view at most). */
  private readonly building = new Map<string, Promise<void>>();

  constructor(
    @Inject(DB_HANDLE) handle: OpenedDatabase,
    private readonly reads: HeavyReads,
    private readonly orders: OrderCache,
  ) {
    this.repo = new ResultsRepository(handle.sqlite);
  }

  async page(userId: number, s: SweepRow, q: ResultsPageQuery, signal?: AbortSignal): Promise<ResultsPage> {
    const layout = layoutOf(s);
    const spec = parseSort(layout, q.sort); // a bad sort is a 400 before any work
    const columns = columnViews(layout);
    const offset = (q.page - 1) * q.pageSize;
    const filtered = Object.keys(q.filter).length > 0;
    const byIndex = !spec || spec.column.kind === 'index';
    if (!filtered && byIndex && s.status !== 'running' && s.status !== 'queued' && s.pointsDone === s.points) {
      // Every index 0…points−1 is stored: the page is a rowid range.
      const n = Math.max(0, Math.min(q.pageSize, s.points - offset));
      const indices = Array.from({ length: n }, (_, k) => (spec?.desc ? s.points - 1 - offset - k : offset + k));
      return { rows: shapeRows(this.repo.rowsAt(s.id, layout, indices), layout), total: s.pointsDone, columns };
    }
    const key = !byIndex && SETTLED.has(s.status) ? orderKey(s, spec.column.name, spec.desc, q.filter) : null;
    const cached = key ? this.orders.get(key) : undefined;
    if (cached && covers(cached, offset, q.pageSize)) {
      const rows = this.repo.rowsAt(s.id, layout, cached.order.subarray(offset, offset + q.pageSize));
      return { rows: shapeRows(rows, layout), total: cached.total, columns };
    }
    const r = await this.reads.run(userId, { kind: 'page', sweep: s, ...q }, { signal });
    if (key && r.lead) this.orders.set(key, r.lead, r.total);
    if (key && q.sort) this.buildOrder(key, { kind: 'order', sweep: s, sort: q.sort, filter: q.filter });
    return { rows: r.rows, total: r.total, columns };
  }

  /** Starts building a view's whole order on the pool unless it is cached, under way, or the builder is full. */
  private buildOrder(key: string, task: OrderTask): void {
    const held = this.orders.get(key);
    if (
      (held && held.order.length === held.total) ||
      this.building.has(key) ||
      this.building.size >= MAX_BACKGROUND_BUILDS
    )
      return;
    const done = this.reads
      .run(BACKGROUND_USER, task)
      .then((order) => this.orders.set(key, order))
      // A build that fails (over budget, pool busy) only means later pages are answered by SQL again.
      .catch((e: unknown) => this.logger.debug(`order not cached: ${e instanceof Error ? e.message : String(e)}`))
      .finally(() => this.building.delete(key));
    this.building.set(key, done);
  }

  /** Background order builds still running (tests wait for them; diagnostics). */
  get buildsInProgress(): number {
    return this.building.size;
  }

  /** Whole numeric columns of the (filtered) rows, in index order: the input of fits and plots. */
  columns(
    userId: number,
    s: SweepRow,
    names: string[],
    filter: ResultFilter,
    limit?: number,
    signal?: AbortSignal,
  ): Promise<{ n: number; data: Record<string, Float64Array> }> {
    const layout = layoutOf(s);
    names.forEach((n, i) => columnByName(layout, n, `columns.${i}`));
    return this.reads.run(
      userId,
      { kind: 'columns', sweep: s, names, filter, ...(limit ? { limit } : {}) },
      { signal },
    );
  }
}
