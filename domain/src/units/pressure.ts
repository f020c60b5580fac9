/**
 * Neutral pressure as an alternative way to give a neutral density: n = p/(k_B T) (ideal gas,
 * common practice), with T in eV so k_B T = e·T_eV joules.
 */
import type { Unit } from 'mathjs';
import { ELEMENTARY_CHARGE } from '../constants.js';
import { math } from './math.js';

const pascal = math.unit('1 Pa');
const TORR = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)\s*(m)?torr$/i;

/** The pressure in Pa if `value` is a quantity string with the dimension of a pressure, else null. */
export function pressureInPascal(value: unknown): number | null {
  if (typeof value !== 'string') return null;
  // Torr and mTorr, the units of gas-discharge practice: mathjs has no prefixed torr and defines
  // the torr as 133.322 Pa, while by definition 1 Torr = 101325/760 Pa = 133.3223684… Pa.
  const torr = TORR.exec(value.trim());
  if (torr) {
    const p = Number(torr[1]) * (torr[2] ? 1e-3 : 1) * (101325 / 760);
    return Number.isFinite(p) ? p : null;
  }
  let u: Unit;
  try {
    u = math.unit(value.trim()) as Unit;
  } catch {
    return null;
  }
  if (u.value === null || !u.equalBase(pascal)) return null;
  // mathjs defines the torr as 133.322 Pa; by definition it is 101325/760 Pa = 133.3223684… Pa.
  const only = u.units.length === 1 && u.units[0]!.power === 1 ? u.units[0]! : null;
  const p = only?.unit.name === 'torr' ? u.toNumber('torr') * (101325 / 760) : u.toNumber('Pa');
  return Number.isFinite(p) ? Number(p.toPrecision(15)) : null;
}

/** Neutral density [m⁻³] of a gas at pressure p [Pa] and temperature T [eV]: p/(e T). */
export function densityFromPressure(pPa: number, tEv: number): number {
  return pPa / (ELEMENTARY_CHARGE * tEv);
}
