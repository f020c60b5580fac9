import { Inject, Injectable } from '@nestjs/common';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import { selectList } from '../sweeps/results-query.js';
import { layoutOf } from '../sweeps/results-reader.js';
import { rowRange } from '../sweeps/sweep-layout.js';
import type { SweepRow } from '../sweeps/sweeps.repository.js';

/**
 * Rows fetched per statement while streaming an export. Each batch is read and formatted on the api
 * thread in one go (the CSV stream pulls one batch per read(): a batch of a wide sweep exceeds its 256 kB
 * buffer), so this bounds how long an export holds the event loop: about 15 ms for 1,000 rows of 21
 * columns on a loaded 2-core machine, against about 60 ms for 4,000.
 */
export const EXPORT_BATCH = 1000;

export interface FitRecord {
  id: number;
  ownerId: number;
  model: string;
  status: string;
  request: unknown;
  result: unknown;
  error: string | null;
  appVersion: string;
  sourceModelVersion: string | null;
  createdAt: string;
  finishedAt: string | null;
}

interface FitDbRow {
  id: number;
  owner_id: number;
  model: string;
  status: string;
  request: string;
  result: string | null;
  error: string | null;
  app_version: string;
  source_model_version: string | null;
  created_at: number;
  finishedAt: number | null;
}

const parseJson = (text: string | null): unknown => {
  if (text === null) return null;
  try {
    return JSON.parse(text);
  } catch {
    return text;
  }
};

@Injectable()
export class ExportRepository {
  constructor(@Inject(DB_HANDLE) private readonly handle: OpenedDatabase) {}

  /**
   * A sweep's rows in index order, as arrays in layout order, read in keyset batches.
   * ResultsReader.iterate keeps one better-sqlite3 iterator open for the whole walk, and while it is
   * open the shared connection refuses every write ("busy executing a query"); a download to a slow
   * client would stall chunk persistence and sign-ins for its duration. Batches release it each time.
   */
  *sweepRows(s: SweepRow): Generator<(number | null)[][]> {
    const layout = layoutOf(s);
    const { lo, hi } = rowRange(s.id);
    const stmt = this.handle.sqlite
      .prepare(`SELECT id, ${selectList(s.id, layout)} FROM results WHERE id > ? AND id <= ? ORDER BY id LIMIT ?`)
      .raw(true);
    let after = lo - 1;
    for (;;) {
      const batch = stmt.all(after, hi, EXPORT_BATCH) as (number | null)[][];
      if (batch.length === 0) return;
      after = batch[batch.length - 1][0] as number;
      for (const r of batch) r.shift();
      yield batch;
      if (batch.length < EXPORT_BATCH) return;
    }
  }

  /** Fits whose source is this sweep or dataset, oldest first, with request and result JSON. */
  fitsOf(kind: 'sweep' | 'dataset', id: number): FitRecord[] {
    const rows = this.handle.sqlite
      .prepare(
        `SELECT id, owner_id, model, status, request, result, error, app_version, source_model_version, created_at, finished_at AS finishedAt
                FROM fits WHERE source_kind = ? AND source_id = ? ORDER BY created_at, id`,
      )
      .all(kind, id) as FitDbRow[];
    return rows.map((f) => ({
      id: f.id,
      ownerId: f.owner_id,
      model: f.model,
      status: f.status,
      request: parseJson(f.request),
      result: parseJson(f.result),
      error: f.error,
      appVersion: f.app_version,
      sourceModelVersion: f.source_model_version,
      createdAt: new Date(f.created_at).toISOString(),
      finishedAt: f.finishedAt ? new Date(f.finishedAt).toISOString() : null,
    }));
  }

  userName(id: number): string {
    const r = this.handle.sqlite.prepare('SELECT name FROM users WHERE id = ?').get(id) as { name: string } | undefined;
    return r?.name ?? 'unknown';
  }
}
