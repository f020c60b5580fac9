import { exponentialScaleIsTe, fitParameterUnit } from '@driftgrid/domain';
import { xList, type FitParameterView, type FitView } from './fit-types.js';

type FitUnits = Pick<FitView, 'model' | 'units' | 'y' | 'x' | 'parameters'>;

/**
 * A parameter's unit by the domain's one rule (model + the columns' units + fitted exponents), so fits stored
 * before a rule existed still show it; the stored unit where the rule has none (user expressions).
 */
export function parameterUnit(fit: FitUnits, p: Pick<FitParameterView, 'name' | 'unit'>): string | null {
  const xNames = xList(fit.x);
  const units = fit.units ?? {};
  const values = Object.fromEntries((fit.parameters ?? []).map((q) => [q.name, q.value]));
  const rule = fit.units
    ? fitParameterUnit(
        { model: fit.model, yUnit: units[fit.y], xUnits: xNames.map((x) => units[x]), xNames, values },
        p.name,
      )
    : null;
  return rule ?? p.unit;
}

/** Readable parameter names: `exp_B_T` is "exponent of B_T"; the exponential's s is Te when x is a potential in V. */
export function parameterLabel(fit: Pick<FitView, 'model' | 'units' | 'x'>, name: string): string {
  if (name.startsWith('exp_')) return `exponent of ${name.slice(4)}`;
  if (fit.model === 'power-law' && name === 'C') return 'prefactor';
  if (fit.model === 'exponential') {
    if (name === 'A') return 'prefactor (y at x = 0)';
    if (name === 's')
      return exponentialScaleIsTe(fit.units?.[xList(fit.x)[0]!])
        ? 'Te, electron temperature (x = φ in V, so s in V is Te in eV)'
        : 'e-folding scale of x';
  }
  if (name === 'gamma') return 'γ (polytropic index)';
  if (name === 'Te_eV') return 'Te';
  if (name === 'n0') return 'density scale';
  if (name === 'I_is') return 'ion saturation current';
  if (name === 'V_f') return 'floating potential';
  return name;
}
