import { axisSchema, derivedSchema, samplingSchema, type ErrorDetail } from '@driftgrid/domain';
import type { z } from 'zod';

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** Keys an object schema declares (by the schema's type tag: domain may load its own zod). */
function declaredKeys(schema: z.ZodType): string[] {
  const def = schema.def as { type: string; shape?: Record<string, unknown> };
  return def.type === 'object' && def.shape ? Object.keys(def.shape) : [];
}

/** The declared keys of the union member whose `kind` matches, or null when no member does. */
function keysForKind(union: { options: readonly z.ZodType[] }, kind: unknown): string[] | null {
  for (const option of union.options) {
    const shape = (option.def as { shape?: Record<string, z.ZodType> }).shape;
    if (shape?.kind?.safeParse(kind).success) {
      const keys = declaredKeys(option);
      return keys.length ? keys : null;
    }
  }
  return null;
}

function extra(raw: Record<string, unknown>, known: readonly string[], prefix: string): ErrorDetail[] {
  return Object.keys(raw)
    .filter((k) => !known.includes(k))
    .map((k) => {
      const name = k.slice(0, 64);
      return { path: `${prefix}${name}`, message: `unknown field "${name}"` };
    });
}

/**
 * Keys of the submitted definition that validation would drop (zod strips unknown keys): at the
 * top level, in each axis (by its kind), in sampling and in each derived column. The raw body is
 * what gets stored and echoed, so an unknown key would otherwise keep up to the body limit of
 * unchecked data in every sweep. Objects that failed validation are left to the schema's errors.
 */
export function unknownKeys(raw: unknown, parsed: unknown): ErrorDetail[] {
  if (!isPlainObject(raw) || !isPlainObject(parsed)) return [];
  const out = extra(raw, Object.keys(parsed), '');
  if (Array.isArray(raw.axes))
    raw.axes.forEach((axis, i) => {
      if (!isPlainObject(axis)) return;
      const known = keysForKind(axisSchema, axis.kind);
      if (known) out.push(...extra(axis, known, `axes.${i}.`));
    });
  if (isPlainObject(raw.sampling)) {
    const known = keysForKind(samplingSchema, raw.sampling.kind);
    if (known) out.push(...extra(raw.sampling, known, 'sampling.'));
  }
  if (Array.isArray(raw.derived)) {
    const known = declaredKeys(derivedSchema);
    raw.derived.forEach((d, i) => {
      if (isPlainObject(d) && known.length) out.push(...extra(d, known, `derived.${i}.`));
    });
  }
  return out;
}
