import { Injectable, type PipeTransform } from '@nestjs/common';
import { ValidationError } from '@driftgrid/domain';

/** A positive integer id from the path; anything else is a 400 naming the parameter. */
@Injectable()
export class IdParamPipe implements PipeTransform<string, number> {
  constructor(private readonly name = 'id') {}

  transform(value: string): number {
    const n = Number(value);
    if (!/^\d{1,15}$/.test(value) || !Number.isSafeInteger(n) || n < 1) {
      throw new ValidationError(`Invalid path: ${this.name}: must be a positive whole number`, [
        { path: this.name, message: 'must be a positive whole number' },
      ]);
    }
    return n;
  }
}
