import { ELEMENTARY_CHARGE, PROTON_MASS } from '../../constants.js';
import type { FitResult } from '../types.js';

/** Sheath-edge density factor h = n_se/n ≈ exp(−1/2) ≈ 0.61 (Bohm; common practice). */
export const DEFAULT_SHEATH_FACTOR = 0.61;

export interface ProbeGeometry {
  /** Collecting area A in m². */
  area_m2: number;
  /** Ion mass in proton masses (m_i = μ·m_p, as in the NRL Plasma Formulary). */
  mu: number;
  /** n_se/n; default 0.61. */
  h?: number;
}

export interface DerivedQuantity {
  name: string;
  value: number;
  stdError: number;
  unit: string;
  method: string;
}

/**
 * Density from the ion saturation current through the Bohm flux, I_is = h·e·n·A·c_s with
 * c_s = sqrt(e·Te/m_i) (Te in eV, cold ions): n = I_is / (h·e·A·sqrt(e·Te/m_i)). Sources: Hutchinson,
 * Principles of Plasma Diagnostics, electric probes chapter; Stangeby, The Plasma Boundary of Magnetic
 * Fusion Devices, the Bohm criterion (both from memory). The error follows from the covariance of
 * (I_is, Te) by the delta method: n ∝ I_is·Te^(−1/2), so ∂n/∂I_is = n/I_is and ∂n/∂Te = −n/(2·Te).
 */
export function probeDensity(
  result: Pick<FitResult, 'parameters' | 'covariance'>,
  probe: ProbeGeometry,
): DerivedQuantity {
  const names = result.parameters.map((p) => p.name);
  const a = names.indexOf('I_is');
  const t = names.indexOf('Te_eV');
  const h = probe.h ?? DEFAULT_SHEATH_FACTOR;
  const iis = result.parameters[a]!.value;
  const te = result.parameters[t]!.value;
  const mi = probe.mu * PROTON_MASS;
  const cs = Math.sqrt((ELEMENTARY_CHARGE * te) / mi);
  const n = iis / (h * ELEMENTARY_CHARGE * probe.area_m2 * cs);
  const gI = n / iis;
  const gT = -n / (2 * te);
  const c = result.covariance;
  const variance = gI * gI * c[a]![a]! + 2 * gI * gT * c[a]![t]! + gT * gT * c[t]![t]!;
  return {
    name: 'n_m3',
    value: n,
    stdError: Math.sqrt(Math.max(variance, 0)),
    unit: 'm^-3',
    method: `n = I_is / (h·e·A·sqrt(e·Te/m_i)), h = ${h}, A = ${probe.area_m2.toExponential(3)} m², m_i = ${probe.mu}·m_p; error by the delta method from the covariance of I_is and Te`,
  };
}
