import type Database from 'better-sqlite3';
import {
  DomainError,
  type ErrorDetail,
  type HeatmapSeries,
  type LineSeries,
  type ResultRowView,
  type SensitivityReport,
  type SeriesQuery,
} from '@driftgrid/domain';
import { SeriesRepository } from '../catalogue/series.repository.js';
import { SeriesService } from '../catalogue/series.service.js';
import { DatasetRowsRepository } from '../datasets/dataset-rows.repository.js';
import { formatBatch } from '../export/csv-format.js';
import type { OpenedDatabase } from '../db/database.js';
import { sensitivityReport, type SensitivityInputs } from '../sensitivity/sensitivity-report.js';
import { SensitivityRepository } from '../sensitivity/sensitivity.repository.js';
import { compileFilter, compileSort, parseSort, type ResultFilter } from '../sweeps/results-query.js';
import { ResultsRepository, type ResultRow } from '../sweeps/results.repository.js';
import { layoutOf, type StoredColumn } from '../sweeps/sweep-layout.js';
import type { SweepRow } from '../sweeps/sweeps.repository.js';
import { OrderBuilder } from './sort-order.js';

const UTF8 = new TextEncoder();

/** Pages of a sorted view read ahead with its first page (the top-k pass costs about the same). */
const LEAD_PAGES = 20;
/** At most this many leading indices read ahead (40 kB), however large the page size. */
const LEAD_MAX = 10_000;

/**
 * The heavy reads, as plain data in and out so they can run on a pool thread with its own read-only
 * connection (or inline on the api's own connection). Inputs are validated on the api thread first.
 */
export interface PageTask {
  kind: 'page';
  sweep: SweepRow;
  page: number;
  pageSize: number;
  sort?: string;
  filter: ResultFilter;
}
export interface PageResult {
  rows: ResultRowView[];
  total: number;
  /**
   * For a sorted page answered by SQL: the view's leading point indices (this page and the next few),
   * which the api caches so the following pages are look-ups.
   */
  lead?: Uint32Array;
}
/** The whole order of a sorted view (point indices), for the api's order cache. */
export interface OrderTask {
  kind: 'order';
  sweep: SweepRow;
  sort: string;
  filter: ResultFilter;
}
export interface SeriesTask {
  kind: 'series';
  sweep: SweepRow;
  query: SeriesQuery;
}
export interface ColumnsTask {
  kind: 'columns';
  sweep: SweepRow;
  names: string[];
  filter: ResultFilter;
  limit?: number;
}
export interface ColumnsResult {
  n: number;
  data: Record<string, Float64Array>;
}
/** One output column of a Saltelli-design sweep and its Sobol indices (column read + bootstrap). */
export interface SensitivityTask {
  kind: 'sensitivity';
  sweepId: number;
  /** The column's stored slot (c<n>), resolved and checked on the api thread. */
  slot: string;
  params: SensitivityInputs;
}
/** Numeric cells of a dataset's columns (positions `cells`), in row order: fit sources and overlays. */
export interface DatasetColumnsTask {
  kind: 'datasetColumns';
  datasetId: number;
  cells: number[];
  rows: number;
}
export interface DatasetColumnsResult {
  n: number;
  columns: Float64Array[];
}
/**
 * One batch of a sweep's CSV export: rows after point index `after` (−1 for the first), read and
 * formatted on the thread; the api thread only hashes, compresses and sends the text.
 */
export interface ExportBatchTask {
  kind: 'exportBatch';
  sweep: SweepRow;
  after: number;
  limit: number;
}
export interface ExportBatchResult {
  /** The batch's CSV lines, UTF-8 encoded on the thread (moved to the api thread, not copied). */
  bytes: Uint8Array;
  rows: number;
  /** Where the next batch starts; null once the sweep's rows are exhausted. */
  next: number | null;
}
/** Test-only task: holds its thread for `ms` (checks of the budget, the limits and cancellation). */
export interface SleepTask {
  kind: 'sleep';
  ms: number;
}

export type ReadTask =
  PageTask | OrderTask | SeriesTask | ColumnsTask | DatasetColumnsTask | SensitivityTask | ExportBatchTask | SleepTask;
export interface ReadResults {
  page: PageResult;
  order: Uint32Array;
  series: LineSeries | HeatmapSeries;
  columns: ColumnsResult;
  sensitivity: SensitivityReport;
  exportBatch: ExportBatchResult;
  datasetColumns: DatasetColumnsResult;
  sleep: { slept: number };
}
export type ReadResultOf<T extends ReadTask> = ReadResults[T['kind']];

/** What crosses the thread boundary: a value, or a domain error by name (Error objects lose their class). */
export type ReadReply =
  { ok: true; value: unknown } | { ok: false; error: { name: string; message: string; details?: ErrorDetail[] } };

/** Runs read tasks on one connection; SQL stays in the repositories. */
export class ReadTaskRunner {
  private readonly results: ResultsRepository;
  private readonly series: SeriesService;
  private readonly sensitivity: SensitivityRepository;
  private readonly datasets: DatasetRowsRepository;

  constructor(db: Database.Database) {
    this.results = new ResultsRepository(db);
    this.datasets = new DatasetRowsRepository(db);
    this.sensitivity = new SensitivityRepository(db);
    this.series = new SeriesService(new SeriesRepository({ sqlite: db } as OpenedDatabase));
  }

  run(task: ReadTask): ReadReply {
    try {
      return { ok: true, value: this.dispatch(task) };
    } catch (e) {
      if (e instanceof DomainError)
        return { ok: false, error: { name: e.name, message: e.message, details: e.details } };
      throw e;
    }
  }

  private dispatch(task: ReadTask): unknown {
    switch (task.kind) {
      case 'page':
        return this.page(task);
      case 'order': {
        const layout = layoutOf(task.sweep);
        const spec = parseSort(layout, task.sort);
        if (!spec || spec.column.kind === 'index') throw new Error('an order task needs a value column');
        return this.order(task.sweep.id, spec.column, spec.desc, compileFilter(task.sweep.id, layout, task.filter));
      }
      case 'series':
        return this.series.series(task.sweep, task.query);
      case 'columns':
        return this.columns(task);
      case 'sensitivity':
        return sensitivityReport(
          this.sensitivity.columnByIndex(task.sweepId, task.slot, task.params.points),
          task.params,
        );
      case 'exportBatch':
        return this.exportBatch(task);
      case 'datasetColumns':
        return this.datasets.numericColumns(task.datasetId, task.cells, task.rows);
      case 'sleep': {
        const until = Date.now() + task.ms;
        while (Date.now() < until) {
          /* busy on purpose: a stand-in for a long statement */
        }
        return { slept: task.ms };
      }
    }
  }

  private page(t: PageTask): PageResult {
    const s = t.sweep;
    const layout = layoutOf(s);
    const q = compileFilter(s.id, layout, t.filter);
    const spec = parseSort(layout, t.sort);
    const offset = (t.page - 1) * t.pageSize;
    const filtered = Object.keys(t.filter).length > 0;
    if (!spec || spec.column.kind === 'index') {
      const rows = this.results.pageByIndex(s.id, layout, q, spec?.desc ?? false, t.pageSize, offset);
      return { rows: shapeRows(rows, layout), total: filtered ? this.results.count(q) : s.pointsDone };
    }
    // No order at hand: one top-k pass of SQLite (same rules as the whole order: NULLs last, ties by
    // rowid) answers this page and the view's next few pages at about the same cost; the api caches
    // that lead and builds the whole order in the background for deeper pages.
    const depth = Math.max(offset + t.pageSize, Math.min(LEAD_MAX, offset + t.pageSize * LEAD_PAGES));
    const lead = this.results.sortedIndices(s.id, q, compileSort(layout, t.sort), depth);
    const rows = this.results.rowsAt(s.id, layout, lead.subarray(offset, offset + t.pageSize));
    return { rows: shapeRows(rows, layout), total: filtered ? this.results.count(q) : s.pointsDone, lead };
  }

  private exportBatch(t: ExportBatchTask): ExportBatchResult {
    const layout = layoutOf(t.sweep);
    const booleans = layout.flatMap((c, j) => (c.type === 'boolean' ? [j] : []));
    const { rows, last } = this.results.exportBatch(t.sweep.id, layout, t.after, t.limit);
    const bytes = UTF8.encode(formatBatch(rows, booleans));
    return { bytes, rows: rows.length, next: rows.length < t.limit ? null : last };
  }

  private order(sweepId: number, column: StoredColumn, desc: boolean, q: ReturnType<typeof compileFilter>) {
    const b = new OrderBuilder(1 << 16);
    for (const { idx, values } of this.results.scanColumn(sweepId, column.slot, q))
      for (let k = 0; k < idx.length; k++) b.push(idx[k]!, values[k]!);
    return b.sort(desc);
  }

  private columns(t: ColumnsTask): ColumnsResult {
    const s = t.sweep;
    const layout = layoutOf(s);
    const exprs = t.names.map((n) => {
      const c = layout.find((x) => x.name === n)!;
      return c.kind === 'index' ? `(id - ${s.id * 2 ** 32})` : c.slot;
    });
    const cols = this.results.columns(exprs, compileFilter(s.id, layout, t.filter), t.limit);
    const data: Record<string, Float64Array> = {};
    t.names.forEach((n, i) => (data[n] = cols[i]!));
    return { n: cols[0]?.length ?? 0, data };
  }
}

/**
 * Boolean columns are stored as 0/1 and answered as true/false. JSON has no ±Infinity or NaN, so
 * numeric values that are not finite are answered as the strings "Infinity" and "-Infinity", and
 * NULL (how SQLite keeps NaN) as "NaN": the three stay distinguishable (README: results and exports).
 */
export function shapeRows(rows: ResultRow[], layout: readonly StoredColumn[]): ResultRowView[] {
  const bools = layout.filter((c) => c.type === 'boolean');
  const numbers = layout.filter((c) => c.type !== 'boolean');
  for (const r of rows) {
    const out = r as ResultRowView;
    for (const c of bools) if (r[c.name] !== null) out[c.name] = r[c.name] === 1;
    for (const c of numbers) {
      if (!(c.name in r)) continue;
      const v = r[c.name];
      if (v === null) out[c.name] = 'NaN';
      else if (v === Infinity) out[c.name] = 'Infinity';
      else if (v === -Infinity) out[c.name] = '-Infinity';
    }
  }
  return rows as ResultRowView[];
}
