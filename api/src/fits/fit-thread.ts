import { parentPort } from 'node:worker_threads';
import { fitModel, type FitInput } from '@driftgrid/domain';

/**
 * Thread entry for long fits (api/dist/fits/fit-thread.js once built): runs the pure engine off the
 * api's event loop. Errors travel back by name, message and details so the api can rebuild them.
 */
parentPort!.on('message', (input: FitInput) => {
  try {
    const r = fitModel(input);
    parentPort!.postMessage({ ok: true, result: r }, [r.residuals.buffer, r.fitted.buffer] as ArrayBuffer[]);
  } catch (e) {
    const err = e as Error & { details?: unknown };
    parentPort!.postMessage({ ok: false, error: { name: err.name, message: err.message, details: err.details } });
  }
});
