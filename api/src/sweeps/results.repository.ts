import type Database from 'better-sqlite3';
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

  count(q: CompiledQuery): number {
    return (this.prepare(`SELECT COUNT(*) AS n FROM results WHERE ${q.where}`).get(...q.params) as { n: number }).n;
  }

  /**
   * (index, value) of one column for the rows the WHERE keeps, in index order, in keyset batches.
   * `expr` is a whitelisted slot expression.
   */
  *scanColumn(sweepId: number, expr: string, q: CompiledQuery): Generator<Raw[]> {
    const base = sweepId * ROW_SPAN;
    const stmt = this.prepare(`SELECT id, ${expr} FROM results WHERE ${q.where} AND id > ? ORDER BY id LIMIT ?`).raw(
      true,
    );
    let after = base - 1;
    for (;;) {
      const batch = stmt.all(...q.params, after, SCAN_BATCH) as Raw[];
      if (batch.length === 0) return;
      after = batch[batch.length - 1]![0] as number;
      for (const r of batch) r[0] = (r[0] as number) - base;
      yield batch;
      if (batch.length < SCAN_BATCH) return;
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
