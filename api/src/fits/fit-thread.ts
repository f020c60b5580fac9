import { parentPort } from 'node:worker_threads';
import { fitModel, type FitInput } from '@driftgrid/domain';
import { lowerThreadPriority } from '@driftgrid/worker/thread-priority';

/**
 * Thread entry for long fits (api/dist/fits/fit-thread.js once built): runs the pure engine off the
 * api's event loop, one request `{ id, input }` at a time. Errors travel back by name, message and
 * details so the api can rebuild them.
 */
// A long fit never takes the cores from the request thread.
lowerThreadPriority('reads');

// Keep in step with FIT_THREAD_PROTOCOL in fit-runner.ts (not imported: this file must stay tiny).
parentPort!.postMessage({ ready: 2 });

parentPort!.on('message', ({ id, input }: { id: number; input: FitInput }) => {
  try {
    const r = fitModel(input);
    parentPort!.postMessage({ id, ok: true, result: r }, [r.residuals.buffer, r.fitted.buffer] as ArrayBuffer[]);
  } catch (e) {
    const err = e as Error & { details?: unknown };
    parentPort!.postMessage({ id, ok: false, error: { name: err.name, message: err.message, details: err.details } });
  }
});
