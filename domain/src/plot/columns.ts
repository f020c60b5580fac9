import type { ModelDefinition, OutputGroup, OutputSpec } from '../models/types.js';

/** Column groups of a results table, in the order they are shown: the physics first. */
export const COLUMN_GROUPS = [
  'swept',
  'drifts',
  'scales',
  'orderings',
  'collisions',
  'other',
  'derived',
  'flags',
] as const;
export type ColumnGroup = (typeof COLUMN_GROUPS)[number];

export const COLUMN_GROUP_LABELS: Record<ColumnGroup, string> = {
  swept: 'Swept inputs',
  drifts: 'Drifts',
  scales: 'Speeds, lengths, frequencies',
  orderings: 'Orderings and ratios',
  collisions: 'Collisions and collisional drifts',
  other: 'Other outputs',
  derived: 'Derived',
  flags: 'Validity and flags',
};

/**
 * The table group of a model output: its registry `group` when set, else from its unit and meaning — speeds
 * described as a drift are drifts, other speeds (thermal, sound), lengths and frequencies are scales,
 * dimensionless numbers are orderings, booleans are flags.
 */
export function outputGroup(o: Pick<OutputSpec, 'unit' | 'kind' | 'group'> & { meaning?: string }): OutputGroup {
  if (o.group) return o.group;
  if (o.kind === 'boolean') return 'flags';
  const u = o.unit.replace(/\s+/g, '');
  if (u === 'm/s') return /drift/i.test(o.meaning ?? '') ? 'drifts' : 'scales';
  if (u === 'm' || u === 'rad/s' || u === 's' || u === 'Hz' || u === '1/s' || u === 's^-1') return 'scales';
  if (u === '1' || u === '') return 'orderings';
  return 'other';
}

/** A stored column as the catalogue describes it (the fields grouping needs). */
export interface GroupableColumn {
  name: string;
  kind: 'index' | 'input' | 'output' | 'derived' | 'flags';
}

/**
 * The group of a stored column of a sweep: swept inputs, the model's outputs by group, derived columns,
 * and the flag mask with the flags. Inputs that are not swept and the row index have no group (null).
 */
export function columnGroup(
  c: GroupableColumn,
  model: Pick<ModelDefinition, 'outputs'> | null,
  swept: readonly string[],
): ColumnGroup | null {
  if (c.kind === 'input') return swept.includes(c.name) ? 'swept' : null;
  if (c.kind === 'index') return null;
  if (c.kind === 'flags') return 'flags';
  if (c.kind === 'derived') return 'derived';
  const o = model?.outputs.find((x) => x.name === c.name);
  return o ? outputGroup(o) : 'other';
}
