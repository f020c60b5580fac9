import type { FitModelKind } from './types.js';

/** What the unit of a fitted parameter depends on: the model, the columns' canonical units, the fitted exponents. */
export interface ParamUnitContext {
  model: FitModelKind;
  /** Canonical unit of y ('1' dimensionless, '' or missing when unknown). */
  yUnit: string | null | undefined;
  /** Canonical units of the x columns, in the request's order. */
  xUnits: readonly (string | null | undefined)[];
  /** x column names in the same order (power-law exponents are named `exp_<column>`). */
  xNames: readonly string[];
  /** Fitted values by parameter name (the power-law prefactor's unit carries the fitted exponents). */
  values?: Readonly<Record<string, number | null | undefined>>;
}

const known = (u: string | null | undefined): string | null => (u && u.trim() ? u.trim() : null);

/** An exponent written the way mathjs unit strings write it, rounded so a fitted 1.4999999 reads 1.5. */
function exponent(a: number): string {
  const r = Number(a.toPrecision(4));
  return String(r);
}

/**
 * The power-law prefactor: y = C·∏ xₖ^aₖ, so [C] = [y]·∏ [xₖ]^(−aₖ) (dimensional homogeneity). With fitted,
 * generally non-integer exponents the unit carries them, e.g. `m^-3 * T^-1.5`. Dimensionless factors drop out.
 */
function powerLawPrefactor(ctx: ParamUnitContext): string | null {
  const y = known(ctx.yUnit);
  if (!y) return null;
  const parts = y === '1' ? [] : [y];
  for (let k = 0; k < ctx.xNames.length; k++) {
    const xu = known(ctx.xUnits[k]);
    if (!xu) return null;
    if (xu === '1') continue;
    const a = ctx.values?.[`exp_${ctx.xNames[k]}`];
    if (a === null || a === undefined || !Number.isFinite(a)) return null;
    if (a === 0) continue;
    const e = exponent(-a);
    const base = /^[A-Za-zµΩ°]+$/.test(xu) ? xu : `(${xu})`;
    parts.push(e === '1' ? base : `${base}^${e}`);
  }
  return parts.length ? parts.join(' * ') : '1';
}

/**
 * The unit of a built-in model's parameter from the x and y units; null where the model does not make it plain
 * (user expressions, unknown column units).
 * - power law: exponents are pure numbers, C as above;
 * - exponential y = A·exp(x/s): A in y's unit, s in x's unit — except that with x a potential in V, s = Te/e and
 *   the value in V is Te in eV (the Boltzmann relation n = n0·exp(eφ/Te), Chen §3.5), so it is shown as eV;
 * - polytropic: n0 in y's unit, γ a pure number, Te in eV;
 * - probe models: I_is in y's unit, V_f in x's unit, Te in eV, other slopes in y/x.
 */
export function fitParameterUnit(ctx: ParamUnitContext, name: string): string | null {
  const yu = known(ctx.yUnit);
  const xu = known(ctx.xUnits[0]);
  switch (ctx.model) {
    case 'power-law':
      return name === 'C' ? powerLawPrefactor(ctx) : '1';
    case 'exponential':
      if (name === 'A') return yu;
      return xu === 'V' ? 'eV' : xu;
    case 'polytropic':
      if (name === 'n0') return yu;
      return name === 'Te_eV' ? 'eV' : '1';
    case 'probe-retarding':
    case 'probe-double':
      if (name === 'I_is') return yu;
      if (name === 'V_f') return xu;
      if (name === 'Te_eV') return 'eV';
      return yu && xu ? `${yu}/${xu}` : null;
    default:
      return null;
  }
}

/** True when the exponential model's scale s is read as the electron temperature (x is a potential in V). */
export function exponentialScaleIsTe(xUnit: string | null | undefined): boolean {
  return known(xUnit) === 'V';
}
