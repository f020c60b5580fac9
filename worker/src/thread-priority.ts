import os from 'node:os';

/**
 * Scheduler niceness of background threads. On 2 cores a sweep's compute threads and the heavy-read
 * pool can keep every core busy; at equal priority the api's request thread then waits its turn
 * behind them and /api/health or a catalogue page takes 100s of ms. Lowering the background threads'
 * priority (common practice for batch work) lets the request thread run as soon as it has work,
 * while the background threads still use every idle cycle. Reads rank above compute: a person waits
 * for a read page, nobody waits for one chunk.
 */
export const THREAD_NICENESS = { reads: 5, compute: 10 } as const;

/**
 * Lowers the calling thread's priority. On Linux `setpriority(PRIO_PROCESS, 0, …)` applies to the
 * calling thread only (threads are scheduled entities of their own), so a worker thread can lower
 * itself without touching the event loop's thread. Best effort: elsewhere, or where refused, the
 * thread keeps its priority.
 */
export function lowerThreadPriority(kind: keyof typeof THREAD_NICENESS): boolean {
  if (process.platform !== 'linux') return false;
  try {
    os.setPriority(Math.max(os.getPriority(), THREAD_NICENESS[kind]));
    return true;
  } catch {
    return false;
  }
}
