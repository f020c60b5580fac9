// Thread entry of the heavy-read pool (api/dist/reads/read-thread.js once built; piscina loads it).
// Nest's decorators on the shared repository classes need the metadata polyfill, loaded first.
import 'reflect-metadata';
import Database from 'better-sqlite3';
import { workerData } from 'node:worker_threads';
import { move, transferableSymbol, valueSymbol } from 'piscina';
import { lowerThreadPriority } from '@driftgrid/worker/thread-priority';
import { ReadTaskRunner, type ReadTask } from './read-tasks.js';

const { dbFile, loaded } = workerData as { dbFile: string; loaded?: Int32Array };

// A heavy read never takes the cores from the request thread (which answers health and catalogue).
lowerThreadPriority('reads');

// One read-only connection per thread: WAL lets it read while the api thread writes.
const db = new Database(dbFile, { readonly: true, fileMustExist: true });
db.pragma('busy_timeout = 5000');
const runner = new ReadTaskRunner(db);
// Tells the pool this thread has loaded (its readiness count; read-pool.ts).
if (loaded) Atomics.add(loaded, 0, 1);

/**
 * Runs a task and hands its reply back. Typed arrays in the value (orders, whole columns, an export
 * batch's bytes) are moved, not copied: the api thread receives them without a copy, and large
 * copies would land in the api's old generation, which is collected rarely.
 */
export default function run(task: ReadTask): unknown {
  const reply = runner.run(task);
  const buffers = reply.ok ? ownedBuffers(reply.value) : [];
  if (buffers.length === 0) return reply;
  return move({
    get [transferableSymbol]() {
      return buffers;
    },
    get [valueSymbol]() {
      return reply;
    },
  });
}

/**
 * ArrayBuffers of the typed arrays in a value (top level and one object or array below, as in columns)
 * that each own their whole buffer: a view into a shared buffer (Node's small-Buffer pool) must not be
 * moved, or the rest of that buffer would vanish from this thread.
 */
function ownedBuffers(value: unknown): ArrayBuffer[] {
  const found = new Set<ArrayBuffer>();
  const visit = (v: unknown, depth: number) => {
    if (ArrayBuffer.isView(v)) {
      if (v.buffer instanceof ArrayBuffer && v.byteOffset === 0 && v.byteLength === v.buffer.byteLength)
        found.add(v.buffer);
    } else if (v && typeof v === 'object' && depth < 2) {
      for (const x of Array.isArray(v) ? v : Object.values(v)) visit(x, depth + 1);
    }
  };
  visit(value, 0);
  return [...found];
}
