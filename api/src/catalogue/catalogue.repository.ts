import { Inject, Injectable } from '@nestjs/common';
import type { CatalogueSortKey, SweepListQuery } from '@driftgrid/domain';
import { DB_HANDLE } from '../db/db.module.js';
import type { OpenedDatabase } from '../db/database.js';
import { inTransaction } from '../db/transactions.js';
import type { SweepRow } from '../sweeps/sweeps.repository.js';

/** A catalogue row: the sweep's own columns plus what the list shows beside it. */
export interface CatalogueRow {
  id: number;
  name: string;
  description: string | null;
  model: string;
  status: SweepRow['status'];
  points: number;
  pointsDone: number;
  visibility: 'private' | 'group';
  invalidPoints: number;
  createdAt: number;
  finishedAt: number | null;
  archivedAt: number | null;
  ownerId: number;
  ownerName: string | null;
  tags: string | null;
  sharedWithMe: number;
}

export interface Viewer {
  id: number;
  role: string;
}

/** Sort keys → SQL: a fixed whitelist, never the caller's text. */
const SORT_SQL: Record<CatalogueSortKey, string> = {
  name: 's.name COLLATE NOCASE',
  createdAt: 's.created_at',
  finishedAt: 's.finished_at',
  points: 's.points',
  status: 's.status',
  model: 's.model',
};

const SHARED = 'EXISTS (SELECT 1 FROM sweep_shares sh WHERE sh.sweep_id = s.id AND sh.user_id = ?)';

function likePattern(q: string): string {
  return `%${q.replace(/[%_\\]/g, (c) => '\\' + c)}%`;
}

/** All SQL of the catalogue: the visible-sweep list, sharing and the user directory. */
@Injectable()
export class CatalogueRepository {
  constructor(@Inject(DB_HANDLE) private readonly handle: OpenedDatabase) {}

  private get db() {
    return this.handle.sqlite;
  }

  /** WHERE clause for what `viewer` may see within `scope` (SPEC §1), with placeholders. */
  private visibility(viewer: Viewer, scope: SweepListQuery['scope']): { sql: string[]; params: unknown[] } {
    const sql: string[] = ['s.deleted_at IS NULL'];
    const params: unknown[] = [];
    const admin = viewer.role === 'admin';
    switch (scope) {
      case 'mine':
        sql.push('s.owner_id = ?');
        params.push(viewer.id);
        break;
      case 'shared':
        // Shared with me: named in the shares, or opened to the whole group; not my own.
        sql.push(`s.owner_id != ? AND (s.visibility = 'group' OR ${SHARED})`);
        params.push(viewer.id, viewer.id);
        break;
      case 'archived':
        sql.push(`s.status = 'archived'`);
        break;
      case 'all':
        if (!admin) {
          sql.push(`(s.owner_id = ? OR s.status = 'archived' OR s.visibility = 'group' OR ${SHARED})`);
          params.push(viewer.id, viewer.id);
        }
        break;
    }
    return { sql, params };
  }

  list(viewer: Viewer, q: SweepListQuery): { rows: CatalogueRow[]; total: number } {
    const { sql: where, params } = this.visibility(viewer, q.scope);
    if (q.q) {
      where.push(`(s.name LIKE ? ESCAPE '\\' OR json_extract(s.definition, '$.description') LIKE ? ESCAPE '\\')`);
      const p = likePattern(q.q);
      params.push(p, p);
    }
    const inList = (col: string, values: readonly unknown[] | undefined) => {
      if (!values?.length) return;
      where.push(`${col} IN (${values.map(() => '?').join(', ')})`);
      params.push(...values);
    };
    inList('s.model', q.model);
    inList('s.status', q.status);
    if (q.owner !== undefined) {
      where.push('s.owner_id = ?');
      params.push(q.owner === 'me' ? viewer.id : q.owner);
    }
    // Every given tag must be present (each tag narrows the view).
    for (const tag of q.tag ?? []) {
      where.push('EXISTS (SELECT 1 FROM sweep_tags t WHERE t.sweep_id = s.id AND t.tag = ?)');
      params.push(tag);
    }
    const range = (col: string, lo: number | undefined, hi: number | undefined) => {
      if (lo !== undefined) {
        where.push(`${col} >= ?`);
        params.push(lo);
      }
      if (hi !== undefined) {
        where.push(`${col} <= ?`);
        params.push(hi);
      }
    };
    range('s.created_at', q.createdFrom, q.createdTo === undefined ? undefined : endOfDay(q.createdTo));
    range('s.finished_at', q.finishedFrom, q.finishedTo === undefined ? undefined : endOfDay(q.finishedTo));
    range('s.points', q.minPoints, q.maxPoints);

    const [key, dir = 'asc'] = q.sort.split(':') as [CatalogueSortKey, string?];
    const direction = dir === 'desc' ? 'DESC' : 'ASC';
    // Sweeps not finished yet sort after the finished ones either way.
    const order = `${key === 'finishedAt' ? 's.finished_at IS NULL, ' : ''}${SORT_SQL[key]} ${direction}, s.id ${direction}`;
    const whereSql = where.join(' AND ');
    const total = (
      this.db.prepare(`SELECT COUNT(*) AS n FROM sweeps s WHERE ${whereSql}`).get(...params) as { n: number }
    ).n;
    const rows = this.db
      .prepare(
        `SELECT s.id, s.name, json_extract(s.definition, '$.description') AS description, s.model, s.status, s.points,
                s.points_done AS pointsDone, s.visibility, s.invalid_points AS invalidPoints, s.created_at AS createdAt,
                s.finished_at AS finishedAt, s.archived_at AS archivedAt, s.owner_id AS ownerId, u.name AS ownerName,
                (SELECT json_group_array(t.tag) FROM (SELECT tag FROM sweep_tags WHERE sweep_id = s.id ORDER BY tag) t) AS tags,
                ${SHARED} AS sharedWithMe
         FROM sweeps s LEFT JOIN users u ON u.id = s.owner_id
         WHERE ${whereSql} ORDER BY ${order} LIMIT ? OFFSET ?`,
      )
      .all(viewer.id, ...params, q.pageSize, (q.page - 1) * q.pageSize) as CatalogueRow[];
    return { rows, total };
  }

  /** Replaces visibility and named readers in one transaction. */
  setSharing(sweepId: number, visibility: 'private' | 'group', userIds: readonly number[]): void {
    inTransaction(this.db, () => {
      this.db.prepare('UPDATE sweeps SET visibility = ? WHERE id = ?').run(visibility, sweepId);
      this.db.prepare('DELETE FROM sweep_shares WHERE sweep_id = ?').run(sweepId);
      const ins = this.db.prepare('INSERT INTO sweep_shares (sweep_id, user_id) VALUES (?, ?)');
      for (const u of new Set(userIds)) ins.run(sweepId, u);
    });
  }

  /** Which of these ids are active users (for validating a share list). */
  activeUserIds(ids: readonly number[]): Set<number> {
    if (!ids.length) return new Set();
    const rows = this.db
      .prepare(`SELECT id FROM users WHERE active = 1 AND id IN (${ids.map(() => '?').join(', ')})`)
      .all(...ids) as { id: number }[];
    return new Set(rows.map((r) => r.id));
  }

  /** Names and roles only: a share dialog needs no e-mail addresses. */
  directory(q: string | undefined, limit: number): { id: number; name: string; role: string }[] {
    const where = ['active = 1'];
    const params: unknown[] = [];
    if (q) {
      where.push(`name LIKE ? ESCAPE '\\'`);
      params.push(likePattern(q));
    }
    return this.db
      .prepare(`SELECT id, name, role FROM users WHERE ${where.join(' AND ')} ORDER BY name COLLATE NOCASE, id LIMIT ?`)
      .all(...params, limit) as { id: number; name: string; role: string }[];
  }
}

/** A bare date as the upper bound means the whole of that day (UTC). */
function endOfDay(ms: number): number {
  return ms % 86_400_000 === 0 ? ms + 86_400_000 - 1 : ms;
}
