/**
 * Reading user quantities ("20 eV", "3 cm", "1500 G", "1e13 cm^-3", "5 kV/m", "300 K") into the
 * canonical units of the api and stored data: SI, temperatures in eV.
 */
import { ValidationError } from '../errors.js';
import { ELEMENTARY_CHARGE, KELVIN_PER_EV } from '../constants.js';
import type { Unit } from 'mathjs';
import { math } from './math.js';

/** A plain decimal or exponent literal ("10", "-2.5", "1e19"), read as already canonical. */
const NUMBER_LITERAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

const EXAMPLES: Record<string, string> = {
  eV: '10 eV, 2 keV or 11600 K',
  m: '2 cm or 0.02 m',
  T: '0.5 T or 1500 G',
  'm^-3': '1e19 m^-3 or 1e13 cm^-3',
  'V/m': '5 kV/m or 50 V/cm',
  V: '-20 V or 1.5 kV',
  '1': 'a plain number such as 2',
};

function fail(field: string, unit: string, value: unknown, why?: string): never {
  const example = EXAMPLES[unit] ?? `a value in ${unit}`;
  const shown = typeof value === 'string' ? `"${value}"` : String(value);
  const message =
    unit === '1'
      ? `expected a dimensionless number (${example}), got ${shown}${why ? ` (${why})` : ''}`
      : `expected a quantity in ${unit} (for example ${example}), got ${shown}${why ? ` (${why})` : ''}`;
  throw new ValidationError(`Invalid ${field}: ${message}`, [{ path: field, message }]);
}

/** mathjs leaves conversion noise in the last bits (1e13 cm^-3 → 9.999999999999998e18 m^-3). */
function tidy(x: number): number {
  return Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(15)) : x;
}

const kelvin = math.unit('K');
const electronvolt = math.unit('eV');

/**
 * Convert `value` to the canonical `unit` (`eV`, `m`, `T`, `m^-3`, `V/m`, `V`, `1`, or any other
 * mathjs unit string). Numbers are taken as already canonical and returned unchanged. Strings
 * holding a bare number are canonical too. For `eV` a temperature in kelvin (or °C) is converted
 * with e/k_B, because mathjs treats eV as an energy only. Results are rounded to 15 significant
 * digits to drop conversion noise. Throws ValidationError (path = `field`) on anything else.
 */
export function parseQuantity(field: string, value: number | string, unit: string): number {
  if (typeof value === 'number') return value;
  if (typeof value !== 'string') fail(field, unit, value, 'not a number or a string');
  const text = value.trim();
  if (text === '') fail(field, unit, value, 'empty');
  if (NUMBER_LITERAL.test(text)) return Number(text);

  let parsed: Unit;
  try {
    parsed = math.unit(text) as Unit;
  } catch (err) {
    // mathjs says 'Unit "abc" not found.'; the user reads "unknown unit `abc`".
    const raw = (err as Error).message;
    const unknownUnit = /^Unit "([^"]+)" not found/.exec(raw);
    fail(field, unit, value, unknownUnit ? `unknown unit \`${unknownUnit[1]}\`` : raw.replace(/\.$/, ''));
  }
  if (parsed.value === null) fail(field, unit, value, 'no number given');

  if (unit === '1') {
    // A dimensionless unit string such as "50 %" is fine; any dimension is not.
    if (!parsed.equalBase(math.unit('1 m/m'))) fail(field, unit, value, 'has a dimension');
    return tidy(parsed.toNumber(''));
  }
  if (unit === 'eV' && parsed.equalBase(kelvin)) {
    return tidy(parsed.toNumber('K') / KELVIN_PER_EV);
  }
  if (unit === 'eV') {
    if (!parsed.equalBase(electronvolt)) fail(field, unit, value, 'wrong dimension');
    // mathjs defines the eV with an older elementary charge; energies in other units (J, erg) go
    // through joules and the CODATA 2018 value, which is exact by the 2019 SI definition.
    const u = parsed.units;
    const inEv = u.length === 1 && u[0].unit.name === 'eV' && u[0].power === 1;
    return tidy(inEv ? parsed.toNumber('eV') : parsed.toNumber('J') / ELEMENTARY_CHARGE);
  }
  if (!parsed.equalBase(math.unit(unit))) fail(field, unit, value, 'wrong dimension');
  return tidy(parsed.toNumber(unit));
}
