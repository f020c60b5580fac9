/**
 * Field labels for sweep-definition problems, in the builder's words: "T_e axis · From" rather than
 * `axes.0.min`. The api returns them in its 400 details and the ui lists them, so a message reads
 * the same wherever it is shown. Paths stay in the details as the machine key.
 */
import type { ErrorDetail } from '../errors.js';
import { models } from '../models/index.js';
import type { ModelDefinition } from '../models/types.js';

const AXIS_FIELDS: Record<string, string> = {
  min: 'From',
  max: 'To',
  count: 'Points',
  values: 'Values',
  kind: 'Spacing',
  unit: 'Unit',
  param: 'Input',
};

const TOP_LEVEL: Record<string, string> = {
  '(definition)': 'Sweep definition',
  '': 'Sweep definition',
  schemaVersion: 'Format version',
  name: 'Name',
  model: 'Model',
  description: 'Description',
  fixed: 'Fixed inputs',
  axes: 'Axes',
  sampling: 'Sampling',
  derived: 'Derived columns',
  tags: 'Tags',
  thresholds: 'Thresholds',
  visibility: 'Visibility',
};

const SAMPLING_FIELDS: Record<string, string> = {
  kind: 'Sampling design',
  samples: 'Samples',
  seed: 'Seed',
  skip: 'Points skipped',
};

function record(v: unknown): Record<string, unknown> {
  return v && typeof v === 'object' && !Array.isArray(v) ? (v as Record<string, unknown>) : {};
}

/** "T_e" for a model input name, or the name itself when the model does not know it. */
export function inputSymbol(model: ModelDefinition | undefined, name: string): string {
  return model?.inputs.find((s) => s.name === name)?.symbol ?? name;
}

/** The builder's label for the field at `path` of the (raw) definition. */
export function sweepFieldLabel(path: string, raw: unknown): string {
  const def = record(raw);
  const model = models.find((m) => m.id === def.model);
  const [head = '', second, third, fourth] = path.split('.');
  if (head === 'axes' && second !== undefined) {
    const i = Number(second);
    const axes = Array.isArray(def.axes) ? def.axes : [];
    const param = record(axes[i]).param;
    const who = typeof param === 'string' && param ? `${inputSymbol(model, param)} axis` : `Axis ${i + 1}`;
    if (third === undefined) return who;
    const field = AXIS_FIELDS[third] ?? third;
    return third === 'values' && fourth !== undefined ? `${who} · Value ${Number(fourth) + 1}` : `${who} · ${field}`;
  }
  if (head === 'fixed' && second !== undefined) return `${inputSymbol(model, second)} fixed value`;
  if (head === 'sampling' && second !== undefined) return SAMPLING_FIELDS[second] ?? `Sampling ${second}`;
  if (head === 'derived' && second !== undefined) {
    const n = Number(second) + 1;
    return third === 'name'
      ? `Derived column ${n} · Name`
      : third === 'expr'
        ? `Derived column ${n} · Expression`
        : `Derived column ${n}`;
  }
  if (head === 'tags' && second !== undefined) return `Tag ${Number(second) + 1}`;
  if (head === 'thresholds' && second !== undefined) return `Threshold ${second}`;
  return TOP_LEVEL[head] ?? path;
}

/** Details with their labels filled in (an existing label is kept). */
export function labelSweepErrors(details: readonly ErrorDetail[], raw: unknown): ErrorDetail[] {
  return details.map((d) => ({ ...d, label: d.label ?? sweepFieldLabel(d.path, raw) }));
}
