import {
  ConflictError,
  DomainError,
  ForbiddenError,
  NotFoundError,
  TooLargeError,
  ValidationError,
  type ErrorDetail,
} from '@driftgrid/domain';
import { ReadAbortedError, ReadBudgetError, ReadBusyError } from './read-errors.js';
import type { ReadResultOf, ReadTask } from './read-tasks.js';

/**
 * Heavy reads (sorted or filtered result pages, plot series, fit sources) run here, away from the
 * request thread, each within a time budget and under a per-user cap. The api thread only routes,
 * authorises and writes. Injected as a Nest provider (ReadsModule); tests may swap the implementation.
 */
export abstract class HeavyReads {
  /**
   * Runs one task for a user. Rejects with ReadBudgetError (503) when it outlives the budget,
   * ReadLimitError (429) when the user has too many running, ReadBusyError (503) when the pool's
   * queue is full, ReadAbortedError when `signal` (the client went away) fires first.
   */
  abstract run<T extends ReadTask>(userId: number, task: T, options?: ReadOptions): Promise<ReadResultOf<T>>;

  /** Where heavy reads run and how many threads have loaded (GET /api/health). */
  abstract readonly readiness: ReadReadiness;
}

/** `pool`: on `threads` worker threads, of which `ready` have loaded; `inline`: on the api thread. */
export interface ReadReadiness {
  mode: 'pool' | 'inline';
  threads: number;
  ready: number;
}

export interface ReadOptions {
  /** Fires when the client has gone away: the read is stopped. */
  signal?: AbortSignal;
  /** Another time budget than the configured one (a read known to be long, such as a whole export). */
  budgetMs?: number;
}

const KNOWN: Record<string, new (m: string, d?: ErrorDetail[]) => DomainError> = {
  ValidationError,
  NotFoundError,
  ConflictError,
  ForbiddenError,
  TooLargeError,
};

/** A domain error that crossed the thread boundary by name, rebuilt with its class. */
export function rebuildError(e: { name: string; message: string; details?: ErrorDetail[] }): Error {
  const cls = KNOWN[e.name];
  return cls ? new cls(e.message, e.details) : new Error(e.message);
}

/** Maps a failure of the pool to the read errors, given which signal fired. */
export function readFailure(
  e: unknown,
  budget: { signal: AbortSignal; ms: number },
  client: AbortSignal | undefined,
): Error {
  if (client?.aborted) return new ReadAbortedError();
  if (budget.signal.aborted) return new ReadBudgetError(budget.ms);
  if (e instanceof Error && /queue is at limit|no task queue available/i.test(e.message)) return new ReadBusyError();
  return e instanceof Error ? e : new Error(String(e));
}
