import { Injectable } from '@nestjs/common';
import {
  ConflictError,
  ValidationError,
  type ResultsQuery,
  type SeriesQuery,
  type SweepListQuery,
  type SweepSharing,
  type PageOf,
  type SweepSummary,
} from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { columnByName, parseFilter } from '../sweeps/results-query.js';
import { HeavyReads } from '../reads/heavy-reads.js';
import { layoutOf, ResultsReader } from '../sweeps/results-reader.js';
import { SweepAccess } from '../sweeps/sweep-access.js';
import { SweepsService } from '../sweeps/sweeps.service.js';
import { CatalogueRepository, type CatalogueRow } from './catalogue.repository.js';

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

/** The catalogue's lighter sweep shape: what a list row needs, without definition or columns. */
export function summarise(r: CatalogueRow): SweepSummary {
  return {
    id: r.id,
    name: r.name,
    description: r.description,
    model: r.model,
    status: r.status,
    points: r.points,
    progress: { done: r.pointsDone, total: r.points, fraction: r.points ? r.pointsDone / r.points : 0 },
    tags: r.tags ? (JSON.parse(r.tags) as string[]) : [],
    owner: { id: r.ownerId, name: r.ownerName ?? 'unknown' },
    visibility: r.visibility,
    sharedWithMe: r.sharedWithMe === 1,
    invalidPoints: r.invalidPoints,
    createdAt: iso(r.createdAt)!,
    finishedAt: iso(r.finishedAt),
    archivedAt: iso(r.archivedAt),
  };
}

@Injectable()
export class CatalogueService {
  constructor(
    private readonly repo: CatalogueRepository,
    private readonly access: SweepAccess,
    private readonly reader: ResultsReader,
    private readonly sweeps: SweepsService,
    private readonly reads: HeavyReads,
  ) {}

  list(user: AuthUser, q: SweepListQuery): PageOf<SweepSummary> {
    const { rows, total } = this.repo.list(user, q);
    return { items: rows.map(summarise), total, page: q.page, pageSize: q.pageSize };
  }

  /** `signal` fires when the client goes away: a heavy read it started is stopped. */
  results(user: AuthUser, id: number, q: ResultsQuery, signal?: AbortSignal) {
    const s = this.access.readable(user, id);
    const layout = layoutOf(s);
    const filter = parseFilter(q.filter, layout);
    if (q.valid !== undefined) {
      columnByName(layout, 'valid', 'valid');
      filter.valid = { ...filter.valid, eq: q.valid };
    }
    return this.reader.page(user.id, s, { page: q.page, pageSize: q.pageSize, sort: q.sort, filter }, signal);
  }

  /** Plot data, computed on the heavy-read pool (series.service.ts runs there). */
  series(user: AuthUser, id: number, q: SeriesQuery, signal?: AbortSignal) {
    const s = this.access.readable(user, id);
    return this.reads.run(user.id, { kind: 'series', sweep: s, query: q }, { signal });
  }

  /**
   * Owner or admin replaces who may read the sweep. Archived sweeps are frozen: every signed-in user
   * reads them already, and their record does not change, so sharing them is a 409.
   */
  share(user: AuthUser, id: number, body: SweepSharing) {
    const s = this.access.manageable(user, id);
    if (s.status === 'archived')
      throw new ConflictError(`Sweep ${id} is archived: everyone signed in can read it and its sharing cannot change`);
    const ids = [...new Set(body.userIds.filter((u) => u !== s.ownerId))];
    const known = this.repo.activeUserIds(ids);
    const details = body.userIds.flatMap((u, i) =>
      u === s.ownerId || known.has(u) ? [] : [{ path: `userIds.${i}`, message: `no active user with id ${u}` }],
    );
    if (details.length) throw new ValidationError(`Invalid body: ${details[0].path}: ${details[0].message}`, details);
    this.repo.setSharing(id, body.visibility, ids);
    return this.sweeps.get(user, id);
  }

  directory(q: string | undefined, pageSize: number) {
    // A look-up for pickers (first matches by name), not a paged list.
    return { items: this.repo.directory(q, pageSize) };
  }
}
