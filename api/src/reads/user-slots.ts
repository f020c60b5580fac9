import { ReadLimitError } from './read-errors.js';

interface Waiter {
  grant: () => void;
  fail: (e: Error) => void;
}

/**
 * A per-user cap on concurrent heavy reads. A request over the cap waits up to `waitMs` for one of
 * the user's own reads to finish (a user paging quickly through a table is served in turn), and is
 * then refused with a 429: one user cannot hold the whole read pool.
 */
export class UserSlots {
  private readonly users = new Map<number, { active: number; waiters: Waiter[] }>();

  constructor(
    readonly perUser: number,
    readonly waitMs: number,
  ) {}

  /** Resolves with a release function once the user has a free slot. */
  acquire(userId: number, signal?: AbortSignal): Promise<() => void> {
    let u = this.users.get(userId);
    if (!u) this.users.set(userId, (u = { active: 0, waiters: [] }));
    const entry = u;
    let released = false;
    const release = () => {
      if (released) return;
      released = true;
      const next = entry.waiters.shift();
      if (next) next.grant();
      else if (--entry.active === 0) this.users.delete(userId);
    };
    if (entry.active < this.perUser) {
      entry.active++;
      return Promise.resolve(release);
    }
    return new Promise((resolve, reject) => {
      const done = () => {
        clearTimeout(timer);
        signal?.removeEventListener('abort', onAbort);
        entry.waiters.splice(entry.waiters.indexOf(waiter), 1);
      };
      const waiter: Waiter = {
        // The releasing read hands its slot over: active stays the same.
        grant: () => {
          clearTimeout(timer);
          signal?.removeEventListener('abort', onAbort);
          resolve(release);
        },
        fail: (e) => {
          done();
          reject(e);
        },
      };
      const timer = setTimeout(() => waiter.fail(new ReadLimitError(this.perUser, this.waitMs)), this.waitMs);
      const onAbort = () => waiter.fail(signal!.reason instanceof Error ? signal!.reason : new Error('aborted'));
      signal?.addEventListener('abort', onAbort, { once: true });
      entry.waiters.push(waiter);
    });
  }

  /** Reads running for a user (for tests and diagnostics). */
  active(userId: number): number {
    return this.users.get(userId)?.active ?? 0;
  }
}
