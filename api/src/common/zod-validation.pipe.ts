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
    const result = this.schema.safeParse(value ?? {});
    if (result.success) return result.data;
    const details = result.error.issues.map((i) => ({
      path: i.path.length ? i.path.map(String).join('.') : this.where,
      message: i.message,
    }));
    const first = details[0];
    throw new ValidationError(`Invalid ${this.where}: ${first.path}: ${first.message}`, details);
  }
}
