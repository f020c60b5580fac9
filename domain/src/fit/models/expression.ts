import { all, create, type MathNode } from 'mathjs';
import { ALLOWED_OPERATORS } from '../../derived/security.js';
import { ValidationError, type ErrorDetail } from '../../errors.js';
import { ambiguousSymbol, EXPRESSION_CONSTANT_NAMES, EXPRESSION_CONSTANT_VALUES } from '../../expression-constants.js';
import { resolveBounds, validationFail, type CheckedData } from '../input.js';
import type { CompiledModel, FitInput } from '../types.js';

// `predictable`: results keep the type of their inputs, so sqrt(-1) is NaN rather than a Complex.
const math = create(all, { predictable: true });

/**
 * Functions an expression may call. A whitelist rather than a blacklist: nothing that defines,
 * imports, parses or evaluates (import, createUnit, evaluate, parse, simplify …) is reachable.
 */
const FUNCTIONS = new Set([
  'exp',
  'expm1',
  'log',
  'log10',
  'log2',
  'log1p',
  'sqrt',
  'cbrt',
  'nthRoot',
  'pow',
  'square',
  'cube',
  'abs',
  'sign',
  'min',
  'max',
  'hypot',
  'floor',
  'ceil',
  'round',
  'mod',
  'sin',
  'cos',
  'tan',
  'sec',
  'csc',
  'cot',
  'asin',
  'acos',
  'atan',
  'atan2',
  'sinh',
  'cosh',
  'tanh',
  'asinh',
  'acosh',
  'atanh',
  'erf',
]);
// A bare `e` is refused (ambiguous: elementary charge or Euler's number); physical constants come
// from expression-constants.ts under unambiguous names (q_e, m_e, …), shadowed by x columns/params.
const CONSTANTS = new Set(['pi', 'PI', 'E', 'tau', ...EXPRESSION_CONSTANT_NAMES]);
export const MAX_EXPRESSION_LENGTH = 2000;

export interface ParsedExpression {
  symbols: Set<string>;
  evaluate: (scope: Record<string, number>) => unknown;
}

/** Parses and checks an expression; every rejected construct is named in the error details. */
export function parseExpression(expr: string): ParsedExpression {
  if (typeof expr !== 'string' || expr.trim() === '')
    validationFail('expr', 'an expression is required for model "expression"');
  if (expr.length > MAX_EXPRESSION_LENGTH)
    validationFail('expr', `is ${expr.length} characters long; the limit is ${MAX_EXPRESSION_LENGTH}`);
  let node: MathNode;
  try {
    node = math.parse(expr);
  } catch (err) {
    validationFail('expr', `cannot be parsed: ${(err as Error).message}`);
  }
  const problems: string[] = [];
  const symbols = new Set<string>();
  node.traverse((nd, _path, parent) => {
    switch (nd.type) {
      case 'ConstantNode':
        if (typeof (nd as unknown as { value: unknown }).value !== 'number')
          problems.push(`only numeric constants are allowed (found ${nd.toString()})`);
        return;
      case 'ParenthesisNode':
      case 'ConditionalNode':
      case 'RelationalNode':
        return;
      case 'OperatorNode': {
        const fn = (nd as unknown as { fn: string }).fn;
        if (!ALLOWED_OPERATORS.has(fn))
          problems.push(`operator ${(nd as unknown as { op: string }).op} is not allowed`);
        return;
      }
      case 'FunctionNode': {
        const fnNode = (nd as unknown as { fn: MathNode }).fn;
        const name = fnNode.type === 'SymbolNode' ? (fnNode as unknown as { name: string }).name : undefined;
        if (!name || !FUNCTIONS.has(name))
          problems.push(`function ${name ?? fnNode.toString()} is not allowed (allowed: ${[...FUNCTIONS].join(', ')})`);
        return;
      }
      case 'SymbolNode': {
        const isCallee = parent?.type === 'FunctionNode' && (parent as unknown as { fn: MathNode }).fn === nd;
        const ambiguous = isCallee ? null : ambiguousSymbol((nd as unknown as { name: string }).name);
        if (ambiguous) problems.push(ambiguous);
        else if (!isCallee) symbols.add((nd as unknown as { name: string }).name);
        return;
      }
      default:
        problems.push(
          `${nd.type} is not allowed (assignments, indexing, matrices, ranges, strings and units are not part of a fit expression)`,
        );
    }
  });
  if (problems.length > 0) {
    const unique = [...new Set(problems)];
    throw new ValidationError(
      `expr: ${unique.join('; ')}`,
      unique.map((message) => ({ path: 'expr', message })),
    );
  }
  const compiled = node.compile();
  return { symbols, evaluate: (scope) => compiled.evaluate(scope) as number };
}

/** A mathjs expression over x columns with named parameters (all need start values). */
export function compileExpression(input: FitInput, data: CheckedData): CompiledModel {
  const parsed = parseExpression(input.expr ?? '');
  const given = input.params ?? {};
  const names = Object.keys(given);
  const details: ErrorDetail[] = [];
  const unknown = [...parsed.symbols].filter(
    (s) => !data.xNames.includes(s) && !Object.hasOwn(given, s) && !CONSTANTS.has(s),
  );
  if (unknown.length > 0) {
    details.push({
      path: 'expr',
      message: `unknown symbol(s) ${unknown.join(', ')}: each must be an x column (${data.xNames.join(', ')}) or a parameter with a start value in params`,
    });
  }
  if (names.length === 0)
    details.push({ path: 'params', message: 'give every parameter of the expression a start value, e.g. { "b1": 1 }' });
  for (const name of names) {
    if (data.xNames.includes(name))
      details.push({ path: `params.${name}`, message: 'is also an x column; rename one of them' });
    else if (!parsed.symbols.has(name))
      details.push({ path: `params.${name}`, message: 'does not appear in expr, so it cannot be fitted' });
    if (!Number.isFinite(given[name]))
      details.push({ path: `params.${name}`, message: `start value must be a finite number, got ${given[name]}` });
  }
  if (details.length > 0) throw new ValidationError(details.map((d) => `${d.path}: ${d.message}`).join('; '), details);

  const { n } = data;
  const start = Float64Array.from(names.map((k) => given[k]!));
  const { min, max } = resolveBounds(input, names, start);
  const scope: Record<string, number> = { ...EXPRESSION_CONSTANT_VALUES };
  const cols = data.x;
  const evaluate = (p: Float64Array, out: Float64Array): void => {
    for (let j = 0; j < names.length; j++) scope[names[j]!] = p[j]!;
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < cols.length; k++) scope[data.xNames[k]!] = cols[k]![i]!;
      let v: unknown;
      try {
        v = parsed.evaluate(scope);
      } catch {
        v = NaN; // e.g. a domain error inside a function: the point is unusable at these parameters
      }
      out[i] = typeof v === 'number' ? v : typeof v === 'boolean' ? Number(v) : NaN;
    }
  };
  return { paramNames: names, start, min, max, n, evaluate };
}
