import type Database from 'better-sqlite3';
import { rowRange, ROW_SPAN } from '../sweeps/sweep-layout.js';

/**
 * The one read behind the sensitivity report: a single stored column by point index. It selects only
 * the rowid and that column's slot (raw rows, no objects per row) and writes straight into a typed
 * array, so a sweep of N·(d + 2) points costs one pass and 8 bytes a point. A plain class over a
 * connection: it runs on a heavy-read pool thread's read-only connection (api/src/reads/read-tasks.ts).
 */
export class SensitivityRepository {
  constructor(private readonly db: Database.Database) {}

  /** values[p] = the column at point p; NaN where the point is not stored yet or the value is NULL. */
  columnByIndex(sweepId: number, slot: string, points: number): Float64Array {
    if (!/^c\d+$/.test(slot)) throw new RangeError(`not a value slot: ${slot}`);
    const values = new Float64Array(points).fill(Number.NaN);
    const { lo, hi } = rowRange(sweepId);
    const base = sweepId * ROW_SPAN;
    const stmt = this.db.prepare(`SELECT id - ${base}, ${slot} FROM results WHERE id BETWEEN ? AND ?`).raw(true);
    for (const row of stmt.iterate(lo, hi) as IterableIterator<[number, number | null]>) {
      const p = row[0];
      if (p < points && row[1] !== null) values[p] = row[1];
    }
    return values;
  }
}
