import type { ErrorDetail } from '@driftgrid/domain';

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * Top-level keys of the submitted definition that validation dropped (zod strips unknown keys).
 * The raw body is what gets stored and echoed, so an unknown key would otherwise keep up to the
 * body limit of unchecked data in every sweep. Only the top level: inner objects (axes) are
 * transformed by the schema (an axis `unit` is folded into its values), so their keys differ.
 */
export function unknownKeys(raw: unknown, parsed: unknown): ErrorDetail[] {
  if (!isPlainObject(raw) || !isPlainObject(parsed)) return [];
  return Object.keys(raw)
    .filter((k) => !(k in parsed))
    .map((k) => ({ path: k.slice(0, 64), message: `unknown field "${k.slice(0, 64)}"` }));
}
