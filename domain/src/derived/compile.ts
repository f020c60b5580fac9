/**
 * Derived columns (SPEC §3.4): named per-point columns computed from a sweep's inputs and outputs
 * by restricted mathjs expressions, compiled once per sweep.
 *
 * A derived column may also use the derived columns defined before it. A non-numeric result
 * (which the whitelist makes nearly impossible) becomes NaN in a chunk; booleans become 1/0;
 * sqrt/log of negative numbers give NaN (mathjs `predictable` mode), never complex numbers.
 */
import { ValidationError, type ErrorDetail } from '../errors.js';
import { EXPRESSION_CONSTANT_NAMES } from '../expression-constants.js';
import { ALLOWED_FUNCTIONS, BLOCKED_FUNCTIONS, compileExpression, type CompiledExpression } from './security.js';

export interface DerivedDef {
  name: string;
  expr: string;
}

export interface CompiledDerived {
  /** Derived column names, in definition order. */
  names: string[];
  /** Compute every derived column for points [0, n) from `columns` (inputs and outputs, length ≥ n). */
  evaluateChunk(columns: Record<string, Float64Array>, n: number): Record<string, Float64Array>;
  /** Compute the derived values of one point from its input and output values. */
  evaluatePoint(values: Record<string, number>): Record<string, number>;
}

const IDENTIFIER = /^[A-Za-z][A-Za-z0-9_]{0,63}$/;
const RESERVED = new Set([
  'pi',
  'e',
  'i',
  'Infinity',
  'NaN',
  'true',
  'false',
  'null',
  'undefined',
  'idx',
  'flags',
  'valid',
]);

/**
 * Check and compile derived-column definitions against `symbols` (the model's input and output
 * names). Every problem is reported at once as `derived.<i>.name` / `derived.<i>.expr`.
 */
export function compileDerived(defs: readonly DerivedDef[], symbols: readonly string[]): CompiledDerived {
  const details: ErrorDetail[] = [];
  const known = new Set(symbols);
  const names: string[] = [];
  const compiled: CompiledExpression[] = [];
  if (!Array.isArray(defs as unknown)) {
    throw new ValidationError('derived must be a list of { name, expr }', [
      { path: 'derived', message: 'expected a list of { name, expr }' },
    ]);
  }

  defs.forEach((def, i) => {
    const name = def?.name;
    const namePath = `derived.${i}.name`;
    let nameOk = false;
    if (typeof name !== 'string' || !IDENTIFIER.test(name)) {
      details.push({
        path: namePath,
        message: `name must start with a letter and use only letters, digits and "_" (at most 64), got ${JSON.stringify(name)}`,
      });
    } else if (known.has(name)) {
      details.push({ path: namePath, message: `"${name}" is already an input or output of the model` });
    } else if (names.includes(name)) {
      details.push({ path: namePath, message: `"${name}" is defined twice` });
    } else if (
      RESERVED.has(name) ||
      EXPRESSION_CONSTANT_NAMES.has(name) ||
      ALLOWED_FUNCTIONS.has(name) ||
      BLOCKED_FUNCTIONS.has(name)
    ) {
      details.push({ path: namePath, message: `"${name}" is a reserved name` });
    } else {
      nameOk = true;
    }
    const exprPath = `derived.${i}.expr`;
    try {
      // Earlier derived columns are visible to later ones.
      const fn = compileExpression(def?.expr as string, [...known, ...names], exprPath);
      const sample = sampleCheck(fn, exprPath);
      if (sample) details.push(sample);
      compiled.push(fn);
    } catch (err) {
      if (err instanceof ValidationError && err.details) details.push(...err.details);
      else throw err;
    }
    if (nameOk) names.push(name as string);
  });

  if (details.length) {
    throw new ValidationError(
      `Invalid derived columns: ${details.map((d) => `${d.path}: ${d.message}`).join('; ')}`,
      details,
    );
  }

  return {
    names,
    evaluateChunk(columns, n) {
      // Only the columns some expression reads are copied into the scope per point.
      const needed = new Set<string>();
      for (const fn of compiled) for (const sym of fn.symbols) if (!names.includes(sym)) needed.add(sym);
      const keys: string[] = [];
      const cols: Float64Array[] = [];
      for (const sym of needed) {
        const col = columns[sym];
        if (!col || col.length < n)
          throw new Error(`derived evaluateChunk: column ${sym} missing or shorter than ${n}`);
        keys.push(sym);
        cols.push(col);
      }
      const scope = new Map<string, number>();
      const outCols = names.map(() => new Float64Array(n));
      for (let k = 0; k < n; k++) {
        for (let s = 0; s < keys.length; s++) scope.set(keys[s]!, cols[s]![k]!);
        for (let j = 0; j < compiled.length; j++) {
          const v = compiled[j]!(scope);
          outCols[j]![k] = v;
          scope.set(names[j]!, v);
        }
      }
      const result: Record<string, Float64Array> = {};
      names.forEach((nm, j) => (result[nm] = outCols[j]!));
      return result;
    },
    evaluatePoint(values) {
      const scope = new Map<string, number>(Object.entries(values));
      const result: Record<string, number> = {};
      for (let j = 0; j < compiled.length; j++) {
        const v = compiled[j]!(scope);
        result[names[j]!] = v;
        scope.set(names[j]!, v);
      }
      return result;
    },
  };
}

/** Evaluate once with every symbol = 1.5 to catch calls that cannot work and non-numeric results. */
function sampleCheck(fn: CompiledExpression, path: string): ErrorDetail | null {
  const scope = new Map<string, number>();
  for (const s of fn.symbols) scope.set(s, 1.5);
  let v: unknown;
  try {
    v = fn.raw(scope);
  } catch (err) {
    return { path, message: `expression cannot be evaluated: ${(err as Error).message}` };
  }
  if (typeof v === 'number' || typeof v === 'boolean') return null;
  const kind = v && typeof v === 'object' && 'type' in v ? String((v as { type: unknown }).type) : typeof v;
  return { path, message: `expression does not give a number (it gives a ${kind})` };
}
