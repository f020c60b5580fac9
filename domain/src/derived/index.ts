export { compileDerived, type CompiledDerived, type DerivedDef } from './compile.js';
export {
  compileExpression,
  toNumber as expressionResultToNumber,
  ALLOWED_FUNCTIONS,
  BLOCKED_FUNCTIONS,
  type CompiledExpression,
  type ExpressionScope,
} from './security.js';
