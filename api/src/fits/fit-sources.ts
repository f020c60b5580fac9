import { Injectable } from '@nestjs/common';
import { COMPLETE_STATES, ConflictError, ValidationError, type ErrorDetail, type FitRequest } from '@driftgrid/domain';
import type { AuthUser } from '../auth/current-user.js';
import { DatasetsService, columnsOf } from '../datasets/datasets.service.js';
import { ResultsReader, layoutOf } from '../sweeps/results-reader.js';
import { parseFilter } from '../sweeps/results-query.js';
import { SweepAccess } from '../sweeps/sweep-access.js';

export type SourceKind = 'sweep' | 'dataset';

export interface SourceColumn {
  name: string;
  unit: string;
  kind: string;
}

/** The rows a fit runs on, after the filter and after dropping rows with a missing value. */
export interface FitData {
  source: { kind: SourceKind; id: number; name: string; modelVersion: string | null };
  /** Numeric columns of the source (name, canonical unit, kind). */
  columns: SourceColumn[];
  n: number;
  /** Rows that passed the filter but had NaN/NULL/±∞ in y, an x or the weights column. */
  dropped: number;
  data: Record<string, Float64Array>;
}

/** Sweep statuses whose results are complete and may be fitted. */
const FITTABLE_SWEEP = new Set<string>(COMPLETE_STATES);

type Condition = { gte?: number; gt?: number; lte?: number; lt?: number; eq?: number | boolean | string };

export function requestedColumns(req: Pick<FitRequest, 'x' | 'y' | 'weights'>): { path: string; name: string }[] {
  const xs = Array.isArray(req.x) ? req.x : [req.x];
  return [
    { path: 'y', name: req.y },
    ...xs.map((name, i) => ({ path: Array.isArray(req.x) ? `x.${i}` : 'x', name })),
    ...(req.weights ? [{ path: 'weights', name: req.weights }] : []),
  ];
}

function checkNames(wanted: { path: string; name: string }[], columns: SourceColumn[], what: string): void {
  const known = new Set(columns.map((c) => c.name));
  const details: ErrorDetail[] = wanted
    .filter((w) => !known.has(w.name))
    .map((w) => ({
      path: w.path,
      column: w.name,
      message: `unknown or non-numeric column "${w.name.slice(0, 64)}"; the ${what} has ${columns.map((c) => c.name).join(', ')}`,
    }));
  if (details.length) throw new ValidationError(`${details[0].path}: ${details[0].message}`, details);
}

/** Keeps rows where every named column is finite; returns compacted copies and the dropped count. */
export function dropMissing(
  n: number,
  data: Record<string, Float64Array>,
  names: string[],
): { n: number; dropped: number; data: Record<string, Float64Array> } {
  const keep = new Uint8Array(n);
  let m = 0;
  for (let i = 0; i < n; i++) {
    let ok = 1;
    for (const name of names)
      if (!Number.isFinite(data[name]![i]!)) {
        ok = 0;
        break;
      }
    keep[i] = ok;
    m += ok;
  }
  if (m === n) return { n, dropped: 0, data };
  const out: Record<string, Float64Array> = {};
  for (const name of names) {
    const src = data[name]!;
    const dst = new Float64Array(m);
    for (let i = 0, k = 0; i < n; i++) if (keep[i]) dst[k++] = src[i]!;
    out[name] = dst;
  }
  return { n: m, dropped: n - m, data: out };
}

/** The dataset filter: the same JSON as for sweeps, on numeric columns, applied in memory. */
export function datasetMask(
  n: number,
  data: Record<string, Float64Array>,
  filter: Record<string, Condition>,
): Uint8Array {
  const mask = new Uint8Array(n).fill(1);
  for (const [name, c] of Object.entries(filter)) {
    if (typeof c.eq === 'string') {
      throw new ValidationError(`filter.${name}.eq: a dataset filter compares numbers`, [
        { path: `filter.${name}.eq`, message: 'must be a number or a boolean' },
      ]);
    }
    const col = data[name]!;
    const eq = typeof c.eq === 'boolean' ? (c.eq ? 1 : 0) : c.eq;
    for (let i = 0; i < n; i++) {
      const v = col[i]!;
      if (!mask[i]) continue;
      if (
        (c.gte !== undefined && !(v >= c.gte)) ||
        (c.gt !== undefined && !(v > c.gt)) ||
        (c.lte !== undefined && !(v <= c.lte)) ||
        (c.lt !== undefined && !(v < c.lt)) ||
        (eq !== undefined && v !== eq)
      )
        mask[i] = 0;
    }
  }
  return mask;
}

/** Reads the columns a fit needs from a sweep's results or a dataset, with the visibility checks. */
@Injectable()
export class FitSources {
  constructor(
    private readonly sweeps: SweepAccess,
    private readonly results: ResultsReader,
    private readonly datasets: DatasetsService,
  ) {}

  /** Sweep columns are read on the heavy-read pool (bounded in time and per user; api/src/reads). */
  async load(user: AuthUser, kind: SourceKind, id: number, req: FitRequest): Promise<FitData> {
    const wanted = requestedColumns(req);
    const names = [...new Set(wanted.map((w) => w.name))];
    if (kind === 'sweep') {
      const s = this.sweeps.readable(user, id);
      if (!FITTABLE_SWEEP.has(s.status)) {
        throw new ConflictError(`Sweep ${id} is ${s.status}; fits run on completed or archived sweeps`);
      }
      const columns = layoutOf(s)
        .filter((c) => c.kind !== 'flags')
        .map((c) => ({ name: c.name, unit: c.unit, kind: c.kind }));
      checkNames(wanted, columns, 'sweep');
      // The reader validates the filter against the sweep's columns (400 naming filter.<column>).
      const raw = await this.results.columns(user.id, s, names, parseFilter(req.filter, layoutOf(s)));
      const kept = dropMissing(raw.n, raw.data, names);
      return { source: { kind, id, name: s.name, modelVersion: s.modelVersion }, columns, ...kept };
    }
    const d = this.datasets.readable(user, id);
    const columns = columnsOf(d)
      .filter((c) => c.kind === 'number')
      .map((c) => ({ name: c.name, unit: c.canonicalUnit, kind: 'measured' }));
    checkNames(wanted, columns, 'dataset');
    const filter = (req.filter ?? {}) as Record<string, Condition>;
    checkNames(
      Object.keys(filter).map((name) => ({ path: `filter.${name}`, name })),
      columns,
      'dataset',
    );
    const all = [...new Set([...names, ...Object.keys(filter)])];
    const raw = await this.datasets.columns(user, id, all);
    let { n, data } = raw;
    if (Object.keys(filter).length) {
      // Rows outside the filter are left out before counting rows dropped for missing values.
      const mask = datasetMask(n, data, filter);
      const m = mask.reduce((a, b) => a + b, 0);
      const compact: Record<string, Float64Array> = {};
      for (const name of names) {
        const src = data[name]!;
        const out = new Float64Array(m);
        for (let i = 0, k = 0; i < n; i++) if (mask[i]) out[k++] = src[i]!;
        compact[name] = out;
      }
      n = m;
      data = compact;
    }
    const kept = dropMissing(n, data, names);
    return { source: { kind, id, name: d.name, modelVersion: null }, columns, ...kept };
  }
}
