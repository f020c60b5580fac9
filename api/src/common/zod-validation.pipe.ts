import { Injectable, type PipeTransform } from '@nestjs/common';
import { ValidationError } from '@driftgrid/domain';
import type { z } from 'zod';

/** Validates a body or query against a zod contract from domain/; errors name each field. */
@Injectable()
export class ZodValidationPipe<T extends z.ZodType> implements PipeTransform<unknown, z.infer<T>> {
  constructor(
    private readonly schema: T,
    private readonly where: 'body' | 'query' = 'body',
  ) {}

  transform(value: unknown): z.infer<T> {
    if (this.where === 'query') this.refuseUnknownParameters(value);
    const result = this.schema.safeParse(value ?? {});
    if (result.success) return result.data;
    const details = result.error.issues.map((i) => ({
      path: i.path.length ? i.path.map(String).join('.') : this.where,
      message: i.message,
    }));
    const first = details[0];
    throw new ValidationError(`Invalid ${this.where}: ${first.path}: ${first.message}`, details);
  }

  /** A misspelt query parameter would otherwise be ignored silently (zod strips unknown keys). */
  private refuseUnknownParameters(value: unknown): void {
    const known = objectKeys(this.schema);
    if (!known || typeof value !== 'object' || value === null) return;
    const unknown = Object.keys(value).filter((k) => !known.includes(k));
    if (!unknown.length) return;
    const list = known.join(', ');
    const details = unknown.map((k) => ({
      path: k.slice(0, 64),
      message: `unknown query parameter; this route takes ${list}`,
    }));
    throw new ValidationError(`Invalid query: ${details[0].path}: ${details[0].message}`, details);
  }
}

/** The keys of an object schema, looking through pipes (transforms); null when not an object. */
function objectKeys(schema: z.ZodType): string[] | null {
  // By the schema's own type tag rather than instanceof: domain may load its own copy of zod.
  const def = schema.def as { type: string; shape?: Record<string, unknown>; in?: z.ZodType };
  if (def.type === 'object' && def.shape) return Object.keys(def.shape);
  if (def.type === 'pipe' && def.in) return objectKeys(def.in);
  return null;
}
