import { Inject, Injectable } from '@nestjs/common';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import { HeavyReads } from '../reads/heavy-reads.js';
import { OrderCache, orderKey } from '../reads/order-cache.js';
import { shapeRows } from '../reads/read-tasks.js';
import { columnByName, parseSort, type ResultFilter } from './results-query.js';
import { ResultsRepository, type ResultRow } from './results.repository.js';
import { layoutOf } from './sweep-layout.js';
import type { SweepRow } from './sweeps.repository.js';

export { layoutOf };

/** Sweeps whose stored rows no longer change (their sorted orders may be cached). */
const SETTLED = new Set(['completed', 'archived', 'failed', 'cancelled']);

export interface ResultsPageQuery {
  page: number;
  pageSize: number;
  sort?: string;
  filter: ResultFilter;
}

/**
 * Reads stored results for tables, plots and fits. What is cheap is read here on the api's
 * connection: a page of a complete sweep in index order (a rowid range) and any page of a sorted view
 * whose order is cached (a few rowid look-ups). Everything else — a sort computed for the first time,
 * filters, whole columns — goes to the heavy-read pool, bounded in time and per user (api/src/reads).
 */
@Injectable()
export class ResultsReader {
  private readonly repo: ResultsRepository;

  constructor(
    @Inject(DB_HANDLE) handle: OpenedDatabase,
    private readonly reads: HeavyReads,
    private readonly orders: OrderCache,
  ) {
    this.repo = new ResultsRepository(handle.sqlite);
  }

  async page(userId: number, s: SweepRow, q: ResultsPageQuery, signal?: AbortSignal) {
    const layout = layoutOf(s);
    const spec = parseSort(layout, q.sort); // a bad sort is a 400 before any work
    const columns = layout.map((c) => ({ name: c.name, unit: c.unit, kind: c.kind, meaning: c.meaning, type: c.type }));
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
    if (cached) {
      const rows = this.repo.rowsAt(s.id, layout, cached.subarray(offset, offset + q.pageSize));
      return { rows: shapeRows(rows, layout), total: cached.length, columns };
    }
    const r = await this.reads.run(userId, { kind: 'page', sweep: s, ...q }, { signal });
    if (key && r.order) this.orders.set(key, r.order);
    return { rows: r.rows as ResultRow[], total: r.total, columns };
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
