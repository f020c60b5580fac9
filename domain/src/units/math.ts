/**
 * The one configured mathjs instance of the project. Everything that needs mathjs (unit parsing,
 * derived-column expressions, fit expressions) imports it from here so configuration and custom
 * units stay consistent.
 *
 * - `predictable: true`: sqrt(-1), log(-1) give NaN instead of complex numbers, so an expression
 *   over real columns always yields a real number (or NaN).
 * - gauss (`G`, `Gs`, `gauss`, with SI prefixes: `kG`) is not built into mathjs; 1 G = 1e-4 T.
 *
 * This instance is NOT hardened: never call `math.evaluate` on user text. User expressions go
 * through `compileExpression` in derived/security.ts, which whitelists the syntax tree.
 */
import { all, create } from 'mathjs';

export const math = create(all, { predictable: true });

math.createUnit('gauss', { definition: '1e-4 T', aliases: ['G', 'Gs'], prefixes: 'short' });
