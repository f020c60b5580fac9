import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { Injectable, Logger } from '@nestjs/common';
import { fitModel, ValidationError, type ErrorDetail, type FitInput, type FitResult } from '@driftgrid/domain';

/** Bumped with the message format of fit-thread.ts; a thread that greets with another is stale. */
export const FIT_THREAD_PROTOCOL = 2;
/** A thread that has not greeted by then is given up on (its fits run inline). */
const READY_TIMEOUT_MS = 20_000;

/**
 * The built thread entry, if there is one (a thread file must be JavaScript). Running from source
 * (tests), the built file is used only when it is newer than its source, so a stale build is skipped.
 */
function threadEntry(): string | null {
  const here = path.dirname(fileURLToPath(import.meta.url));
  const sibling = path.join(here, 'fit-thread.js');
  if (fs.existsSync(sibling)) return sibling;
  const built = path.resolve(here, '../../dist/fits/fit-thread.js');
  const source = path.join(here, 'fit-thread.ts');
  if (!fs.existsSync(built)) return null;
  if (fs.existsSync(source) && fs.statSync(built).mtimeMs < fs.statSync(source).mtimeMs) return null;
  return built;
}

function rebuild(error: { name: string; message: string; details?: unknown }): Error {
  if (error.name === 'ValidationError')
    return new ValidationError(error.message, error.details as ErrorDetail[] | undefined);
  return new Error(error.message);
}

type Pending = { resolve: (r: FitResult) => void; reject: (e: Error) => void; input: FitInput };
type Reply = {
  id: number;
  ok: boolean;
  result?: FitResult;
  error?: { name: string; message: string; details?: unknown };
};

/** One worker thread and the fits it holds (sent, or waiting for its greeting). */
interface ThreadSlot {
  worker: Worker;
  ready: boolean;
  pending: Map<number, Pending>;
}

/**
 * Runs long fits off the request. With a built api the fits go to one worker thread, started on the
 * first long fit and kept warm (loading the engine, mathjs included, costs seconds), so the event
 * loop keeps serving; fits queue on it one after another. Without a usable built thread file — tests
 * from source — or when the thread cannot start, a fit runs inline on a later turn of the event loop
 * (setImmediate), after the 202 has gone out.
 */
@Injectable()
export class FitRunner {
  private readonly logger = new Logger('FitRunner');
  private slot: ThreadSlot | null = null;
  private nextId = 1;
  private closed = false;
  /** Set when a thread never came up: later fits run inline without trying again. */
  private threadBroken = false;
  /** Tests point the runner at a thread file of their own. */
  private entryOverride: string | null = null;

  useThreadEntry(entry: string | null): this {
    this.entryOverride = entry;
    return this;
  }

  /** 'thread' when a usable built thread entry exists, else 'inline'. */
  get mode(): 'thread' | 'inline' {
    return !this.threadBroken && (this.entryOverride ?? threadEntry()) ? 'thread' : 'inline';
  }

  run(input: FitInput): Promise<FitResult> {
    const entry = this.closed || this.threadBroken ? null : (this.entryOverride ?? threadEntry());
    if (!entry) return this.inline(input);
    return new Promise((resolve, reject) => {
      const id = this.nextId++;
      const slot = this.thread(entry);
      slot.pending.set(id, { resolve, reject, input });
      if (slot.ready) slot.worker.postMessage({ id, input });
    });
  }

  private thread(entry: string): ThreadSlot {
    if (this.slot) return this.slot;
    const worker = new Worker(entry);
    worker.unref(); // never keeps the process alive on its own
    const slot: ThreadSlot = { worker, ready: false, pending: new Map() };
    const timer = setTimeout(() => giveUp('it did not start in time'), READY_TIMEOUT_MS);
    timer.unref();
    let over = false;
    // Fits that never reached a working thread run inline; fits lost in a crash mid-fit fail.
    const giveUp = (why: string) => {
      if (over) return;
      over = true;
      clearTimeout(timer);
      if (this.slot === slot) this.slot = null;
      if (!slot.ready) this.threadBroken = true;
      for (const p of slot.pending.values()) {
        if (!slot.ready && !this.closed) {
          this.logger.warn(`fit thread unavailable (${why}); running the fit inline`);
          this.inline(p.input).then(p.resolve, p.reject);
        } else p.reject(new Error(`the fit thread stopped before it answered (${why})`));
      }
      slot.pending.clear();
      void worker.terminate();
    };
    worker.on('message', (msg: Reply | { ready: number }) => {
      if ('ready' in msg) {
        if (msg.ready !== FIT_THREAD_PROTOCOL) return giveUp(`stale thread build (protocol ${msg.ready})`);
        clearTimeout(timer);
        slot.ready = true;
        for (const [id, p] of slot.pending) worker.postMessage({ id, input: p.input });
        return;
      }
      const p = slot.pending.get(msg.id);
      if (!p) return;
      slot.pending.delete(msg.id);
      if (msg.ok) p.resolve(msg.result!);
      else p.reject(rebuild(msg.error!));
    });
    worker.on('error', (e) => giveUp(e.message));
    worker.on('exit', (code) => giveUp(`exit code ${code}`));
    this.slot = slot;
    return slot;
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

  async close(): Promise<void> {
    this.closed = true;
    const slot = this.slot;
    this.slot = null;
    if (slot) await slot.worker.terminate();
  }
}
