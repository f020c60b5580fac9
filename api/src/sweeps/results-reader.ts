import { Inject, Injectable } from '@nestjs/common';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import { compileFilter, compileSort, columnByName, parseFilter, selectList } from './results-query.js';
import type { StoredColumn } from './sweep-layout.js';
import type { SweepRow } from './sweeps.repository.js';

export function layoutOf(s: SweepRow): StoredColumn[] {
  return JSON.parse(s.columns) as StoredColumn[];
}

/**
 * Reads stored results: pages for tables, whole columns for fits. Every read finishes synchronously:
 * an open better-sqlite3 iterator would block writes on the shared connection (exports read in batches).
 */
@Injectable()
export class ResultsReader {
  constructor(@Inject(DB_HANDLE) private readonly handle: OpenedDatabase) {}

  page(s: SweepRow, q: { page: number; pageSize: number; sort?: unknown; filter?: unknown }) {
    const layout = layoutOf(s);
    const filter = parseFilter(q.filter, layout);
    const { where, params } = compileFilter(s.id, layout, filter);
    const order = compileSort(layout, q.sort);
    const db = this.handle.sqlite;
    const rows = db
      .prepare(`SELECT ${selectList(s.id, layout)} FROM results WHERE ${where} ORDER BY ${order} LIMIT ? OFFSET ?`)
      .all(...params, q.pageSize, (q.page - 1) * q.pageSize) as Record<string, number | null>[];
    const total = Object.keys(filter).length
      ? (db.prepare(`SELECT COUNT(*) AS n FROM results WHERE ${where}`).get(...params) as { n: number }).n
      : s.pointsDone;
    for (const r of rows)
      for (const c of layout)
        if (c.type === 'boolean' && r[c.name] !== null) (r as Record<string, unknown>)[c.name] = r[c.name] === 1;
    return {
      rows,
      total,
      columns: layout.map((c) => ({ name: c.name, unit: c.unit, kind: c.kind, meaning: c.meaning, type: c.type })),
    };
  }

  /** Whole numeric columns of the (filtered) rows, in index order: the input of fits and plots. */
  columns(
    s: SweepRow,
    names: string[],
    filterRaw?: unknown,
    limit?: number,
  ): { n: number; data: Record<string, Float64Array> } {
    const layout = layoutOf(s);
    const cols = names.map((n, i) => columnByName(layout, n, `columns.${i}`));
    const { where, params } = compileFilter(s.id, layout, parseFilter(filterRaw, layout));
    const sel = cols
      .map((c, i) => (c.kind === 'index' ? `(id - ${s.id * 2 ** 32}) AS v${i}` : `${c.slot} AS v${i}`))
      .join(', ');
    const stmt = this.handle.sqlite
      .prepare(`SELECT ${sel} FROM results WHERE ${where} ORDER BY id${limit ? ' LIMIT ' + Math.floor(limit) : ''}`)
      .raw(true);
    const chunks: number[][] = cols.map(() => []);
    for (const row of stmt.iterate(...params) as IterableIterator<(number | null)[]>) {
      for (let i = 0; i < row.length; i++) chunks[i].push(row[i] ?? NaN);
    }
    const data: Record<string, Float64Array> = {};
    names.forEach((n, i) => (data[n] = Float64Array.from(chunks[i])));
    return { n: chunks[0]?.length ?? 0, data };
  }
}
