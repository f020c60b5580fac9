import type Database from 'better-sqlite3';

/**
 * The one way to open a transaction. better-sqlite3 runs it synchronously: nothing else on this
 * connection interleaves, so a check and the write it guards cannot be split by another request.
 * A call inside another becomes a savepoint. Repositories call this function with their connection
 * (it also works on the read pool's read-only connections); services inject `Transactions`.
 */
export function inTransaction<T>(sqlite: Database.Database, fn: () => T): T {
  return sqlite.transaction(fn)();
}

/** The api connection's transactions for services (provided by DbModule): `this.tx.run(() => …)`. */
export class Transactions {
  constructor(private readonly sqlite: Database.Database) {}

  run<T>(fn: () => T): T {
    return inTransaction(this.sqlite, fn);
  }
}
