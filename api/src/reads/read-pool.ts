import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Logger, type OnModuleDestroy } from '@nestjs/common';
import type Database from 'better-sqlite3';
import { Piscina } from 'piscina';
import { HeavyReads, readFailure, rebuildError, type ReadOptions, type ReadReadiness } from './heavy-reads.js';
import { ReadAbortedError } from './read-errors.js';
import { ReadTaskRunner, type ReadReply, type ReadResultOf, type ReadTask } from './read-tasks.js';
import { UserSlots } from './user-slots.js';

export interface ReadPoolOptions {
  dbFile: string;
  /** Pool threads (each with its own read-only connection); 0 runs the reads on the api thread. */
  threads: number;
  /** Time allowed per read, from the moment the user has a slot (the wait for a thread included). */
  budgetMs: number;
  /** Concurrent heavy reads per user, and how long an excess read waits for a slot before a 429. */
  perUser: number;
  waitMs: number;
  /** Reads waiting for a thread before the pool answers busy (503). */
  maxQueue: number;
}

/**
 * The pool thread entry must be JavaScript: next to this file once built, or the built file when
 * running from source (vitest), as worker/src/thread-pool.ts does for chunk threads.
 */
export function readThreadEntry(): string | null {
  const here = path.dirname(fileURLToPath(import.meta.url));
  const sibling = path.join(here, 'read-thread.js');
  if (fs.existsSync(sibling)) return sibling;
  const built = path.resolve(here, '../../dist/reads/read-thread.js');
  return fs.existsSync(built) ? built : null;
}

/**
 * Heavy reads on a piscina pool of worker threads. Over budget, or when the client goes away, the
 * task is aborted: taken off the queue, or — when already running — its thread is ended (piscina
 * terminates it and starts a fresh one). A statement that is inside SQLite at that moment finishes its
 * current step before the thread can stop; sorted views are computed in JavaScript between keyset
 * batches (sort-order.ts), so they stop promptly. Without a built thread entry (or with 0 threads) the
 * reads run on the api's connection and the budget is checked only before each read starts.
 */
export class PooledHeavyReads extends HeavyReads implements OnModuleDestroy {
  private readonly logger = new Logger('ReadPool');
  private readonly pool: Piscina | null;
  private readonly inline: ReadTaskRunner | null;
  /** Threads that finished loading (each adds one; see read-thread.ts), and threads ended since. */
  private readonly loaded = new Int32Array(new SharedArrayBuffer(4));
  private ended = 0;
  readonly slots: UserSlots;

  constructor(
    readonly options: ReadPoolOptions,
    fallbackDb: Database.Database,
    entry: string | null = readThreadEntry(),
  ) {
    super();
    this.slots = new UserSlots(options.perUser, options.waitMs);
    if (entry && options.threads > 0) {
      // Every thread is started at once and kept: loading one (domain, SQLite) takes a second or more,
      // which a read should not wait for.
      this.pool = new Piscina({
        filename: entry,
        minThreads: options.threads,
        maxThreads: options.threads,
        maxQueue: options.maxQueue,
        idleTimeout: Infinity,
        // The pool loads its (ESM) entry with require() first. On Node 20 that synchronous require(esm)
        // path can abort the whole process with a V8 fatal error when a thread is torn down while still
        // loading; without it the pool falls back to import(), which fails softly.
        execArgv: [...process.execArgv, '--no-experimental-require-module'],
        workerData: { dbFile: options.dbFile, loaded: this.loaded },
      });
      this.pool.on('workerDestroy', () => this.ended++);
      this.inline = null;
    } else {
      if (options.threads > 0)
        this.logger.warn('no built read thread (api/dist/reads/read-thread.js): heavy reads run on the api thread');
      this.pool = null;
      this.inline = new ReadTaskRunner(fallbackDb);
    }
  }

  /** 'pool' when reads run on threads, 'inline' otherwise. */
  get mode(): 'pool' | 'inline' {
    return this.pool ? 'pool' : 'inline';
  }

  async run<T extends ReadTask>(userId: number, task: T, options: ReadOptions = {}): Promise<ReadResultOf<T>> {
    const { signal } = options;
    let release: () => void;
    try {
      release = await this.slots.acquire(userId, signal);
    } catch (e) {
      throw signal?.aborted ? new ReadAbortedError() : e;
    }
    // The budget starts once the user has a slot: it covers the wait for a thread and the read itself.
    const ms = options.budgetMs ?? this.options.budgetMs;
    const budget = { ms, signal: AbortSignal.timeout(ms) };
    let reply: ReadReply;
    try {
      const stop = signal ? AbortSignal.any([signal, budget.signal]) : budget.signal;
      stop.throwIfAborted();
      reply = this.pool ? ((await this.pool.run(task, { signal: stop })) as ReadReply) : await this.runInline(task);
    } catch (e) {
      throw readFailure(e, budget, signal);
    } finally {
      release();
    }
    if (!reply.ok) throw rebuildError(reply.error);
    return reply.value as ReadResultOf<T>;
  }

  private runInline(task: ReadTask): Promise<ReadReply> {
    return new Promise((resolve, reject) =>
      setImmediate(() => {
        try {
          resolve(this.inline!.run(task));
        } catch (e) {
          reject(e as Error);
        }
      }),
    );
  }

  get readiness(): ReadReadiness {
    return { mode: this.mode, threads: this.pool ? this.options.threads : 0, ready: this.stats.ready };
  }

  /** Reads waiting for a thread, live threads, and threads loaded and ready (diagnostics and tests). */
  get stats(): { queued: number; threads: number; ready: number } {
    return {
      queued: this.pool?.queueSize ?? 0,
      threads: this.pool?.threads.length ?? 0,
      ready: this.pool ? Atomics.load(this.loaded, 0) - this.ended : 0,
    };
  }

  async onModuleDestroy(): Promise<void> {
    await this.pool?.destroy();
  }
}
