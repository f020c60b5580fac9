import type { FitModelKind } from '@driftgrid/domain';
import type { FitRequestBody, FitSourceKind } from '../../api/fits.js';

export type FitModel = FitModelKind;

export interface RangeRow {
  column: string | null;
  min: string;
  max: string;
}

/** How one parameter is steered: held at a value, or kept within [lo, hi] (empty = open). */
export interface SteerRow {
  fixed: boolean;
  value: string;
  lo: string;
  hi: string;
}

export interface ProbeOptions {
  /** Collecting area in mm² (the form's unit; sent in m²). */
  areaMm2: string;
  /** Ion mass in proton masses. */
  mu: string;
  h: string;
  /** Retardation window; both empty = automatic. */
  vMin: string;
  vMax: string;
  slope: boolean;
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
  sigmaMode: 'relative' | 'absolute';
  normalised: boolean;
  steer: Record<string, SteerRow>;
  probe: ProbeOptions;
}

export const SINGLE_X: ReadonlySet<FitModel> = new Set([
  'exponential',
  'polytropic',
  'probe-retarding',
  'probe-double',
]);
export const PROBE_MODELS: ReadonlySet<FitModel> = new Set(['probe-retarding', 'probe-double']);

export const EMPTY_STEER: SteerRow = { fixed: false, value: '', lo: '', hi: '' };

export function initialState(hasValid: boolean): BuilderState {
  return {
    model: 'power-law',
    y: null,
    x: [],
    expr: '',
    params: '',
    validOnly: hasValid,
    ranges: [],
    weights: null,
    sigmaMode: 'relative',
    normalised: false,
    steer: {},
    probe: { areaMm2: '', mu: '39.948', h: '0.61', vMin: '', vMax: '', slope: false },
  };
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

/** { A: 1, T: 4 } → `A = 1, T = 4`. */
export function formatStartValues(values: Record<string, number>): string {
  return Object.entries(values)
    .map(([k, v]) => `${k} = ${v}`)
    .join(', ');
}

/** The model's parameter names for the steering table (an expression's come from its start values). */
export function parameterNames(s: BuilderState): string[] {
  switch (s.model) {
    case 'power-law':
      return ['C', ...s.x.map((c) => `exp_${c}`)];
    case 'exponential':
      return ['A', 's'];
    case 'polytropic':
      return s.normalised ? ['gamma', 'Te_eV'] : ['gamma', 'Te_eV', 'n0'];
    case 'probe-retarding':
      return s.probe.slope ? ['I_is', 'V_f', 'Te_eV', 'slope'] : ['I_is', 'V_f', 'Te_eV'];
    case 'probe-double':
      return s.probe.slope ? ['I_is', 'Te_eV', 'slope'] : ['I_is', 'Te_eV'];
    case 'expression': {
      const p = parseStartValues(s.params);
      return p.ok ? Object.keys(p.value) : [];
    }
  }
}

const num = (text: string): number | null | undefined => {
  if (text.trim() === '') return null;
  const v = Number(text);
  return Number.isFinite(v) ? v : undefined;
};

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

  // Steering: fixed values and bounds for the model's parameters.
  const fixed: Record<string, number> = {};
  const bounds: Record<string, [number | null, number | null]> = {};
  for (const name of parameterNames(s)) {
    const row = s.steer[name];
    if (!row) continue;
    if (row.fixed) {
      const v = num(row.value);
      if (v === null || v === undefined) errors[`fixed.${name}`] = `Give the value ${name} is held at`;
      else fixed[name] = v;
      continue;
    }
    const lo = num(row.lo);
    const hi = num(row.hi);
    if (lo === undefined || hi === undefined) errors[`bounds.${name}`] = 'A bound is not a number';
    else if (lo !== null && hi !== null && !(lo < hi))
      errors[`bounds.${name}`] = 'The lowest value must be below the highest';
    else if (lo !== null || hi !== null) bounds[name] = [lo, hi];
  }

  const probe = PROBE_MODELS.has(s.model) ? probeFields(s, errors) : {};
  if (Object.keys(errors).length) return { ok: false, errors };
  const body: FitRequestBody = {
    source,
    model: s.model,
    y: s.y!,
    x: SINGLE_X.has(s.model) ? s.x[0]! : s.x,
    ...(s.model === 'expression' ? { expr: s.expr.trim() } : {}),
    ...(params ? { params } : {}),
    ...(Object.keys(filter).length ? { filter } : {}),
    ...(s.weights ? { weights: s.weights, sigmaMode: s.sigmaMode } : {}),
    ...(Object.keys(fixed).length ? { fixed } : {}),
    ...(Object.keys(bounds).length ? { bounds } : {}),
    ...(s.model === 'polytropic' && s.normalised ? { normalised: true } : {}),
    ...probe,
  };
  return { ok: true, body };
}

function probeFields(s: BuilderState, errors: Record<string, string>): Partial<FitRequestBody> {
  const out: Partial<FitRequestBody> = {};
  if (s.probe.slope) out.sheathSlope = true;
  if (s.model === 'probe-retarding') {
    const lo = num(s.probe.vMin);
    const hi = num(s.probe.vMax);
    if (lo === undefined || hi === undefined || (lo === null) !== (hi === null))
      errors.range = 'Give both ends of the voltage window, or neither for the automatic choice';
    else if (lo !== null && hi !== null) {
      if (!(lo < hi)) errors.range = 'The lowest voltage must be below the highest';
      else out.range = [lo, hi];
    }
  }
  // Density needs the area; without it the fit still gives I_is, V_f and Te.
  const area = num(s.probe.areaMm2);
  if (area === undefined || (area !== null && !(area > 0)))
    errors['probe.area_m2'] = 'The area is a positive number of mm²';
  else if (area !== null) {
    const mu = num(s.probe.mu);
    const h = num(s.probe.h);
    if (mu === null || mu === undefined || !(mu > 0))
      errors['probe.mu'] = 'The ion mass is a positive number of proton masses';
    else if (h === undefined || (h !== null && !(h > 0 && h <= 1))) errors['probe.h'] = 'h lies in (0, 1]';
    else out.probe = { area_m2: area * 1e-6, mu, ...(h !== null ? { h } : {}) };
  }
  return out;
}

/**
 * The form filled from a saved fit's request, with `start` (e.g. a failed fit's last iterate) as the
 * start values: the "start again from here" button.
 */
export function fromRequest(req: FitRequestBody, hasValid: boolean, start?: Record<string, number>): BuilderState {
  const s = initialState(hasValid);
  const xs = Array.isArray(req.x) ? req.x : [req.x];
  const steer: Record<string, SteerRow> = {};
  for (const [name, v] of Object.entries(req.fixed ?? {}))
    steer[name] = { ...EMPTY_STEER, fixed: true, value: String(v) };
  for (const [name, [lo, hi]] of Object.entries(req.bounds ?? {}))
    steer[name] = { ...EMPTY_STEER, lo: lo === null ? '' : String(lo), hi: hi === null ? '' : String(hi) };
  const startValues = start
    ? Object.fromEntries(Object.entries(start).filter(([name]) => req.fixed?.[name] === undefined))
    : req.params;
  const filter = req.filter ?? {};
  return {
    ...s,
    model: req.model,
    y: req.y,
    x: xs,
    expr: req.expr ?? '',
    params: startValues ? formatStartValues(startValues) : '',
    validOnly: hasValid && filter.valid !== undefined,
    ranges: Object.entries(filter)
      .filter(([name]) => name !== 'valid')
      .map(([column, c]) => ({
        column,
        min: typeof c.gte === 'number' ? String(c.gte) : '',
        max: typeof c.lte === 'number' ? String(c.lte) : '',
      })),
    weights: req.weights ?? null,
    sigmaMode: req.sigmaMode ?? 'relative',
    normalised: req.normalised === true,
    steer,
    probe: {
      areaMm2: req.probe ? String(req.probe.area_m2 * 1e6) : '',
      mu: req.probe ? String(req.probe.mu) : s.probe.mu,
      h: req.probe?.h !== undefined ? String(req.probe.h) : s.probe.h,
      vMin: req.range ? String(req.range[0]) : '',
      vMax: req.range ? String(req.range[1]) : '',
      slope: req.sheathSlope === true,
    },
  };
}
