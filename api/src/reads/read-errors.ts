import { DomainError } from '@driftgrid/domain';

/**
 * Errors of the heavy-read pool; the global error filter maps them to HTTP (503 and 429, with a
 * Retry-After). Messages are advice in the user's words, not internals.
 */
export class ReadBudgetError extends DomainError {
  readonly retryAfterSeconds = 5;
  constructor(budgetMs: number) {
    super(
      `This view took longer than the ${(budgetMs / 1000).toLocaleString('en-US')} s allowed for one read and was stopped. ` +
        'Narrow the filter (fewer rows), sort by the point index, or try again in a moment when the server is less busy.',
    );
  }
}

/** The read pool's queue is full: the server is busy with other heavy reads. */
export class ReadBusyError extends DomainError {
  readonly retryAfterSeconds = 2;
  constructor() {
    super('The server is busy with other large reads; try again in a few seconds, or narrow the filter.');
  }
}

/** One user already runs as many heavy reads as allowed. */
export class ReadLimitError extends DomainError {
  readonly retryAfterSeconds = 1;
  constructor(perUser: number, waitMs: number) {
    super(
      `You already have ${perUser} large read${perUser === 1 ? '' : 's'} (sorted or filtered pages, plots, fits, exports) in progress ` +
        `and none finished within ${(waitMs / 1000).toLocaleString('en-US')} s; wait for them to finish, then try again.`,
    );
  }
}

/** The client went away before its read finished: the work was stopped and nobody is waiting for an answer. */
export class ReadAbortedError extends DomainError {
  readonly retryAfterSeconds = 0;
  constructor() {
    super('The request was cancelled by the client before its read finished.');
  }
}
