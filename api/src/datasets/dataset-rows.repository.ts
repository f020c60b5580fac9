import type Database from 'better-sqlite3';
import { datasetRowRange } from './datasets.repository.js';

/**
 * SQL over a dataset's stored rows for the heavy reads. A plain class over a better-sqlite3 connection,
 * so it runs on the read pool's read-only connections (or inline on the api's). Rows keep their cells
 * as a JSON array; SQLite's json_extract picks the wanted cells without parsing whole rows in JavaScript.
 */
export class DatasetRowsRepository {
  constructor(private readonly db: Database.Database) {}

  /**
   * Cells at positions `cells` of every row, in row order, as numbers (NaN where a cell is empty, text
   * or missing). `rows` is the dataset's row count (sizes the arrays).
   */
  numericColumns(datasetId: number, cells: readonly number[], rows: number): { n: number; columns: Float64Array[] } {
    const { lo, hi } = datasetRowRange(datasetId);
    const picks = cells.map((j) => `json_extract(cells, '$[${Math.trunc(j)}]')`).join(', ');
    const stmt = this.db.prepare(`SELECT ${picks} FROM dataset_rows WHERE id BETWEEN ? AND ? ORDER BY id`).raw(true);
    const columns = cells.map(() => new Float64Array(rows));
    let n = 0;
    for (const row of stmt.iterate(lo, hi) as IterableIterator<unknown[]>) {
      if (n === rows) break;
      for (let k = 0; k < row.length; k++) {
        const v = row[k];
        columns[k]![n] = typeof v === 'number' ? v : NaN;
      }
      n++;
    }
    return { n, columns: n === rows ? columns : columns.map((c) => c.slice(0, n)) };
  }
}
