import type Database from 'better-sqlite3';
import { inTransaction } from '../db/transactions.js';
import type { CompiledQuery } from './results-query.js';
import { selectList } from './results-query.js';
import { ROW_SPAN, type StoredColumn } from './sweep-layout.js';

export type ResultRow = Record<string, number | null>;
type Raw = (number | null)[];

/** Rows per keyset batch when a whole column is scanned (the read thread can be ended between batches). */
const SCAN_BATCH = 32_768;

/**
 * SQL of the results table. A plain class over a better-sqlite3 connection, so the same statements
 * run on the api's connection (cheap reads) and on the read pool's read-only connections (heavy reads).
 */
export class ResultsRepository {
  /** Prepared statements by SQL text (a sweep's SELECT list has up to 66 columns; preparing costs ~1 ms). */
  private readonly statements = new Map<string, Database.Statement>();

  constructor(private readonly db: Database.Database) {}

  private prepare(sql: string): Database.Statement {
    let stmt = this.statements.get(sql);
    if (!stmt) {
      if (this.statements.size >= 128) this.statements.delete(this.statements.keys().next().value!);
      stmt = this.db.prepare(sql);
      this.statements.set(sql, stmt);
    }
    return stmt;
  }

  /** Rows at the given point indices, returned in the order asked. */
  rowsAt(sweepId: number, layout: readonly StoredColumn[], indices: ArrayLike<number>): ResultRow[] {
    if (indices.length === 0) return [];
    const base = sweepId * ROW_SPAN;
    const rows = this.prepare(
      `SELECT (id - ${base}) AS "__i", ${selectList(sweepId, layout)} FROM results
         WHERE id IN (SELECT ${base} + value FROM json_each(?))`,
    ).all(JSON.stringify(Array.from(indices))) as (ResultRow & { __i: number })[];
    const at = new Map(rows.map((r) => [r.__i, r]));
    const out: ResultRow[] = [];
    for (const i of Array.from(indices)) {
      const r = at.get(i);
      if (!r) continue;
      delete (r as Partial<typeof r>).__i;
      out.push(r);
    }
    return out;
  }

  /** A page in index order (ascending or descending) of the rows the WHERE keeps. */
  pageByIndex(
    sweepId: number,
    layout: readonly StoredColumn[],
    q: CompiledQuery,
    desc: boolean,
    limit: number,
    offset: number,
  ): ResultRow[] {
    return this.prepare(
      `SELECT ${selectList(sweepId, layout)} FROM results WHERE ${q.where} ORDER BY id ${desc ? 'DESC' : 'ASC'} LIMIT ? OFFSET ?`,
    ).all(...q.params, limit, offset) as ResultRow[];
  }

  /**
   * The first `limit` point indices of a sorted view, by SQLite's own ORDER BY … LIMIT (`orderBy` from
   * compileSort: NULLs last, ties by rowid). Without an index on the slot this is one pass with a bounded
   * top-k sorter, far cheaper than ordering every row; reading only the rowid keeps the sorter small,
   * and the page's rows are then a few rowid look-ups (rowsAt).
   */
  sortedIndices(sweepId: number, q: CompiledQuery, orderBy: string, limit: number): Uint32Array {
    const ids = this.prepare(
      `SELECT id - ${sweepId * ROW_SPAN} FROM results WHERE ${q.where} ORDER BY ${orderBy} LIMIT ?`,
    )
      .pluck(true)
      .all(...q.params, limit) as number[];
    return Uint32Array.from(ids);
  }

  /**
   * One keyset batch of a sweep's rows for an export: rows with point index > `after`, in index order,
   * as arrays in layout order, and the last point index read (where the next batch starts; null at the
   * end). Each batch is its own statement, so no iterator stays open on a connection between batches.
   */
  exportBatch(
    sweepId: number,
    layout: readonly StoredColumn[],
    after: number,
    limit: number,
  ): { rows: (number | null)[][]; last: number | null } {
    const base = sweepId * ROW_SPAN;
    const rows = this.prepare(
      `SELECT id - ${base}, ${selectList(sweepId, layout)} FROM results WHERE id > ? AND id < ? ORDER BY id LIMIT ?`,
    )
      .raw(true)
      .all(base + after, base + ROW_SPAN, limit) as (number | null)[][];
    const last = rows.length ? (rows[rows.length - 1]![0] as number) : null;
    for (const r of rows) r.shift();
    return { rows, last };
  }

  count(q: CompiledQuery): number {
    return (this.prepare(`SELECT COUNT(*) AS n FROM results WHERE ${q.where}`).get(...q.params) as { n: number }).n;
  }

  /**
   * Point indices and values of one column for the rows the WHERE keeps, in index order, in keyset
   * batches (the read thread can be ended between them). `expr` is a whitelisted slot expression.
   * Each batch bounds the rowid from below itself (`id > last`), never through the sweep's BETWEEN:
   * SQLite takes one range per scan, and with BETWEEN every batch would start again at the sweep's
   * first row. Two single-column reads (pluck) allocate far less than one of [id, value] arrays.
   */
  *scanColumn(
    sweepId: number,
    expr: string,
    q: CompiledQuery,
  ): Generator<{ idx: number[]; values: (number | null)[] }> {
    const range = /^id BETWEEN \? AND \?/;
    if (!range.test(q.where)) throw new Error('scanColumn expects a WHERE built by compileFilter');
    const filter = q.where.replace(range, '');
    const filterParams = q.params.slice(2);
    const hi = q.params[1] as number;
    const base = sweepId * ROW_SPAN;
    const sql = (what: string) =>
      `SELECT ${what} FROM results WHERE id > ? AND id <= ?${filter} ORDER BY id LIMIT ${SCAN_BATCH}`;
    const ids = this.prepare(sql('id')).pluck(true);
    const vals = this.prepare(sql(expr)).pluck(true);
    let after = base - 1;
    for (;;) {
      // Both reads in one read transaction: the same snapshot even while a running sweep is written.
      const [idx, values] = inTransaction(this.db, () => [
        ids.all(after, hi, ...filterParams) as number[],
        vals.all(after, hi, ...filterParams) as (number | null)[],
      ]) as [number[], (number | null)[]];
      if (idx.length === 0) return;
      after = idx[idx.length - 1]!;
      for (let i = 0; i < idx.length; i++) idx[i] = idx[i]! - base;
      yield { idx, values };
      if (idx.length < SCAN_BATCH) return;
    }
  }

  /** Whole columns (`exprs`, whitelisted) of the rows the WHERE keeps, in index order; NULL reads as NaN. */
  columns(exprs: readonly string[], q: CompiledQuery, limit?: number): Float64Array[] {
    const sel = exprs.map((e, i) => `${e} AS v${i}`).join(', ');
    const stmt = this.prepare(
      `SELECT ${sel} FROM results WHERE ${q.where} ORDER BY id${limit ? ' LIMIT ' + Math.floor(limit) : ''}`,
    ).raw(true);
    const chunks: number[][] = exprs.map(() => []);
    for (const row of stmt.iterate(...q.params) as IterableIterator<Raw>) {
      for (let i = 0; i < row.length; i++) chunks[i]!.push(row[i] ?? NaN);
    }
    return chunks.map((c) => Float64Array.from(c));
  }
}
