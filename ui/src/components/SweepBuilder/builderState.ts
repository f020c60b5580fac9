/**
 * The sweep builder's form state and its two-way mapping to a sweep definition (SPEC §4). The
 * form keeps what was typed (strings), so a draft survives a re-sign-in exactly as left; the
 * definition is built from it on every change and checked with domain's checkSweep.
 */
import { models, type InputSpec, type ModelDefinition } from '@driftgrid/domain';

export type InputMode = 'default' | 'fixed' | 'axis';
export type AxisKind = 'linear' | 'log' | 'list';
export type SamplingKind = 'grid' | 'latin-hypercube' | 'sobol' | 'saltelli';

export interface InputChoice {
  mode: InputMode;
  /** Fixed: a number, a unit string or an expression over other inputs. */
  value: string;
  kind: AxisKind;
  min: string;
  max: string;
  count: string;
  /** List axis: comma-separated values, each a number or a unit string. */
  values: string;
}

export interface BuilderState {
  model: string;
  name: string;
  description: string;
  /** Per model, so switching models and back keeps what was typed. */
  inputs: Record<string, Record<string, InputChoice>>;
  /** Order in which inputs became axes (the definition's axes order). */
  axisOrder: Record<string, string[]>;
  sampling: { kind: SamplingKind; samples: string; seed: string };
  derived: { name: string; expr: string }[];
  tags: string[];
  visibility: 'private' | 'group';
}

/** Text of a value read from an imported definition (unknown JSON): objects as JSON, never "[object Object]". */
function asText(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'string') return v;
  if (typeof v === 'number' || typeof v === 'boolean' || typeof v === 'bigint') return String(v);
  return JSON.stringify(v);
}

export function emptyChoice(_spec: InputSpec): InputChoice {
  return { mode: 'default', value: '', kind: 'linear', min: '', max: '', count: '11', values: '' };
}

export function initialState(modelId = 'cross-field'): BuilderState {
  return {
    model: modelId,
    name: '',
    description: '',
    inputs: {},
    axisOrder: {},
    sampling: { kind: 'grid', samples: '1000', seed: '1' },
    derived: [],
    tags: [],
    visibility: 'private',
  };
}

export function modelOf(state: BuilderState): ModelDefinition | undefined {
  return models.find((m) => m.id === state.model);
}

export function choiceOf(state: BuilderState, spec: InputSpec): InputChoice {
  return state.inputs[state.model]?.[spec.name] ?? emptyChoice(spec);
}

/** Axes in definition order: those in axisOrder first, then any other axis-mode input. */
export function axisNames(state: BuilderState, model: ModelDefinition): string[] {
  const isAxis = (n: string) => state.inputs[model.id]?.[n]?.mode === 'axis';
  const order = (state.axisOrder[model.id] ?? []).filter(isAxis);
  for (const s of model.inputs) if (isAxis(s.name) && !order.includes(s.name)) order.push(s.name);
  return order;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/** A typed value as the definition holds it: plain numbers as numbers, anything else as text. */
export function quantity(text: string): number | string {
  const t = text.trim();
  return NUMBER.test(t) ? Number(t) : t;
}

function splitList(text: string): (number | string)[] {
  return text
    .split(/[,;\n]/)
    .map((s) => s.trim())
    .filter((s) => s !== '')
    .map(quantity);
}

function intOrText(text: string): number | string | undefined {
  const t = text.trim();
  if (t === '') return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
}

/** The definition the form describes (unvalidated; checkSweep judges it). */
export function toDefinition(state: BuilderState): Record<string, unknown> {
  const model = modelOf(state);
  const fixed: Record<string, number | string> = {};
  const axes: Record<string, unknown>[] = [];
  if (model) {
    for (const spec of model.inputs) {
      const c = choiceOf(state, spec);
      if (c.mode === 'fixed') fixed[spec.name] = quantity(c.value);
    }
    for (const name of axisNames(state, model)) {
      const c = state.inputs[model.id]![name]!;
      if (c.kind === 'list') axes.push({ param: name, kind: 'list', values: splitList(c.values) });
      else {
        const axis: Record<string, unknown> = { param: name, kind: c.kind, min: quantity(c.min), max: quantity(c.max) };
        const count = intOrText(c.count);
        if (count !== undefined) axis.count = count;
        axes.push(axis);
      }
    }
  }
  const s = state.sampling;
  const sampling: Record<string, unknown> = { kind: s.kind };
  if (s.kind !== 'grid') sampling.samples = intOrText(s.samples);
  if (s.kind === 'latin-hypercube') sampling.seed = intOrText(s.seed);
  const def: Record<string, unknown> = {
    name: state.name,
    model: state.model,
    fixed,
    axes,
    sampling,
    derived: state.derived.map((d) => ({ name: d.name.trim(), expr: d.expr })),
    tags: state.tags,
    visibility: state.visibility,
  };
  if (state.description.trim()) def.description = state.description;
  return def;
}

function text(v: unknown, unit?: string): string {
  if (typeof v === 'number') return unit ? `${v} ${unit}` : String(v);
  return typeof v === 'string' ? v : '';
}

/**
 * Form state from an imported or example definition. Axis `unit` fields are folded into the
 * values ("1" + "cm" → "1 cm"), which the definition format accepts as well.
 */
export function fromDefinition(raw: unknown): BuilderState {
  if (!raw || typeof raw !== 'object' || Array.isArray(raw)) throw new Error('A sweep definition is a JSON object');
  const d = raw as Record<string, unknown>;
  const modelId = typeof d.model === 'string' ? d.model : 'cross-field';
  const model = models.find((m) => m.id === modelId);
  if (!model) throw new Error(`Unknown model "${modelId}"; known models: ${models.map((m) => m.id).join(', ')}`);
  const state = initialState(modelId);
  state.name = typeof d.name === 'string' ? d.name : '';
  state.description = typeof d.description === 'string' ? d.description : '';
  const choices: Record<string, InputChoice> = {};
  const fixed = (d.fixed && typeof d.fixed === 'object' ? d.fixed : {}) as Record<string, unknown>;
  for (const [k, v] of Object.entries(fixed)) {
    const spec = model.inputs.find((s) => s.name === k);
    choices[k] = { ...(spec ? emptyChoice(spec) : emptyChoice(model.inputs[0]!)), mode: 'fixed', value: text(v) };
  }
  const order: string[] = [];
  for (const a of Array.isArray(d.axes) ? (d.axes as Record<string, unknown>[]) : []) {
    const param = asText(a.param ?? '');
    const unit = typeof a.unit === 'string' ? a.unit : undefined;
    const kind = (['linear', 'log', 'list'].includes(asText(a.kind)) ? a.kind : 'linear') as AxisKind;
    order.push(param);
    choices[param] = {
      mode: 'axis',
      value: choices[param]?.value ?? '',
      kind,
      min: text(a.min, unit),
      max: text(a.max, unit),
      count: a.count === undefined ? '' : asText(a.count),
      values: Array.isArray(a.values) ? (a.values as unknown[]).map((v) => text(v, unit)).join(', ') : '',
    };
  }
  state.inputs = { [modelId]: choices };
  state.axisOrder = { [modelId]: order };
  const s = (d.sampling && typeof d.sampling === 'object' ? d.sampling : { kind: 'grid' }) as Record<string, unknown>;
  const kind = (
    ['grid', 'latin-hypercube', 'sobol', 'saltelli'].includes(asText(s.kind)) ? s.kind : 'grid'
  ) as SamplingKind;
  state.sampling = {
    kind,
    samples: s.samples === undefined ? state.sampling.samples : asText(s.samples),
    seed: s.seed === undefined ? state.sampling.seed : asText(s.seed),
  };
  state.derived = Array.isArray(d.derived)
    ? (d.derived as Record<string, unknown>[]).map((x) => ({ name: asText(x.name ?? ''), expr: asText(x.expr ?? '') }))
    : [];
  state.tags = Array.isArray(d.tags) ? (d.tags as unknown[]).map(String) : [];
  state.visibility = d.visibility === 'group' ? 'group' : 'private';
  return state;
}

/**
 * Where an error path from checkSweep or the server belongs in the form: `axes.1.max` → the
 * max field of the input that is axis 1; `fixed.Ti_eV` → that input's value field.
 */
export function fieldKeyOf(path: string, state: BuilderState): string {
  const model = modelOf(state);
  const parts = path.split('.');
  if (parts[0] === 'axes' && parts.length >= 2 && model) {
    const name = axisNames(state, model)[Number(parts[1])];
    if (name) return parts.length >= 3 ? `input.${name}.${parts[2]}` : `input.${name}`;
    return 'axes';
  }
  if (parts[0] === 'fixed' && parts[1]) return `input.${parts[1]}.value`;
  if (parts[0] === 'sampling') return parts[1] ? `sampling.${parts[1]}` : 'sampling';
  return path;
}

/** Group error details by form field; several messages for one field are joined. */
export function errorsByField(
  details: readonly { path?: string; message: string }[],
  state: BuilderState,
): Record<string, string> {
  const out: Record<string, string> = {};
  for (const d of details) {
    const key = fieldKeyOf(d.path ?? '', state);
    out[key] = out[key] ? `${out[key]}; ${d.message}` : d.message;
  }
  return out;
}

/**
 * The part of the form a field key belongs to, for "edited yet?": `input.Te_eV.min` → `input.Te_eV`,
 * `derived.0.expr` → `derived.0`, `sampling.samples` → `sampling`, `tags.2` → `tags`.
 */
export function fieldGroupOf(key: string): string {
  const parts = key.split('.');
  if (parts[0] === 'input' || parts[0] === 'derived') return parts.slice(0, 2).join('.');
  return parts[0] ?? key;
}

/**
 * Errors for the parts of the form already edited (or all of them once the user tried to submit or
 * loaded a definition): an untouched empty form does not greet anyone with "must not be empty".
 */
export function shownErrors(
  byField: Record<string, string>,
  edited: ReadonlySet<string>,
  showAll: boolean,
): Record<string, string> {
  if (showAll) return byField;
  return Object.fromEntries(Object.entries(byField).filter(([k]) => edited.has(fieldGroupOf(k))));
}
