import { parse, type MathNode } from 'mathjs';
import type { ErrorDetail } from '../errors.js';
import { compileExpression } from '../derived/index.js';
import { checkInputValue } from '../models/index.js';
import type { ModelDefinition } from '../models/types.js';
import { densityFromPressure, parseQuantity, pressureInPascal } from '../units/index.js';
import { math } from '../units/math.js';
import { nearestName, unknownSymbolMessage } from '../suggest.js';
import { ambiguousSymbol, EXPRESSION_CONSTANT_NAMES } from '../expression-constants.js';

/** How each model input gets its value in a sweep. */
export type InputSource =
  | { name: string; kind: 'axis'; axis: number }
  | { name: string; kind: 'constant'; value: number; from: 'fixed' | 'default' }
  | {
      name: string;
      kind: 'expression';
      expr: string;
      /** Inputs the expression reads. */
      deps: string[];
      /** Set when the expression is a bare input name: the column is a copy. */
      copyOf: string | null;
      fn: (scope: Record<string, number> | Map<string, number>) => number;
    };

export type ExpressionSource = Extract<InputSource, { kind: 'expression' }>;

/** Symbol names an expression mentions (function names excluded); null when it does not parse. */
function symbolsOf(text: string): Set<string> | null {
  let node: MathNode;
  try {
    node = parse(text);
  } catch {
    return null;
  }
  const names = new Set<string>();
  const fnNames = new Set<MathNode>();
  node.traverse((n) => {
    if ((n as { isFunctionNode?: boolean }).isFunctionNode) fnNames.add((n as unknown as { fn: MathNode }).fn);
  });
  node.traverse((n) => {
    if ((n as { isSymbolNode?: boolean }).isSymbolNode && !fnNames.has(n))
      names.add((n as unknown as { name: string }).name);
  });
  return names;
}

function detailsOf(err: unknown, path: string): ErrorDetail[] {
  const details = (err as { details?: ErrorDetail[] }).details;
  if (details?.length) return details.map((d) => ({ ...d, path: d.path || path }));
  return [{ path, message: (err as Error).message }];
}

/**
 * Read `fixed` against the model: numbers (canonical), strings with units, or expressions over other
 * inputs. A string that mentions another input's name is an expression; anything else is a quantity.
 * Inputs neither fixed nor swept take the model default. Returns the sources in model input order and
 * the expression inputs in evaluation (topological) order.
 */
export function resolveFixed(
  model: ModelDefinition,
  fixed: Record<string, number | string>,
  axisOf: Map<string, number>,
  errors: ErrorDetail[],
): { sources: InputSource[]; order: ExpressionSource[] } {
  const inputNames = model.inputs.map((s) => s.name);
  const known = new Set(inputNames);
  const byName = new Map<string, InputSource>();

  for (const [name, raw] of Object.entries(fixed)) {
    const path = `fixed.${name}`;
    const spec = model.inputs.find((s) => s.name === name);
    if (!spec) {
      const near = nearestName(name, inputNames);
      errors.push({
        path,
        message: `\`${name}\` is not an input of ${model.title}${near ? `; did you mean \`${near}\`?` : ` (inputs: ${inputNames.join(', ')})`}`,
      });
      continue;
    }
    if (axisOf.has(name)) {
      errors.push({ path, message: `is also swept along an axis; an input is either fixed or swept` });
      continue;
    }
    if (typeof raw === 'number') {
      const message = checkInputValue(spec, raw);
      if (message) errors.push({ path, message });
      byName.set(name, { name, kind: 'constant', value: raw, from: 'fixed' });
      continue;
    }
    const text = raw.trim();
    const pPa = spec.pressureAt ? pressureInPascal(text) : null;
    if (pPa !== null) {
      const t = fixedTemperature(model, spec.pressureAt!, fixed, axisOf);
      if (t === null) {
        errors.push({
          path,
          message: `a pressure converts to ${spec.name} at a fixed ${spec.pressureAt}; ${spec.pressureAt} is swept or computed here, so give ${spec.name} in ${spec.unit}`,
        });
        continue;
      }
      const value = densityFromPressure(pPa, t);
      const message = checkInputValue(spec, value);
      if (message) errors.push({ path, message: `${message} (from ${text} at ${spec.pressureAt} = ${t})` });
      byName.set(name, { name, kind: 'constant', value, from: 'fixed' });
      continue;
    }
    const symbols = symbolsOf(text);
    const deps = symbols ? [...symbols].filter((s) => known.has(s)) : [];
    // A name that is neither an input nor a unit is a typo of an input far more often than an unknown
    // unit: say so instead of the unit parser's 'Unit "Te" not found'.
    const stranger = symbols
      ? [...symbols].find(
          (s) =>
            !known.has(s) &&
            !math.Unit.isValuelessUnit(s) &&
            !EXPRESSION_CONSTANT_NAMES.has(s) &&
            s !== 'pi' &&
            ambiguousSymbol(s) === null,
        )
      : undefined;
    if (stranger !== undefined) {
      errors.push({ path, message: unknownSymbolMessage(stranger, inputNames) });
      continue;
    }
    if (deps.length === 0) {
      try {
        const value = parseQuantity(path, text, spec.unit);
        const message = checkInputValue(spec, value);
        if (message) errors.push({ path, message });
        byName.set(name, { name, kind: 'constant', value, from: 'fixed' });
      } catch (err) {
        // A closed expression over the physical constants ("39.948 * m_u / m_p") is a constant too.
        const value = constantExpressionValue(text, path);
        if (value !== null) {
          const message = checkInputValue(spec, value);
          if (message) errors.push({ path, message });
          byName.set(name, { name, kind: 'constant', value, from: 'fixed' });
          continue;
        }
        errors.push(
          ...detailsOf(err, path).map((d) => ({
            ...d,
            path,
            message: `${d.message}; or write an expression over other inputs such as "2*${inputNames.find((n) => n !== name) ?? 'x'}"`,
          })),
        );
      }
      continue;
    }
    if (deps.includes(name)) {
      errors.push({ path, message: `refers to itself` });
      continue;
    }
    try {
      const fn = compileExpression(
        text,
        inputNames.filter((n) => n !== name),
        path,
      );
      const copyOf = known.has(text) ? text : null;
      byName.set(name, { name, kind: 'expression', expr: text, deps, copyOf, fn });
    } catch (err) {
      errors.push(...detailsOf(err, path));
    }
  }

  const sources: InputSource[] = model.inputs.map((spec) => {
    const axis = axisOf.get(spec.name);
    if (axis !== undefined) return { name: spec.name, kind: 'axis', axis };
    return byName.get(spec.name) ?? { name: spec.name, kind: 'constant', value: spec.default, from: 'default' };
  });

  return { sources, order: topologicalOrder(sources, errors) };
}

/**
 * The temperature a pressure converts at: the fixed value of input `tName` (number or quantity
 * string) or its default; null when it is swept, an expression or unreadable.
 */
export function fixedTemperature(
  model: ModelDefinition,
  tName: string,
  fixed: Record<string, number | string>,
  axisOf: Map<string, number>,
): number | null {
  const spec = model.inputs.find((s) => s.name === tName);
  if (!spec || axisOf.has(tName)) return null;
  const raw = fixed[tName];
  if (raw === undefined) return spec.default;
  try {
    const t = parseQuantity(`fixed.${tName}`, raw, spec.unit);
    return checkInputValue(spec, t) ? null : t;
  } catch {
    return null;
  }
}

/** The value of an expression with no input symbols (numbers, pi, q_e, m_p, …), or null if it is not one. */
function constantExpressionValue(text: string, path: string): number | null {
  try {
    const fn = compileExpression(text, [], path);
    const v = fn(new Map());
    return Number.isFinite(v) ? v : null;
  } catch {
    return null;
  }
}

/** Kahn's algorithm over expression inputs; anything left over sits on a cycle. */
function topologicalOrder(sources: InputSource[], errors: ErrorDetail[]): ExpressionSource[] {
  const exprs = new Map<string, ExpressionSource>();
  for (const s of sources) if (s.kind === 'expression') exprs.set(s.name, s);
  const pending = new Map<string, number>();
  for (const e of exprs.values()) pending.set(e.name, e.deps.filter((d) => exprs.has(d)).length);
  const order: ExpressionSource[] = [];
  const ready = [...pending].filter(([, k]) => k === 0).map(([n]) => n);
  while (ready.length) {
    const name = ready.shift()!;
    order.push(exprs.get(name)!);
    for (const e of exprs.values()) {
      if (e.deps.includes(name)) {
        const k = pending.get(e.name)! - 1;
        pending.set(e.name, k);
        if (k === 0) ready.push(e.name);
      }
    }
  }
  const cyclic = [...pending].filter(([, k]) => k > 0).map(([n]) => n);
  for (const name of cyclic) {
    const others = cyclic.filter((n) => n !== name);
    errors.push({
      path: `fixed.${name}`,
      message: `expressions form a cycle (${[name, ...others].join(' → ')}); break it with a number or an axis`,
    });
  }
  return order;
}
