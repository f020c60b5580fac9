import { NotFoundError, ValidationError, type ErrorDetail } from '../errors.js';
import { compileDerived } from '../derived/index.js';
import { allocateChunk, getModel, models, checkInputValue, resolveThresholds } from '../models/index.js';
import type { SweepColumnView } from '../contracts/sweeps.js';
import type { ModelDefinition, Thresholds } from '../models/types.js';
import { resolveAxis, type ResolvedAxis } from './axes.js';
import { makeAxisFiller } from './design.js';
import { fixedTemperature, resolveFixed, type ExpressionSource, type InputSource } from './fixed.js';
import { MAX_POINTS_HARD, MAX_STORED_COLUMNS } from './limits.js';
import { safeParseSweepDefinition, summarise } from './parse.js';
import { saltelliPointCount } from './sampling/saltelli.js';
import { inputSymbol, labelSweepErrors } from './labels.js';
import { recoverDefinition } from './recover.js';
import { nearestName } from '../suggest.js';
import { MAX_SOBOL_DIMENSIONS, MAX_SOBOL_INDEX } from './sampling/sobol.js';
import type { SweepDefinition } from './schema.js';

/** One column of a sweep's results, in storage/export order (declared once, with the api's response shapes). */
export type SweepColumn = SweepColumnView;

export interface ChunkResult {
  /** Index of the first point; point k of the chunk is idx0 + k. */
  idx0: number;
  n: number;
  /** Every input, output (booleans 0/1) and derived column, each of length n. */
  columns: Record<string, Float64Array>;
  /** Validity flag bit mask per point (bits per the model's flag specs). */
  flags: Uint32Array;
}

export interface PointEvaluation {
  idx: number;
  inputs: Record<string, number>;
  outputs: Record<string, number | boolean>;
  derived: Record<string, number>;
  flags: string[];
}

export interface CompiledSweep {
  definition: SweepDefinition;
  model: ModelDefinition;
  totalPoints: number;
  axes: ResolvedAxis[];
  columns: SweepColumn[];
  thresholds: Thresholds;
  /** All inputs of point i (canonical units). */
  pointAt(i: number): Record<string, number>;
  /** Evaluate points [i0, i1) into fresh column arrays: O(i1 - i0) memory. */
  evaluateChunk(i0: number, i1: number): ChunkResult;
  /** One point with named outputs and flag codes (ui preview, tests). */
  evaluatePointAt(i: number): PointEvaluation;
}

/** Largest number of corner points tried when checking expression-valued inputs. */
const MAX_CORNERS = 4096;

/**
 * Validate a definition (structure, then everything that needs the model) and build its evaluator.
 * Every problem is collected into one ValidationError whose details carry paths (`axes.1.max`,
 * `fixed.Ti_eV`, `derived.0.expr`, `thresholds.beta_max`).
 *
 * Expression-valued fixed inputs are range-checked at compile time at the corners of the axes they
 * depend on (every combination of each such axis' smallest and largest value); a violation rejects
 * the sweep. Interior points are not re-checked, so an expression that is out of range only inside
 * the box (non-monotonic) reaches the model, which then returns NaN or flags it.
 */
export function compileSweep(raw: unknown): CompiledSweep {
  const result = checkSweep(raw);
  if (!result.ok) throw new ValidationError(summarise(result.errors), result.errors);
  return result.compiled;
}

/** As compileSweep, but returns the errors instead of throwing (for previews). */
export function checkSweep(raw: unknown): { ok: true; compiled: CompiledSweep } | { ok: false; errors: ErrorDetail[] } {
  const parsed = safeParseSweepDefinition(raw);
  if (parsed.ok) {
    const result = checkDefinition(parsed.definition);
    return result.ok ? result : { ok: false, errors: labelSweepErrors(result.errors, raw) };
  }
  // One structural problem must not hide the others: check what did parse (the broken parts left
  // out) against the model as well, and report both, each with its own path.
  const errors = [...parsed.errors];
  const rest = recoverDefinition(raw, parsed.errors);
  if (rest) {
    const more = checkDefinition(rest.definition);
    if (!more.ok) {
      const seen = new Set(errors.map((e) => e.path));
      for (const e of more.errors) {
        const path = rest.originalPath(e.path);
        if (!seen.has(path)) errors.push({ ...e, path });
      }
    }
  }
  return { ok: false, errors: labelSweepErrors(errors, raw) };
}

/** The model-level checks of a structurally valid definition. */
function checkDefinition(
  definition: SweepDefinition,
): { ok: true; compiled: CompiledSweep } | { ok: false; errors: ErrorDetail[] } {
  const errors: ErrorDetail[] = [];

  let model: ModelDefinition;
  try {
    model = getModel(definition.model);
  } catch (err) {
    if (!(err instanceof NotFoundError)) throw err;
    const known = models.map((m) => m.id).join(', ');
    return {
      ok: false,
      errors: [{ path: 'model', message: `unknown model "${definition.model}"; known models: ${known}` }],
    };
  }

  // Axes: each names a model input once.
  const grid = definition.sampling.kind === 'grid';
  const axisOf = new Map<string, number>();
  definition.axes.forEach((axis, i) => {
    if (!axisOf.has(axis.param)) axisOf.set(axis.param, i);
  });
  const seen = new Set<string>();
  const axes: (ResolvedAxis | null)[] = definition.axes.map((axis, i) => {
    const spec = model.inputs.find((s) => s.name === axis.param);
    if (!spec) {
      const names = model.inputs.map((s) => s.name);
      const near = nearestName(axis.param, names);
      errors.push({
        path: `axes.${i}.param`,
        message: `\`${axis.param}\` is not an input of ${model.title}${near ? `; did you mean \`${near}\`?` : ` (inputs: ${names.join(', ')})`}`,
      });
      return null;
    }
    if (seen.has(axis.param)) {
      errors.push({
        path: `axes.${i}.param`,
        message: `${inputSymbol(model, axis.param)} is already swept by axis ${axisOf.get(axis.param)! + 1}`,
      });
      return null;
    }
    seen.add(axis.param);
    const pressureT = spec.pressureAt ? fixedTemperature(model, spec.pressureAt, definition.fixed, axisOf) : undefined;
    return resolveAxis(axis, i, spec, grid, errors, pressureT);
  });

  const { sources, order } = resolveFixed(model, definition.fixed, axisOf, errors);

  let thresholds: Thresholds = {};
  try {
    thresholds = resolveThresholds(model, definition.thresholds);
  } catch (err) {
    if (!(err instanceof ValidationError)) throw err;
    errors.push(...(err.details ?? [{ path: 'thresholds', message: err.message }]));
  }

  const totalPoints = designPoints(definition, axes);
  if (totalPoints > MAX_POINTS_HARD)
    errors.push({
      path: 'axes',
      message: `${totalPoints.toLocaleString('en-US')} points exceed the limit of ${MAX_POINTS_HARD.toLocaleString('en-US')}`,
    });
  if (definition.sampling.kind === 'sobol') {
    if (axes.length > MAX_SOBOL_DIMENSIONS)
      errors.push({ path: 'axes', message: `Sobol sampling supports at most ${MAX_SOBOL_DIMENSIONS} axes` });
    const skip = definition.sampling.skip ?? 0;
    if (skip + totalPoints - 1 > MAX_SOBOL_INDEX)
      errors.push({ path: 'sampling.skip', message: `skip + samples must stay below 2^32` });
  }

  // Derived columns read inputs and outputs by name; compileDerived also rejects name clashes.
  let derived: ReturnType<typeof compileDerived> | null = null;
  if (definition.derived.length) {
    try {
      derived = compileDerived(definition.derived, [
        ...model.inputs.map((s) => s.name),
        ...model.outputs.map((o) => o.name),
      ]);
    } catch (err) {
      const details = (err as { details?: ErrorDetail[] }).details;
      errors.push(...(details?.length ? details : [{ path: 'derived', message: (err as Error).message }]));
    }
    // Every input, output and derived column takes one stored numeric slot.
    const fixedColumns = model.inputs.length + model.outputs.length;
    if (fixedColumns + definition.derived.length > MAX_STORED_COLUMNS) {
      errors.push({
        path: 'derived',
        message: `${model.id} stores ${fixedColumns} input and output columns, so a sweep of it may add at most ${MAX_STORED_COLUMNS - fixedColumns} derived columns (got ${definition.derived.length})`,
      });
    }
  }

  if (errors.length === 0) {
    checkExpressionCorners(model, sources, order, axes as ResolvedAxis[], errors);
  }
  if (errors.length) return { ok: false, errors };

  const compiled = buildEvaluator(
    definition,
    model,
    axes as ResolvedAxis[],
    sources,
    order,
    thresholds,
    totalPoints,
    derived,
  );
  return { ok: true, compiled };
}

/** Points the design runs: grid product, `samples` for random designs, N·(d + 2) for Saltelli. */
function designPoints(definition: SweepDefinition, axes: readonly (ResolvedAxis | null)[]): number {
  const s = definition.sampling;
  if (s.kind === 'grid') return axes.reduce((n, a) => n * (a?.count ?? 1), 1);
  if (s.kind === 'saltelli') return saltelliPointCount(s.samples, definition.axes.length);
  return s.samples;
}

/** Evaluate expression inputs at the corners of the axes they depend on and range-check them. */
function checkExpressionCorners(
  model: ModelDefinition,
  sources: InputSource[],
  order: ExpressionSource[],
  axes: ResolvedAxis[],
  errors: ErrorDetail[],
): void {
  if (order.length === 0) return;
  const byName = new Map(sources.map((s) => [s.name, s]));
  // Axes any expression reaches, directly or through another expression.
  const relevant = new Set<number>();
  const visit = (name: string, seen: Set<string>): void => {
    if (seen.has(name)) return;
    seen.add(name);
    const s = byName.get(name)!;
    if (s.kind === 'axis') relevant.add(s.axis);
    if (s.kind === 'expression') s.deps.forEach((d) => visit(d, seen));
  };
  order.forEach((e) => visit(e.name, new Set()));
  const rel = [...relevant];
  const corners = Math.min(2 ** rel.length, MAX_CORNERS);

  const scope: Record<string, number> = {};
  for (const s of sources) if (s.kind === 'constant') scope[s.name] = s.value;
  for (const s of sources) if (s.kind === 'axis') scope[s.name] = axes[s.axis]!.min;
  const reported = new Set<string>();
  for (let c = 0; c < corners; c++) {
    rel.forEach((a, bit) => {
      const axis = axes[a]!;
      scope[axis.param] = (c >> bit) & 1 ? axis.max : axis.min;
    });
    for (const e of order) {
      let value: number;
      try {
        value = Number(e.fn(scope));
      } catch (err) {
        if (!reported.has(e.name)) {
          reported.add(e.name);
          errors.push({ path: `fixed.${e.name}`, message: `cannot be evaluated: ${(err as Error).message}` });
        }
        continue;
      }
      scope[e.name] = value;
      const spec = model.inputs.find((s) => s.name === e.name)!;
      const message = checkInputValue(spec, value);
      if (message && !reported.has(e.name)) {
        reported.add(e.name);
        const at = rel.map((a) => `${axes[a]!.param} = ${scope[axes[a]!.param]}`).join(', ');
        errors.push({
          path: `fixed.${e.name}`,
          message: `"${e.expr}" leaves the allowed range${at ? ` at ${at}` : ''}: ${message}`,
        });
      }
    }
  }
}

function buildEvaluator(
  definition: SweepDefinition,
  model: ModelDefinition,
  axes: ResolvedAxis[],
  sources: InputSource[],
  order: ExpressionSource[],
  thresholds: Thresholds,
  totalPoints: number,
  derived: ReturnType<typeof compileDerived> | null,
): CompiledSweep {
  const fill = makeAxisFiller(definition.sampling, axes);
  const derivedNames: string[] = derived ? [...derived.names] : [];
  const columns = describeColumns(model, sources, definition, derivedNames);

  const evaluateChunk = (i0: number, i1: number): ChunkResult => {
    if (!Number.isSafeInteger(i0) || !Number.isSafeInteger(i1) || i0 < 0 || i1 < i0 || i1 > totalPoints) {
      throw new RangeError(`chunk [${i0}, ${i1}) outside the sweep's ${totalPoints} points`);
    }
    const n = i1 - i0;
    const inputs: Record<string, Float64Array> = {};
    for (const s of sources) inputs[s.name] = new Float64Array(n);
    fill(
      i0,
      n,
      axes.map((a) => inputs[a.param]!),
    );
    for (const s of sources) if (s.kind === 'constant') inputs[s.name]!.fill(s.value);
    if (order.length) {
      // A Map scope goes to mathjs unwrapped (a plain object would be wrapped on every call).
      const scope = new Map<string, number>();
      for (const e of order) {
        const col = inputs[e.name]!;
        if (e.copyOf) {
          col.set(inputs[e.copyOf]!);
          continue;
        }
        const deps = e.deps.map((d) => inputs[d]!);
        for (let k = 0; k < n; k++) {
          for (let j = 0; j < deps.length; j++) scope.set(e.deps[j]!, deps[j]![k]!);
          col[k] = Number(e.fn(scope));
        }
      }
    }
    const out = allocateChunk(model, n);
    model.evaluateChunk(inputs, n, out, thresholds);
    const all: Record<string, Float64Array> = { ...inputs, ...out.columns };
    if (derived) Object.assign(all, derived.evaluateChunk(all, n));
    return { idx0: i0, n, columns: all, flags: out.flags };
  };

  // Inputs alone (no model run) for one point.
  const pointAt = (i: number): Record<string, number> => {
    if (!Number.isSafeInteger(i) || i < 0 || i >= totalPoints)
      throw new RangeError(`point ${i} outside 0..${totalPoints - 1}`);
    const swept = axes.map(() => new Float64Array(1));
    fill(i, 1, swept);
    const values: Record<string, number> = {};
    for (const s of sources) {
      if (s.kind === 'constant') values[s.name] = s.value;
      if (s.kind === 'axis') values[s.name] = swept[s.axis]![0]!;
    }
    for (const e of order) values[e.name] = Number(e.fn(values));
    return values;
  };

  const evaluatePointAt = (i: number): PointEvaluation => {
    const chunk = evaluateChunk(i, i + 1);
    const inputs: Record<string, number> = {};
    for (const s of model.inputs) inputs[s.name] = chunk.columns[s.name]![0]!;
    const outputs: Record<string, number | boolean> = {};
    for (const o of model.outputs)
      outputs[o.name] = o.kind === 'boolean' ? chunk.columns[o.name]![0] !== 0 : chunk.columns[o.name]![0]!;
    const d: Record<string, number> = {};
    for (const name of derivedNames) d[name] = chunk.columns[name]![0]!;
    const mask = chunk.flags[0]!;
    return {
      idx: i,
      inputs,
      outputs,
      derived: d,
      flags: model.flags.filter((f) => mask & (1 << f.bit)).map((f) => f.code),
    };
  };

  return { definition, model, totalPoints, axes, columns, thresholds, pointAt, evaluateChunk, evaluatePointAt };
}

function describeColumns(
  model: ModelDefinition,
  sources: InputSource[],
  definition: SweepDefinition,
  derivedNames: string[],
): SweepColumn[] {
  const sourceOf = new Map(sources.map((s) => [s.name, s]));
  const cols: SweepColumn[] = [
    { name: 'idx', kind: 'index', unit: '1', type: 'int', meaning: 'Point index within the sweep (0-based).' },
  ];
  for (const spec of model.inputs) {
    const s = sourceOf.get(spec.name)!;
    const source = s.kind === 'axis' ? 'axis' : s.kind === 'expression' ? 'expression' : s.from;
    const how = s.kind === 'expression' ? ` Computed as ${s.expr}.` : '';
    cols.push({
      name: spec.name,
      kind: 'input',
      unit: spec.unit,
      type: spec.integer ? 'int' : 'float',
      meaning: spec.meaning + how,
      source,
    });
  }
  for (const o of model.outputs) {
    cols.push({
      name: o.name,
      kind: 'output',
      unit: o.unit,
      type: o.kind === 'boolean' ? 'boolean' : 'float',
      meaning: o.meaning,
    });
  }
  derivedNames.forEach((name) => {
    const d = definition.derived.find((x) => x.name === name);
    cols.push({
      name,
      kind: 'derived',
      unit: '',
      type: 'float',
      meaning: d ? `Derived: ${d.expr}` : 'Derived column.',
    });
  });
  const bits = model.flags.map((f) => `bit ${f.bit} ${f.code}`).join(', ');
  cols.push({
    name: 'flags',
    kind: 'flags',
    unit: '',
    type: 'mask',
    meaning: `Validity flag bit mask (${bits || 'no flags'}).`,
  });
  return cols;
}
