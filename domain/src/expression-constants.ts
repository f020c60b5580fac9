/**
 * Physical constants that user expressions (derived columns and fit expressions) may use, under
 * names no plasma user can misread. CODATA 2018 values from constants.ts.
 *
 * A bare `e` is refused: plasma users read it as the elementary charge, mathjs as Euler's number.
 */
import {
  ATOMIC_MASS_CONSTANT,
  BOLTZMANN,
  ELECTRON_MASS,
  ELEMENTARY_CHARGE,
  PROTON_MASS,
  SPEED_OF_LIGHT,
  VACUUM_PERMEABILITY,
  VACUUM_PERMITTIVITY,
} from './constants.js';

export interface ExpressionConstant {
  name: string;
  value: number;
  unit: string;
  meaning: string;
}

export const EXPRESSION_CONSTANTS: readonly ExpressionConstant[] = Object.freeze([
  { name: 'q_e', value: ELEMENTARY_CHARGE, unit: 'C', meaning: 'elementary charge (exact)' },
  { name: 'm_e', value: ELECTRON_MASS, unit: 'kg', meaning: 'electron mass' },
  { name: 'm_p', value: PROTON_MASS, unit: 'kg', meaning: 'proton mass' },
  { name: 'm_u', value: ATOMIC_MASS_CONSTANT, unit: 'kg', meaning: 'atomic mass constant (1 u)' },
  { name: 'eps0', value: VACUUM_PERMITTIVITY, unit: 'F/m', meaning: 'vacuum permittivity ε0' },
  { name: 'mu0', value: VACUUM_PERMEABILITY, unit: 'N/A^2', meaning: 'vacuum permeability μ0' },
  { name: 'k_B', value: BOLTZMANN, unit: 'J/K', meaning: 'Boltzmann constant (exact)' },
  { name: 'c0', value: SPEED_OF_LIGHT, unit: 'm/s', meaning: 'speed of light in vacuum (exact)' },
]);

export const EXPRESSION_CONSTANT_NAMES: ReadonlySet<string> = new Set(EXPRESSION_CONSTANTS.map((c) => c.name));

/** name → value, for building an expression scope. */
export const EXPRESSION_CONSTANT_VALUES: Readonly<Record<string, number>> = Object.freeze(
  Object.fromEntries(EXPRESSION_CONSTANTS.map((c) => [c.name, c.value])),
);

/** The message for a bare `e`, naming both readings and the names to use instead. */
export const AMBIGUOUS_E_MESSAGE =
  'symbol "e" is ambiguous: plasma physics reads it as the elementary charge, the expression language as ' +
  "Euler's number 2.718…. Write q_e for the elementary charge (1.602176634e-19 C) or exp(1) for Euler's number. " +
  `Physical constants available: ${EXPRESSION_CONSTANTS.map((c) => c.name).join(', ')}, and pi.`;

/** Null when `name` may be used as a value; a message when it is the ambiguous `e`. */
export function ambiguousSymbol(name: string): string | null {
  return name === 'e' ? AMBIGUOUS_E_MESSAGE : null;
}
