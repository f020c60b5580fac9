import { ValidationError, type ErrorDetail } from '@driftgrid/domain';
import { z } from 'zod';
import { rowRange, ROW_SPAN, type StoredColumn } from './sweep-layout.js';

/** Range/equality filter on whitelisted columns: `{"Te_eV":{"gte":10,"lte":100},"valid":{"eq":true}}`. */
const opSchema = z
  .object({
    gte: z.number().finite().optional(),
    gt: z.number().finite().optional(),
    lte: z.number().finite().optional(),
    lt: z.number().finite().optional(),
    eq: z.union([z.number().finite(), z.boolean()]).optional(),
    ne: z.union([z.number().finite(), z.boolean()]).optional(),
    isNull: z.boolean().optional(),
  })
  .strict();

export const resultFilterSchema = z.record(z.string().max(64), opSchema);
export type ResultFilter = z.infer<typeof resultFilterSchema>;

const SQL_OPS = { gte: '>=', gt: '>', lte: '<=', lt: '<', eq: '=', ne: '!=' } as const;

export interface CompiledQuery {
  /** WHERE clause (always restricted to the sweep's rowid range) with `?` placeholders. */
  where: string;
  params: (number | null)[];
}

/** Looks a column up by name; only the sweep's own columns (plus `idx` and `flags`) exist. */
export function columnByName(layout: readonly StoredColumn[], name: string, path: string): StoredColumn {
  const c = layout.find((x) => x.name === name);
  if (!c) {
    throw new ValidationError(`Unknown column "${name.slice(0, 64)}"`, [
      { path, message: `unknown column; known columns: ${layout.map((x) => x.name).join(', ')}` },
    ]);
  }
  return c;
}

/** Parses the `filter` query parameter (JSON text or an object) against the sweep's columns. */
export function parseFilter(raw: unknown, layout: readonly StoredColumn[], path = 'filter'): ResultFilter {
  if (raw === undefined || raw === null || raw === '') return {};
  let value: unknown = raw;
  if (typeof raw === 'string') {
    if (raw.length > 10_000)
      throw new ValidationError('filter is too long', [{ path, message: 'at most 10,000 characters' }]);
    try {
      value = JSON.parse(raw);
    } catch {
      throw new ValidationError('filter is not valid JSON', [
        { path, message: 'expected JSON like {"Te_eV":{"gte":10}}' },
      ]);
    }
  }
  // Own keys first: zod's record drops `__proto__`, which would silently turn into no filter.
  if (typeof value === 'object' && value !== null && !Array.isArray(value))
    for (const name of Object.keys(value)) columnByName(layout, name, `${path}.${name}`);
  const parsed = resultFilterSchema.safeParse(value);
  if (!parsed.success) {
    const details: ErrorDetail[] = parsed.error.issues.map((i) => ({
      path: [path, ...i.path.map(String)].join('.'),
      message: i.message,
    }));
    throw new ValidationError(`Invalid filter: ${details[0].path}: ${details[0].message}`, details);
  }
  for (const name of Object.keys(parsed.data)) columnByName(layout, name, `${path}.${name}`);
  return parsed.data;
}

/** Builds the WHERE clause; column names are never spliced, only their whitelisted slot expressions. */
export function compileFilter(sweepId: number, layout: readonly StoredColumn[], filter: ResultFilter): CompiledQuery {
  const { lo, hi } = rowRange(sweepId);
  const clauses = ['id BETWEEN ? AND ?'];
  const params: (number | null)[] = [lo, hi];
  for (const [name, ops] of Object.entries(filter)) {
    const col = columnByName(layout, name, `filter.${name}`);
    const expr = col.kind === 'index' ? `(id - ${sweepId * ROW_SPAN})` : col.slot;
    for (const [op, v] of Object.entries(ops)) {
      if (v === undefined) continue;
      if (op === 'isNull') {
        clauses.push(`${expr} IS ${v ? '' : 'NOT '}NULL`);
        continue;
      }
      clauses.push(`${expr} ${SQL_OPS[op as keyof typeof SQL_OPS]} ?`);
      params.push(typeof v === 'boolean' ? (v ? 1 : 0) : v);
    }
  }
  return { where: clauses.join(' AND '), params };
}

export interface SortSpec {
  column: StoredColumn;
  desc: boolean;
}

/** `col:asc` / `col:desc` against the whitelist; null is index order (the rowid scan). */
export function parseSort(layout: readonly StoredColumn[], raw: unknown): SortSpec | null {
  if (raw === undefined || raw === '' || raw === null) return null;
  if (typeof raw !== 'string' || raw.length > 80)
    throw new ValidationError('sort must be "column:asc" or "column:desc"', [
      { path: 'sort', message: 'expected column:asc or column:desc' },
    ]);
  const m = /^([A-Za-z_][A-Za-z0-9_]*)(?::(asc|desc))?$/i.exec(raw);
  if (!m)
    throw new ValidationError('sort must be "column:asc" or "column:desc"', [
      { path: 'sort', message: 'expected column:asc or column:desc' },
    ]);
  return { column: columnByName(layout, m[1], 'sort'), desc: (m[2] ?? 'asc').toLowerCase() === 'desc' };
}

/** ORDER BY for a sort; NULLs (NaN/Infinity in the model) last in either direction, ties in index order. */
export function compileSort(layout: readonly StoredColumn[], raw: unknown): string {
  const spec = parseSort(layout, raw);
  if (!spec) return 'id ASC';
  const dir = spec.desc ? 'DESC' : 'ASC';
  if (spec.column.kind === 'index') return `id ${dir}`;
  return `${spec.column.slot} IS NULL, ${spec.column.slot} ${dir}, id ASC`;
}

/** SELECT list that reads every column under its own name (aliases are fixed identifiers). */
export function selectList(sweepId: number, layout: readonly StoredColumn[]): string {
  return layout
    .map((c) => (c.kind === 'index' ? `(id - ${sweepId * ROW_SPAN}) AS "idx"` : `${c.slot} AS "${c.name}"`))
    .join(', ');
}
