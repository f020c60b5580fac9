import { checkInputValue, describeRange, parseQuantity, ValidationError, type InputSpec } from '@driftgrid/domain';

export type Parsed = { ok: true; value: number } | { ok: false; error: string };

/**
 * Reads what the user typed into a model input: a number in the canonical unit or a unit string
 * ("10 eV", "1500 G", "1e13 cm^-3"), converted with the same parser the api uses, then checked
 * against the registry range. The message names the allowed range.
 */
export function parseInput(spec: InputSpec, text: string): Parsed {
  if (text.trim() === '') return { ok: false, error: `Enter a value ${describeRange(spec)}` };
  let value: number;
  try {
    value = parseQuantity(spec.name, text, spec.unit);
  } catch (err) {
    const msg = err instanceof ValidationError ? (err.details?.[0]?.message ?? err.message) : (err as Error).message;
    return { ok: false, error: msg };
  }
  const bad = checkInputValue(spec, value);
  return bad ? { ok: false, error: bad } : { ok: true, value };
}
