import type { z } from 'zod';
import { ValidationError, type ErrorDetail } from '../errors.js';
import { labelSweepErrors } from './labels.js';
import { sweepDefinitionSchema, type SweepDefinition } from './schema.js';

/** zod issues as ErrorDetails with dot paths (`axes.1.max`). */
export function issuesToDetails(issues: readonly z.core.$ZodIssue[]): ErrorDetail[] {
  return issues.map((issue) => {
    const path = issue.path.map(String).join('.');
    return { path: path || '(definition)', message: issue.message };
  });
}

/** Structural validation; returns the parsed definition or the errors with their paths. */
export function safeParseSweepDefinition(
  raw: unknown,
): { ok: true; definition: SweepDefinition } | { ok: false; errors: ErrorDetail[] } {
  const result = sweepDefinitionSchema.safeParse(raw);
  if (result.success) return { ok: true, definition: result.data };
  return { ok: false, errors: issuesToDetails(result.error.issues) };
}

/** Structural validation; throws ValidationError listing every problem. */
export function parseSweepDefinition(raw: unknown): SweepDefinition {
  const result = safeParseSweepDefinition(raw);
  if (!result.ok) {
    const errors = labelSweepErrors(result.errors, raw);
    throw new ValidationError(summarise(errors), errors);
  }
  return result.definition;
}

export function summarise(errors: readonly ErrorDetail[]): string {
  const first = errors[0];
  if (!first) return 'The sweep definition is invalid';
  const more = errors.length > 1 ? ` (and ${errors.length - 1} more)` : '';
  return `Invalid sweep definition: ${first.label ?? first.path}: ${first.message}${more}`;
}
