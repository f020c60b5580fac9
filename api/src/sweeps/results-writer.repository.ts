import { Inject, Injectable } from '@nestjs/common';
import type { Statement } from 'better-sqlite3';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';

/** Rows per INSERT statement: multi-row VALUES cuts per-statement overhead several-fold. */
const ROWS_PER_STATEMENT = 16;

/**
 * Writes computed rows into `results` (the persistence hot path). Rows are keyed by id, so
 * INSERT OR REPLACE makes a rewrite of the same rows idempotent. Statements are cached by slot list and
 * row count: a sweep's chunks reuse the same one or two statements.
 */
@Injectable()
export class ResultsWriter {
  private readonly statements = new Map<string, Statement>();

  constructor(@Inject(DB_HANDLE) private readonly handle: OpenedDatabase) {}

  /** Rows firstId … firstId + n − 1: flag mask `flags[i]`, slot `slots[c]` = `arrays[c][i]`. Call inside a transaction. */
  writeRows(
    slots: readonly string[],
    firstId: number,
    flags: Uint32Array,
    arrays: readonly Float64Array[],
    n: number,
  ): void {
    const width = slots.length + 2;
    const full = this.insertStatement(slots, ROWS_PER_STATEMENT);
    const params = new Array<unknown>(width * ROWS_PER_STATEMENT);
    let r = 0;
    for (; r + ROWS_PER_STATEMENT <= n; r += ROWS_PER_STATEMENT) {
      for (let k = 0; k < ROWS_PER_STATEMENT; k++) fillRow(params, k * width, firstId + r + k, flags, arrays, r + k);
      full.run(params);
    }
    if (r < n) {
      const rest = n - r;
      const tail = this.insertStatement(slots, rest);
      const tp = new Array<unknown>(width * rest);
      for (let k = 0; k < rest; k++) fillRow(tp, k * width, firstId + r + k, flags, arrays, r + k);
      tail.run(tp);
    }
  }

  /** Removes rows firstId … firstId + n − 1 (a chunk whose sweep went away while its rows were written). */
  deleteRows(firstId: number, n: number): void {
    this.handle.sqlite.prepare('DELETE FROM results WHERE id BETWEEN ? AND ?').run(firstId, firstId + n - 1);
  }

  private insertStatement(slots: readonly string[], rows: number): Statement {
    const key = `${slots.join(',')}|${rows}`;
    let st = this.statements.get(key);
    if (!st) {
      const one = `(${new Array(slots.length + 2).fill('?').join(',')})`;
      st = this.handle.sqlite.prepare(
        `INSERT OR REPLACE INTO results (id, flags, ${slots.join(', ')}) VALUES ${new Array(rows).fill(one).join(',')}`,
      );
      this.statements.set(key, st);
    }
    return st;
  }
}

function fillRow(
  params: unknown[],
  at: number,
  id: number,
  flags: Uint32Array,
  arrays: readonly Float64Array[],
  i: number,
): void {
  params[at] = id;
  params[at + 1] = flags[i];
  for (let c = 0; c < arrays.length; c++) {
    const v = arrays[c][i];
    // SQLite stores ±Infinity as REAL but has no NaN: NaN is stored as NULL (answered as "NaN").
    params[at + 2 + c] = Number.isNaN(v) ? null : v;
  }
}
