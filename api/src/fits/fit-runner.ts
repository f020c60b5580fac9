import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { Injectable, Logger } from '@nestjs/common';
import { fitModel, ValidationError, type ErrorDetail, type FitInput, type FitResult } from '@driftgrid/domain';

/** The built thread entry, if there is one (a thread file must be JavaScript; tests run from source). */
function threadEntry(): string | null {
  const here = path.dirname(fileURLToPath(import.meta.url));
  const candidates = [path.join(here, 'fit-thread.js'), path.resolve(here, '../../dist/fits/fit-thread.js')];
  return candidates.find((f) => fs.existsSync(f)) ?? null;
}

function rebuild(error: { name: string; message: string; details?: unknown }): Error {
  if (error.name === 'ValidationError') return new ValidationError(error.message, error.details as ErrorDetail[] | undefined);
  return new Error(error.message);
}

/**
 * Runs long fits off the request. With a built api a fit gets its own worker thread (one per fit,
 * ended when it answers), so the event loop keeps serving; without one — tests from source — the
 * fit runs inline on a later turn of the event loop (setImmediate), after the 202 has gone out.
 */
@Injectable()
export class FitRunner {
  private readonly logger = new Logger('FitRunner');
  private readonly threads = new Set<Worker>();

  /** 'thread' when a built thread entry exists, else 'inline'. */
  get mode(): 'thread' | 'inline' {
    return threadEntry() ? 'thread' : 'inline';
  }

  run(input: FitInput): Promise<FitResult> {
    const entry = threadEntry();
    if (!entry) return this.inline(input);
    return this.inThread(entry, input).catch((e: unknown) => {
      if (e instanceof ThreadUnavailable) {
        this.logger.warn(`fit thread unavailable (${e.message}); running the fit inline`);
        return this.inline(input);
      }
      throw e;
    });
  }

  private inline(input: FitInput): Promise<FitResult> {
    return new Promise((resolve, reject) => {
      setImmediate(() => {
        try {
          resolve(fitModel(input));
        } catch (e) {
          reject(e as Error);
        }
      });
    });
  }

  private inThread(entry: string, input: FitInput): Promise<FitResult> {
    return new Promise((resolve, reject) => {
      const worker = new Worker(entry);
      this.threads.add(worker);
      let answered = false;
      const done = () => {
        this.threads.delete(worker);
        void worker.terminate();
      };
      worker.on('message', (msg: { ok: boolean; result?: FitResult; error?: { name: string; message: string; details?: unknown } }) => {
        answered = true;
        done();
        if (msg.ok) resolve(msg.result!);
        else reject(rebuild(msg.error!));
      });
      // A thread that cannot even load (stale build) falls back inline; a crash mid-fit is a failure.
      worker.on('error', (e) => {
        done();
        if (!answered) reject(new ThreadUnavailable(e.message));
      });
      worker.on('exit', (code) => {
        this.threads.delete(worker);
        if (!answered) reject(new Error(`the fit thread stopped (exit code ${code}) before it answered`));
      });
      worker.postMessage(input);
    });
  }

  async close(): Promise<void> {
    await Promise.all([...this.threads].map((w) => w.terminate()));
    this.threads.clear();
  }
}

class ThreadUnavailable extends Error {}
