import type { FitRequestBody, FitSourceKind } from '../FitResult/fit-types.js';

export type FitModel = 'power-law' | 'exponential' | 'polytropic' | 'expression';

export interface RangeRow {
  column: string | null;
  min: string;
  max: string;
}

export interface BuilderState {
  model: FitModel;
  y: string | null;
  x: string[];
  expr: string;
  /** Start values as text: `A = 1, T = 4`. */
  params: string;
  validOnly: boolean;
  ranges: RangeRow[];
  weights: string | null;
}

export const SINGLE_X: ReadonlySet<FitModel> = new Set(['exponential', 'polytropic']);

export function initialState(hasValid: boolean): BuilderState {
  return { model: 'power-law', y: null, x: [], expr: '', params: '', validOnly: hasValid, ranges: [], weights: null };
}

/** `A = 1, T = 4` (commas, semicolons or new lines) → { A: 1, T: 4 }, or the first problem. */
export function parseStartValues(
  text: string,
): { ok: true; value: Record<string, number> } | { ok: false; error: string } {
  const value: Record<string, number> = {};
  const parts = text
    .split(/[,;\n]/)
    .map((s) => s.trim())
    .filter(Boolean);
  for (const part of parts) {
    const m = /^([A-Za-z_][A-Za-z0-9_]*)\s*=\s*(\S+)$/.exec(part);
    if (!m) return { ok: false, error: `"${part}" is not name = number` };
    const v = Number(m[2]);
    if (!Number.isFinite(v)) return { ok: false, error: `start value of ${m[1]} is not a number` };
    value[m[1]!] = v;
  }
  return { ok: true, value };
}

/** The POST /api/fits body, or errors by field (shown beside the fields before sending). */
export function toRequest(
  s: BuilderState,
  source: { kind: FitSourceKind; id: number },
  hasValid: boolean,
): { ok: true; body: FitRequestBody } | { ok: false; errors: Record<string, string> } {
  const errors: Record<string, string> = {};
  if (!s.y) errors.y = 'Choose the column to fit (y)';
  if (s.x.length === 0) errors.x = 'Choose at least one x column';
  if (SINGLE_X.has(s.model) && s.x.length > 1) errors.x = 'This model takes exactly one x column';
  if (s.y && s.x.includes(s.y)) errors.x = 'y cannot also be an x column';
  let params: Record<string, number> | undefined;
  if (s.params.trim()) {
    const p = parseStartValues(s.params);
    if (p.ok) params = p.value;
    else errors.params = p.error;
  }
  if (s.model === 'expression') {
    if (!s.expr.trim()) errors.expr = 'Write the model, e.g. A * exp(phi_V / T)';
    if (!params || Object.keys(params).length === 0)
      errors.params ??= 'Give each parameter a start value, e.g. A = 1, T = 4';
  }
  const filter: Record<string, Record<string, number | boolean>> = {};
  if (hasValid && s.validOnly) filter.valid = { eq: true };
  s.ranges.forEach((r, i) => {
    if (!r.column) {
      if (r.min || r.max) errors[`ranges.${i}`] = 'Choose the column of this range';
      return;
    }
    const cond: Record<string, number> = {};
    for (const [key, text] of [
      ['gte', r.min],
      ['lte', r.max],
    ] as const) {
      if (text.trim() === '') continue;
      const v = Number(text);
      if (!Number.isFinite(v)) errors[`ranges.${i}`] = `${key === 'gte' ? 'Minimum' : 'Maximum'} is not a number`;
      else cond[key] = v;
    }
    if (cond.gte !== undefined && cond.lte !== undefined && cond.gte > cond.lte)
      errors[`ranges.${i}`] = 'Minimum is above maximum';
    if (Object.keys(cond).length) filter[r.column] = { ...(filter[r.column] ?? {}), ...cond };
  });
  if (Object.keys(errors).length) return { ok: false, errors };
  const body: FitRequestBody = {
    source,
    model: s.model,
    y: s.y!,
    x: SINGLE_X.has(s.model) ? s.x[0]! : s.x,
    ...(s.model === 'expression' ? { expr: s.expr.trim() } : {}),
    ...(params ? { params } : {}),
    ...(Object.keys(filter).length ? { filter } : {}),
    ...(s.weights ? { weights: s.weights } : {}),
  };
  return { ok: true, body };
}
