import { Inject, Injectable } from '@nestjs/common';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';

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
