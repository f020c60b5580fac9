import { createHash } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import {
  ForbiddenError,
  NotFoundError,
  ValidationError,
  type DatasetColumn,
  type DatasetListQuery,
  type DatasetRowsPage,
  type DatasetRowsQuery,
  type DatasetSeries,
  type DatasetSeriesQuery,
  type DatasetSharing,
  type DatasetUploadFields,
  type DatasetUploadResult,
  type DatasetView,
  type PageOf,
  unsafeNameProblem,
} from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { parseDatasetCsv } from './csv-reader.js';
import { HeavyReads } from '../reads/heavy-reads.js';
import { DatasetsRepository, type DatasetRow } from './datasets.repository.js';

export interface UploadedCsv {
  buffer: Buffer;
  originalname?: string;
  size: number;
}

/** A display name from the client's file name: base name only, no extension, printable characters. */
function nameFromFile(fileName: string | undefined): string {
  const base = (fileName ?? '').split(/[\\/]/).pop() ?? '';
  const clean = base
    .replace(/\.[^.]*$/, '')
    .trim()
    .slice(0, 200);
  // Not cleaned silently: a file name with control or bidi override characters is refused.
  const problem = unsafeNameProblem(clean);
  if (problem)
    throw new ValidationError(`Invalid name (from the file name): ${problem}`, [{ path: 'name', message: problem }]);
  return clean || 'Uploaded dataset';
}

export function columnsOf(d: DatasetRow): DatasetColumn[] {
  return JSON.parse(d.columns) as DatasetColumn[];
}

@Injectable()
export class DatasetsService {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly repo: DatasetsRepository,
    private readonly clock: Clock,
    private readonly reads: HeavyReads,
  ) {}

  upload(user: AuthUser, file: UploadedCsv | undefined, fields: DatasetUploadFields): DatasetUploadResult {
    if (!file)
      throw new ValidationError('No file uploaded: send the CSV in the multipart field "file"', [
        { path: 'file', message: 'required' },
      ]);
    const parsed = parseDatasetCsv(file.buffer, { maxRows: this.config.uploadMaxRows, units: fields.units });
    const fileName = file.originalname ? (file.originalname.split(/[\\/]/).pop() ?? '').slice(0, 255) : null;
    const d = this.repo.insert(
      {
        ownerId: user.id,
        name: fields.name ?? nameFromFile(file.originalname),
        fileName,
        columns: JSON.stringify(parsed.columns),
        rows: parsed.rows.length,
        visibility: fields.visibility ?? 'private',
        sha256: createHash('sha256').update(file.buffer).digest('hex'),
        createdAt: this.clock.now(),
      },
      parsed.rows,
    );
    return { id: d.id, name: d.name, rows: d.rows, columns: parsed.columns };
  }

  canRead(user: AuthUser, d: DatasetRow): boolean {
    if (user.role === 'admin' || d.ownerId === user.id || d.visibility === 'group') return true;
    return this.repo.isSharedWith(d.id, user.id);
  }

  /** The dataset if the user may read it; 404 otherwise (private work is not confirmed). */
  readable(user: AuthUser, id: number): DatasetRow {
    const d = this.repo.findById(id);
    if (!d || !this.canRead(user, d)) throw new NotFoundError(`Dataset ${id} not found`);
    return d;
  }

  manageable(user: AuthUser, id: number): DatasetRow {
    const d = this.readable(user, id);
    if (user.role !== 'admin' && d.ownerId !== user.id)
      throw new ForbiddenError('Only the owner or an admin may change this dataset');
    return d;
  }

  present(d: DatasetRow): DatasetView {
    return {
      id: d.id,
      name: d.name,
      fileName: d.fileName,
      rows: d.rows,
      columns: columnsOf(d),
      visibility: d.visibility,
      sha256: d.sha256,
      owner: { id: d.ownerId, name: this.repo.ownerName(d.ownerId) },
      sharedWith: this.repo.sharedWith(d.id),
      createdAt: new Date(d.createdAt).toISOString(),
    };
  }

  list(user: AuthUser, q: DatasetListQuery): PageOf<DatasetView> {
    const { items, total } = this.repo.list(user, { page: q.page, pageSize: q.pageSize, text: q.q });
    return { items: items.map((d) => this.present(d)), total, page: q.page, pageSize: q.pageSize };
  }

  get(user: AuthUser, id: number): DatasetView {
    return this.present(this.readable(user, id));
  }

  rows(user: AuthUser, id: number, q: DatasetRowsQuery): DatasetRowsPage {
    const d = this.readable(user, id);
    return {
      items: this.repo.rowsPage(id, q.page, q.pageSize),
      total: d.rows,
      page: q.page,
      pageSize: q.pageSize,
      columns: columnsOf(d),
    };
  }

  remove(user: AuthUser, id: number): void {
    this.manageable(user, id);
    this.repo.delete(id, this.clock.now());
  }

  setSharing(user: AuthUser, id: number, body: DatasetSharing): DatasetView {
    this.manageable(user, id);
    if (body.userIds) {
      const known = this.repo.existingUserIds(body.userIds);
      const details = body.userIds.flatMap((u, i) =>
        known.has(u) ? [] : [{ path: `userIds.${i}`, message: `no user with id ${u}` }],
      );
      if (details.length) throw new ValidationError(`Invalid body: ${details[0].path}: ${details[0].message}`, details);
    }
    this.repo.setSharing(id, body);
    return this.get(user, id);
  }

  /**
   * Whole numeric columns in canonical units, in row order (the input of fits). Missing cells are NaN.
   * 400 naming the column for a text column or a name the dataset does not have.
   */
  async columns(
    user: AuthUser,
    id: number,
    names: string[],
    signal?: AbortSignal,
  ): Promise<{ n: number; data: Record<string, Float64Array> }> {
    const d = this.readable(user, id);
    const cols = columnsOf(d);
    const idx = names.map((name, i) => {
      const j = cols.findIndex((c) => c.name === name);
      if (j < 0)
        throw new ValidationError(`Unknown column "${name.slice(0, 64)}"`, [
          {
            path: `columns.${i}`,
            column: name,
            message: `unknown column; the dataset has ${cols.map((c) => c.name).join(', ')}`,
          },
        ]);
      if (cols[j].kind !== 'number')
        throw new ValidationError(`Column "${name}" holds text, not numbers`, [
          { path: `columns.${i}`, column: name, message: 'a text column cannot be used as a number' },
        ]);
      return j;
    });
    // Reading every row is a heavy read: on the read pool, within its budget and the user's share.
    const read = await this.reads.run(
      user.id,
      { kind: 'datasetColumns', datasetId: id, cells: idx, rows: d.rows },
      signal ? { signal } : {},
    );
    const data: Record<string, Float64Array> = {};
    names.forEach((name, k) => (data[name] = read.columns[k]!));
    return { n: read.n, data };
  }

  /** Points of two numeric columns for an overlay on a sweep plot (canonical units, gaps skipped). */
  async series(user: AuthUser, id: number, q: DatasetSeriesQuery, signal?: AbortSignal): Promise<DatasetSeries> {
    const d = this.readable(user, id);
    const cols = columnsOf(d);
    const { data, n } = await this.columns(user, id, q.x === q.y ? [q.x] : [q.x, q.y], signal);
    const xs = data[q.x];
    const ys = data[q.y];
    const keep: number[] = [];
    for (let i = 0; i < n; i++) if (Number.isFinite(xs[i]) && Number.isFinite(ys[i])) keep.push(i);
    const stride = Math.max(1, Math.ceil(keep.length / q.maxPoints));
    const px: number[] = [];
    const py: number[] = [];
    for (let k = 0; k < keep.length; k += stride) {
      px.push(xs[keep[k]]);
      py.push(ys[keep[k]]);
    }
    const meta = (name: string) => {
      const c = cols.find((x) => x.name === name)!;
      return { name, unit: c.canonicalUnit, quantity: c.quantity };
    };
    return { x: meta(q.x), y: meta(q.y), n: px.length, total: keep.length, points: { x: px, y: py } };
  }
}
