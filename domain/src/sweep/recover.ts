/**
 * What is left of a definition once its structurally broken parts are set aside, so that the model
 * checks can still run on the rest and report their problems in the same response (one error must
 * not hide the others). Broken axes, fixed values and derived columns are dropped; broken scalar
 * fields get a neutral stand-in that no check looks at. Paths from checking the rest are mapped back
 * to the positions the user wrote.
 */
import type { ErrorDetail } from '../errors.js';
import { sweepDefinitionSchema, type SweepDefinition } from './schema.js';

export interface RecoveredDefinition {
  definition: SweepDefinition;
  /** `axes.1.max` of the recovered definition → the path in the definition as written. */
  originalPath(path: string): string;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return !!v && typeof v === 'object' && !Array.isArray(v);
}

/** Null when too little parsed to check anything against the model. */
export function recoverDefinition(raw: unknown, issues: readonly ErrorDetail[]): RecoveredDefinition | null {
  if (!isRecord(raw)) return null;
  const def: Record<string, unknown> = { ...raw };
  const badAxes = new Set<number>();
  const badDerived = new Set<number>();
  const badFixed = new Set<string>();
  for (const { path } of issues) {
    const [head, second] = path.split('.');
    switch (head) {
      case 'name':
        def.name = 'untitled';
        break;
      case 'description':
      case 'thresholds':
      case 'visibility':
      case 'schemaVersion':
        delete def[head];
        break;
      case 'tags':
        def.tags = [];
        break;
      case 'axes':
        if (second === undefined) return null;
        badAxes.add(Number(second));
        break;
      case 'derived':
        if (second === undefined) def.derived = [];
        else badDerived.add(Number(second));
        break;
      case 'fixed':
        if (second === undefined) def.fixed = {};
        else badFixed.add(second);
        break;
      case 'sampling': {
        if (!isRecord(def.sampling) || second === undefined || second === 'kind') return null;
        const sampling = { ...def.sampling };
        if (second === 'samples') sampling.samples = 1;
        else if (second === 'seed') sampling.seed = 0;
        else delete sampling[second];
        def.sampling = sampling;
        break;
      }
      default:
        return null; // the model or the whole definition: nothing to check against
    }
  }
  const axisIndex: number[] = [];
  if (Array.isArray(def.axes)) {
    def.axes = def.axes.filter((_, i) => {
      if (badAxes.has(i)) return false;
      axisIndex.push(i);
      return true;
    });
    if (axisIndex.length === 0) return null;
  }
  const derivedIndex: number[] = [];
  if (Array.isArray(def.derived)) {
    def.derived = def.derived.filter((_, i) => {
      if (badDerived.has(i)) return false;
      derivedIndex.push(i);
      return true;
    });
  }
  if (isRecord(def.fixed)) def.fixed = Object.fromEntries(Object.entries(def.fixed).filter(([k]) => !badFixed.has(k)));

  const parsed = sweepDefinitionSchema.safeParse(def);
  if (!parsed.success) return null;
  return {
    definition: parsed.data,
    originalPath(path) {
      const parts = path.split('.');
      const map = parts[0] === 'axes' ? axisIndex : parts[0] === 'derived' ? derivedIndex : null;
      if (map && parts[1] !== undefined && map[Number(parts[1])] !== undefined)
        parts[1] = String(map[Number(parts[1])]);
      return parts.join('.');
    },
  };
}
