import { describe, expect, it } from 'vitest';
import { ValidationError } from '@driftgrid/domain';
import { FitRunner } from './fit-runner.js';

describe('FitRunner', () => {
  it('returns the engine result (in a thread when built, else inline on a later turn)', async () => {
    const runner = new FitRunner();
    const x = Float64Array.from({ length: 50 }, (_, i) => 1 + i);
    const y = x.map((v) => 2 * v ** 1.5);
    const r = await runner.run({ model: 'power-law', x: { a: x }, xNames: ['a'], y });
    expect(r.converged).toBe(true);
    expect(r.parameters[1]!.value).toBeCloseTo(1.5, 12);
    await runner.close();
  });

  it('passes validation errors through as ValidationError (they become failed fits, not 500s)', async () => {
    const runner = new FitRunner();
    const err = await runner.run({ model: 'power-law', x: { a: [1, 2, 3] }, xNames: ['a'], y: [1, -1, 2] }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ValidationError);
    expect((err as ValidationError).details?.[0]?.path).toBe('y');
    await runner.close();
  });
});
