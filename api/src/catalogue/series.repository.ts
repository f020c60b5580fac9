import { Inject, Injectable } from '@nestjs/common';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';

/**
 * SQL of the plot series. Column expressions come from the sweep's whitelisted layout (slot names or
 * the rowid-derived index), never from the request; values travel as placeholders.
 */
export interface Where {
  where: string;
  params: unknown[];
}

type Row = (number | null)[];

@Injectable()
export class SeriesRepository {
  constructor(@Inject(DB_HANDLE) private readonly handle: OpenedDatabase) {}

  private get db() {
    return this.handle.sqlite;
  }

  count(w: Where): number {
    return (this.db.prepare(`SELECT COUNT(*) AS n FROM results WHERE ${w.where}`).get(...w.params) as { n: number }).n;
  }

  /** Rows at given point indices (rowid lookups through json_each: O(output)). */
  atIndices(base: number, indices: readonly number[], exprs: readonly string[], w: Where): Row[] {
    const sql = `SELECT (id - ${base}) AS idx, ${exprs.join(', ')}, flags FROM results
      WHERE id IN (SELECT ${base} + value FROM json_each(?)) AND ${w.where} ORDER BY id`;
    return this.db
      .prepare(sql)
      .raw(true)
      .all(JSON.stringify(indices), ...w.params) as Row[];
  }

  /** Every k-th point by index (for random designs the index order is itself a random order). */
  strided(base: number, k: number, limit: number, exprs: readonly string[], w: Where): Row[] {
    const sql = `SELECT (id - ${base}) AS idx, ${exprs.join(', ')}, flags FROM results
      WHERE ${w.where} AND ((id - ${base}) % ?) = 0 ORDER BY id LIMIT ?`;
    return this.db
      .prepare(sql)
      .raw(true)
      .all(...w.params, k, limit) as Row[];
  }

  /**
   * Mean of z and the flagged fraction per cell, cells given as integer SQL expressions
   * (`xi`, `yi`); one GROUP BY pass, output-sized result.
   */
  cellMeans(xi: Where, yi: Where, z: string, invalidMask: number, w: Where, keep?: Where): Row[] {
    const sql = `SELECT ${xi.where} AS xi, ${yi.where} AS yi, AVG(${z}) AS z, AVG((flags & ?) != 0) AS f
      FROM results WHERE ${w.where}${keep ? ` AND ${keep.where}` : ''} GROUP BY xi, yi`;
    return this.db
      .prepare(sql)
      .raw(true)
      .all(...xi.params, ...yi.params, invalidMask, ...w.params, ...(keep?.params ?? [])) as Row[];
  }

  /** Smallest and largest finite value of an expression (positive only, for log bins). */
  range(expr: string, w: Where, positiveOnly: boolean): [number, number] | null {
    const r = this.db
      .prepare(
        `SELECT MIN(${expr}) AS lo, MAX(${expr}) AS hi FROM results WHERE ${w.where}${positiveOnly ? ` AND ${expr} > 0` : ''}`,
      )
      .get(...w.params) as { lo: number | null; hi: number | null };
    return r.lo === null || r.hi === null ? null : [r.lo, r.hi];
  }

  distinct(expr: string, w: Where, limit: number): (number | null)[] {
    return (
      this.db.prepare(`SELECT DISTINCT ${expr} AS v FROM results WHERE ${w.where} LIMIT ?`).all(...w.params, limit) as {
        v: number | null;
      }[]
    ).map((r) => r.v);
  }
}
