import type { FlagSpec, ModelDefinition, Thresholds } from '../models/types.js';

/** Where a validity flag switches on: the line `output = level` on a plot of the swept inputs. */
export interface RegimeBoundary {
  /** Flag code, e.g. `rho_i_over_Ln`. */
  flag: string;
  /** The ordering parameter (an output column). */
  output: string;
  /** The threshold's name and its value for this sweep (the sweep's override, else the model default). */
  threshold: string;
  level: number;
  /** True when the flag is raised below the level (output ≤ level) rather than above it. */
  below: boolean;
  invalidates: boolean;
  meaning: string;
}

/**
 * Every flag of the model that has an ordering parameter and a threshold, from the registry's metadata:
 * the flag's explicit `ordering`, or — the convention the models follow — an output named like the flag
 * with a threshold `<code>_max` (raised above) or `<code>_min` (raised below). Flags without both (e.g. a
 * cut-off detected by the solver) have no boundary to draw.
 */
export function regimeBoundaries(model: ModelDefinition, overrides: Thresholds = {}): RegimeBoundary[] {
  const out: RegimeBoundary[] = [];
  for (const f of model.flags) {
    const o = orderingOf(model, f);
    if (!o) continue;
    const spec = model.thresholds.find((t) => t.name === o.threshold);
    const level = overrides[o.threshold] ?? spec?.default;
    if (level === undefined || !Number.isFinite(level)) continue;
    out.push({
      flag: f.code,
      output: o.output,
      threshold: o.threshold,
      level,
      below: o.below,
      invalidates: f.invalidates,
      meaning: f.meaning,
    });
  }
  return out;
}

function orderingOf(model: ModelDefinition, f: FlagSpec): { output: string; threshold: string; below: boolean } | null {
  const isOutput = (name: string) => model.outputs.some((o) => o.name === name && o.kind === 'number');
  const isThreshold = (name: string) => model.thresholds.some((t) => t.name === name);
  if (f.ordering) {
    if (!isOutput(f.ordering.output) || !isThreshold(f.ordering.threshold)) return null;
    return { output: f.ordering.output, threshold: f.ordering.threshold, below: f.ordering.below ?? false };
  }
  if (!isOutput(f.code)) return null;
  if (isThreshold(`${f.code}_max`)) return { output: f.code, threshold: `${f.code}_max`, below: false };
  if (isThreshold(`${f.code}_min`)) return { output: f.code, threshold: `${f.code}_min`, below: true };
  return null;
}
