import { ELEMENTARY_CHARGE, math, parseQuantity, ValidationError } from '@driftgrid/domain';
import type { Unit } from 'mathjs';

/**
 * Canonical units per dimension (SPEC §2: SI, temperatures in eV). Energies are stored in eV too:
 * in this trade an energy column is a temperature or a particle energy, and eV is how both are read.
 * The first entry with the same dimension as the uploaded unit wins; anything else falls back to
 * mathjs's SI base form.
 */
const CANONICAL: { unit: string; quantity: string }[] = [
  { unit: 'eV', quantity: 'temperature' },
  { unit: 'm', quantity: 'length' },
  { unit: 'm^-3', quantity: 'density' },
  { unit: 'T', quantity: 'magnetic field' },
  { unit: 'V/m', quantity: 'electric field' },
  { unit: 'V', quantity: 'potential' },
  { unit: 'm/s', quantity: 'velocity' },
  { unit: 's', quantity: 'time' },
  { unit: 'Hz', quantity: 'frequency' },
  { unit: 'A', quantity: 'current' },
  { unit: 'A/m^2', quantity: 'current density' },
  { unit: 'Pa', quantity: 'pressure' },
  { unit: 'W', quantity: 'power' },
  { unit: 'kg', quantity: 'mass' },
  { unit: 'C', quantity: 'charge' },
  { unit: 'm^2', quantity: 'area' },
  { unit: 'm^3', quantity: 'volume' },
  { unit: 'm^-2', quantity: 'areal density' },
  { unit: 'm^-1', quantity: 'inverse length' },
];

const canonicalUnits = CANONICAL.map((c) => ({ ...c, parsed: math.unit(c.unit) as Unit }));
const kelvin = math.unit('K') as Unit;

export interface ColumnConversion {
  /** The unit as given ('' when none). */
  unit: string;
  canonicalUnit: string;
  quantity: string | null;
  /** Affine map to canonical units: canonical = scale · value + offset (offset only for °C/°F). */
  scale: number;
  offset: number;
}

const DIMENSIONLESS: ColumnConversion = { unit: '', canonicalUnit: '1', quantity: null, scale: 1, offset: 0 };

/**
 * Reads a column's unit with mathjs and works out how to convert its values to canonical units.
 * Throws a ValidationError naming the column for text mathjs does not know or that carries a value.
 */
export function columnConversion(column: string, unitText: string | undefined): ColumnConversion {
  const text = (unitText ?? '').trim();
  if (text === '' || text === '1') return { ...DIMENSIONLESS, unit: text };
  const path = `units.${column}`;
  let parsed: Unit;
  try {
    parsed = math.unit(text) as Unit;
  } catch (err) {
    const message = `unknown unit "${text}" (${(err as Error).message}); use a unit such as V, cm^-3, eV, K, T or m/s`;
    throw new ValidationError(`Column "${column}": ${message}`, [{ path, column, message }]);
  }
  if (parsed.value !== null) {
    const message = `"${text}" holds a number; give the unit alone (for example "cm^-3")`;
    throw new ValidationError(`Column "${column}": ${message}`, [{ path, column, message }]);
  }
  const isTemperature = parsed.equalBase(kelvin);
  const match = isTemperature ? canonicalUnits[0] : canonicalUnits.find((c) => parsed.equalBase(c.parsed));
  const canonicalUnit = match?.unit ?? siForm(parsed);
  const quantity = isTemperature
    ? 'temperature'
    : (match?.quantity ?? (parsed.equalBase(math.unit('1 m/m') as Unit) ? 'dimensionless' : null));
  if (match?.unit === 'eV' && !isTemperature && !isElectronvoltBased(parsed)) {
    // mathjs defines eV with an older e (1.602176565e-19 J); go through joules and CODATA 2018's exact e.
    const scale = tidy((math.unit(`1 ${text}`) as Unit).toNumber('J') / ELEMENTARY_CHARGE);
    return { unit: text, canonicalUnit, quantity, scale, offset: 0 };
  }
  // parseQuantity handles kelvin/°C → eV (e/k_B, CODATA 2018) and trims conversion noise to 15 digits.
  const at = (x: number) => parseQuantity(path, `${x} ${text}`, canonicalUnit);
  const offset = at(0);
  const scale = at(1) - offset;
  return { unit: text, canonicalUnit, quantity, scale, offset };
}

/** eV with any SI prefix (keV, MeV): converts to eV exactly, whatever e mathjs assumes. */
function isElectronvoltBased(u: Unit): boolean {
  return (
    u.units.length === 1 &&
    u.units[0].power === 1 &&
    ['eV', 'electronvolt', 'electronvolts'].includes(u.units[0].unit.name)
  );
}

const tidy = (x: number) => (Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(15)) : x);

function siForm(u: Unit): string {
  const si = (math.unit(`1 ${u.formatUnits()}`) as Unit).toSI();
  return si.formatUnits() || '1';
}

/** Applies a conversion; identity conversions return the value untouched (no rounding). */
export function toCanonical(c: ColumnConversion, v: number): number {
  if (c.scale === 1 && c.offset === 0) return v;
  return c.scale * v + c.offset;
}
