/**
 * The one place where user-written mathjs expressions are checked and compiled.
 *
 * mathjs's own parser is used, but the syntax tree is whitelisted before anything is compiled:
 * numbers, the allowed symbols, arithmetic / comparison / logical operators, parentheses, the
 * conditional `a ? b : c`, and calls of a fixed list of real functions. Everything else is
 * refused: assignment of any kind, function definitions, property access and indexing, matrices,
 * objects, strings, units, blocks, ranges, and the functions that reach back into mathjs
 * (`import`, `createUnit`, `evaluate`, `parse`, `compile`, `simplify`, `derivative`, …).
 * Compiled expressions are evaluated with a scope that holds only numbers.
 */
import { unknownSymbolMessage } from '../suggest.js';
import type { MathNode } from 'mathjs';
import { ValidationError, type ErrorDetail } from '../errors.js';
import { ambiguousSymbol, EXPRESSION_CONSTANT_NAMES, EXPRESSION_CONSTANT_VALUES } from '../expression-constants.js';
import { math } from '../units/math.js';

/** Real functions an expression may call. */
export const ALLOWED_FUNCTIONS: ReadonlySet<string> = new Set([
  'abs',
  'sign',
  'sqrt',
  'cbrt',
  'nthRoot',
  'square',
  'cube',
  'exp',
  'expm1',
  'log',
  'log10',
  'log2',
  'log1p',
  'pow',
  'hypot',
  'min',
  'max',
  'floor',
  'ceil',
  'round',
  'fix',
  'mod',
  'sin',
  'cos',
  'tan',
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
]);

/** Functions named explicitly in the error message because they could escape the sandbox. */
export const BLOCKED_FUNCTIONS: ReadonlySet<string> = new Set([
  'import',
  'createUnit',
  'evaluate',
  'parse',
  'compile',
  'simplify',
  'derivative',
  'resolve',
  'parser',
  'config',
  'help',
  'chain',
  'typed',
  'reviver',
  'replacer',
  'unit',
  'splitUnit',
  'format',
  'print',
  'string',
]);

/** Constants an expression may use besides its symbols. */
const ALLOWED_CONSTANTS: ReadonlySet<string> = new Set(['pi']);

/**
 * Operator functions mathjs produces for the allowed operators (no `to`/`in` unit conversion). Shared by
 * derived columns and fit expressions.
 */
export const ALLOWED_OPERATORS: ReadonlySet<string> = new Set([
  'add',
  'subtract',
  'multiply',
  'divide',
  'pow',
  'unaryMinus',
  'unaryPlus',
  'mod',
  'dotMultiply',
  'dotDivide',
  'dotPow',
  'smaller',
  'larger',
  'smallerEq',
  'largerEq',
  'equal',
  'unequal',
  'and',
  'or',
  'not',
  'xor',
]);

export type ExpressionScope = Record<string, number>;

/** A compiled expression: call it with a scope of numbers; it always returns a number (NaN if not numeric). */
export interface CompiledExpression {
  (scope: ExpressionScope | Map<string, number>): number;
  /** The source text. */
  readonly expr: string;
  /** The allowed symbols the expression actually uses (for dependency ordering). */
  readonly symbols: readonly string[];
  /** The unconverted mathjs result; throws what mathjs throws. For compile-time checks. */
  readonly raw: (scope: ExpressionScope | Map<string, number>) => unknown;
}

function problem(path: string, message: string): ErrorDetail {
  return { path, message };
}

/** Walk the tree and list what is not allowed; collects used symbols. */
function check(
  node: MathNode,
  allowed: ReadonlySet<string>,
  path: string,
  used: Set<string>,
  errors: ErrorDetail[],
): void {
  const n = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'ConstantNode': {
      if (typeof n.value !== 'number')
        errors.push(problem(path, `only numbers may appear as constants, not ${JSON.stringify(n.value)}`));
      return;
    }
    case 'SymbolNode': {
      const name = n.name as string;
      if (allowed.has(name)) used.add(name);
      else if (ALLOWED_CONSTANTS.has(name) || EXPRESSION_CONSTANT_NAMES.has(name)) return;
      else if (ambiguousSymbol(name)) errors.push(problem(path, ambiguousSymbol(name)!));
      else if (ALLOWED_FUNCTIONS.has(name) || BLOCKED_FUNCTIONS.has(name))
        errors.push(problem(path, `"${name}" is a function, not a value`));
      else errors.push(problem(path, unknownSymbolMessage(name, [...allowed, 'pi', ...EXPRESSION_CONSTANT_NAMES])));
      return;
    }
    case 'ParenthesisNode':
      check(n.content as MathNode, allowed, path, used, errors);
      return;
    case 'OperatorNode': {
      const fn = n.fn as string;
      if (!ALLOWED_OPERATORS.has(fn)) {
        errors.push(problem(path, `operator "${n.op as string}" is not allowed in expressions`));
        return;
      }
      for (const a of n.args as MathNode[]) check(a, allowed, path, used, errors);
      return;
    }
    case 'ConditionalNode':
      check(n.condition as MathNode, allowed, path, used, errors);
      check(n.trueExpr as MathNode, allowed, path, used, errors);
      check(n.falseExpr as MathNode, allowed, path, used, errors);
      return;
    case 'RelationalNode':
      for (const p of n.params as MathNode[]) check(p, allowed, path, used, errors);
      return;
    case 'FunctionNode': {
      const fnNode = n.fn as MathNode & { name?: string };
      const name = fnNode.type === 'SymbolNode' ? (fnNode.name as string) : undefined;
      if (name && BLOCKED_FUNCTIONS.has(name)) {
        errors.push(problem(path, `function "${name}" is not allowed in expressions`));
        return;
      }
      if (!name || !ALLOWED_FUNCTIONS.has(name)) {
        errors.push(
          problem(
            path,
            `unknown or forbidden function "${name ?? fnNode.toString()}"; allowed functions: ${[...ALLOWED_FUNCTIONS].join(', ')}`,
          ),
        );
        return;
      }
      for (const a of n.args as MathNode[]) check(a, allowed, path, used, errors);
      return;
    }
    case 'AssignmentNode':
      errors.push(problem(path, 'assignment is not allowed in expressions'));
      return;
    case 'FunctionAssignmentNode':
      errors.push(problem(path, 'defining functions is not allowed in expressions'));
      return;
    case 'BlockNode':
      errors.push(problem(path, 'only one expression is allowed (no ";" or line breaks)'));
      return;
    case 'AccessorNode':
    case 'IndexNode':
      errors.push(problem(path, 'property access and indexing are not allowed in expressions'));
      return;
    default:
      errors.push(
        problem(path, `${node.type.replace(/Node$/, '').toLowerCase()} syntax is not allowed in expressions`),
      );
  }
}

/** Numbers pass; booleans become 1/0; anything else (matrix, unit, complex, string) is NaN. */
export function toNumber(v: unknown): number {
  if (typeof v === 'number') return v;
  if (typeof v === 'boolean') return v ? 1 : 0;
  return NaN;
}

/**
 * Parse, whitelist and compile `expr` once. `allowedSymbols` are the names the scope will hold.
 * Throws ValidationError with every problem at `path`.
 */
export function compileExpression(expr: string, allowedSymbols: Iterable<string>, path: string): CompiledExpression {
  if (typeof expr !== 'string' || expr.trim() === '') {
    throw new ValidationError(`Invalid expression at ${path}: expected a non-empty expression`, [
      problem(path, 'expected a non-empty expression'),
    ]);
  }
  if (expr.length > 2000) {
    throw new ValidationError(`Invalid expression at ${path}: longer than 2000 characters`, [
      problem(path, 'expression is longer than 2000 characters'),
    ]);
  }
  let node: MathNode;
  try {
    node = math.parse(expr);
  } catch (err) {
    const msg = `cannot read expression "${expr}": ${(err as Error).message}`;
    throw new ValidationError(`Invalid expression at ${path}: ${msg}`, [problem(path, msg)]);
  }
  const allowed = new Set(allowedSymbols);
  const used = new Set<string>();
  const errors: ErrorDetail[] = [];
  check(node, allowed, path, used, errors);
  if (errors.length) {
    throw new ValidationError(`Invalid expression at ${path}: ${errors.map((e) => e.message).join('; ')}`, errors);
  }
  // Physical constants (q_e, m_e, …) not shadowed by a column become literal numbers, so the
  // evaluation scope only ever holds columns.
  const withConstants = node.transform((nd) => {
    const name = (nd as MathNode & { name?: string }).name;
    if (nd.type === 'SymbolNode' && name && !allowed.has(name) && EXPRESSION_CONSTANT_NAMES.has(name)) {
      return new math.ConstantNode(EXPRESSION_CONSTANT_VALUES[name]!);
    }
    return nd;
  });
  const code = withConstants.compile();
  const symbols = Object.freeze([...used]);
  // A Map scope is used as is (no per-call wrapping); a plain object is wrapped by mathjs.
  const raw = (scope: ExpressionScope | Map<string, number>): unknown => code.evaluate(scope as Record<string, number>);
  const fn = (scope: ExpressionScope | Map<string, number>): number => {
    try {
      return toNumber(raw(scope));
    } catch {
      // A runtime type error for unusual values is a NaN for that point, not a failed chunk.
      return NaN;
    }
  };
  return Object.assign(fn, { expr, symbols, raw }) as CompiledExpression;
}
