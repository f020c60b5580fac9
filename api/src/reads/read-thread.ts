// Thread entry of the heavy-read pool (api/dist/reads/read-thread.js once built; piscina loads it).
// Nest's decorators on the shared repository classes need the metadata polyfill, loaded first.
import 'reflect-metadata';
import Database from 'better-sqlite3';
import { workerData } from 'node:worker_threads';
import { lowerThreadPriority } from '@driftgrid/worker/thread-priority';
import { ReadTaskRunner, type ReadReply, type ReadTask } from './read-tasks.js';

const { dbFile, loaded } = workerData as { dbFile: string; loaded?: Int32Array };

// A heavy read never takes the cores from the request thread (which answers health and catalogue).
lowerThreadPriority('reads');

// One read-only connection per thread: WAL lets it read while the api thread writes.
const db = new Database(dbFile, { readonly: true, fileMustExist: true });
db.pragma('busy_timeout = 5000');
const runner = new ReadTaskRunner(db);
// Tells the pool this thread has loaded (its readiness count; read-pool.ts).
if (loaded) Atomics.add(loaded, 0, 1);

export default function run(task: ReadTask): ReadReply {
  return runner.run(task);
}
