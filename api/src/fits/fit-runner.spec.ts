import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Logger } from '@nestjs/common';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { ValidationError } from '@driftgrid/domain';
import { FIT_THREAD_PROTOCOL, FitRunner } from './fit-runner.js';

// A new thread loads the engine (mathjs included) before it answers: generous timeouts, no timing asserted.
describe('FitRunner', () => {
  it('returns the engine result (in a thread when built, else inline on a later turn)', async () => {
    const runner = new FitRunner();
    const x = Float64Array.from({ length: 50 }, (_, i) => 1 + i);
    const y = x.map((v) => 2 * v ** 1.5);
    const r = await runner.run({ model: 'power-law', x: { a: x }, xNames: ['a'], y });
    expect(r.converged).toBe(true);
    expect(r.parameters[1]!.value).toBeCloseTo(1.5, 12);
    await runner.close();
  }, 30_000);

  it('passes validation errors through as ValidationError (they become failed fits, not 500s)', async () => {
    const runner = new FitRunner();
    const err = await runner
      .run({ model: 'power-law', x: { a: [1, 2, 3] }, xNames: ['a'], y: [1, -1, 2] })
      .catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ValidationError);
    expect((err as ValidationError).details?.[0]?.path).toBe('y');
    await runner.close();
  }, 30_000);
});

describe('FitRunner thread handling', () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'fit-thread-'));
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));
  const file = (name: string, body: string) => {
    const f = path.join(dir, name);
    fs.writeFileSync(f, `import { parentPort } from 'node:worker_threads';\n${body}`);
    return f;
  };
  const x = Float64Array.from({ length: 20 }, (_, i) => 1 + i);
  const input = { model: 'power-law' as const, x: { a: x }, xNames: ['a'], y: x.map((v) => 4 * v) };

  it('falls back inline for a stale thread build (another protocol) and stays inline', async () => {
    // The fallback is announced once in the log (kept out of the test output, checked here).
    const warn = vi.spyOn(Logger.prototype, 'warn').mockImplementation(() => undefined);
    const runner = new FitRunner().useThreadEntry(file('stale.mjs', 'parentPort.postMessage({ ready: 1 });'));
    const r = await runner.run(input);
    expect(r.parameters[0]!.value).toBeCloseTo(4, 10);
    expect(runner.mode).toBe('inline');
    expect(warn).toHaveBeenCalledWith(expect.stringMatching(/stale thread build .*running the fit inline/));
    warn.mockRestore();
    await runner.close();
  }, 30_000);

  it('falls back inline when the thread cannot load', async () => {
    const warn = vi.spyOn(Logger.prototype, 'warn').mockImplementation(() => undefined);
    const runner = new FitRunner().useThreadEntry(file('broken.mjs', 'throw new Error("cannot load");'));
    const r = await runner.run(input);
    expect(r.converged).toBe(true);
    expect(warn).toHaveBeenCalledWith(expect.stringMatching(/cannot load.*running the fit inline/));
    warn.mockRestore();
    await runner.close();
  }, 30_000);

  it('fails the fits a thread held when it dies mid-fit (no silent inline rerun)', async () => {
    const runner = new FitRunner().useThreadEntry(
      file(
        'dies.mjs',
        `parentPort.postMessage({ ready: ${FIT_THREAD_PROTOCOL} });\nparentPort.on('message', () => process.exit(3));`,
      ),
    );
    await expect(runner.run(input)).rejects.toThrow(/stopped before it answered/);
    await runner.close();
  }, 30_000);

  it('matches fit-thread.ts on the greeting protocol', () => {
    const src = fs.readFileSync(new URL('./fit-thread.ts', import.meta.url), 'utf8');
    expect(src).toContain(`postMessage({ ready: ${FIT_THREAD_PROTOCOL} })`);
  });
});
