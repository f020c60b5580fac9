import os from 'node:os';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { THREAD_NICENESS } from './thread-priority.js';

// The built module (a worker thread runs JavaScript only; `npm test` builds first).
const built = pathToFileURL(fileURLToPath(new URL('../dist/thread-priority.js', import.meta.url))).href;

/** Lowers a fresh thread's priority through the built module; answers what that thread then reads. */
function inThread(kind: keyof typeof THREAD_NICENESS): Promise<{ lowered: boolean; priority: number }> {
  const code = `
    const { parentPort } = require('node:worker_threads');
    const os = require('node:os');
    import(${JSON.stringify(built)}).then((m) => {
      const lowered = m.lowerThreadPriority(${JSON.stringify(kind)});
      parentPort.postMessage({ lowered, priority: os.getPriority() });
    });`;
  return new Promise((resolve, reject) => {
    const w = new Worker(code, { eval: true });
    w.once('message', (m: { lowered: boolean; priority: number }) => void w.terminate().then(() => resolve(m)));
    w.once('error', reject);
  });
}

describe.runIf(process.platform === 'linux')('lowerThreadPriority (Linux: per-thread niceness)', () => {
  it('lowers the calling thread only, to its level, and leaves the event loop thread as it was', async () => {
    const before = os.getPriority();
    const compute = await inThread('compute');
    const reads = await inThread('reads');
    expect(compute).toEqual({ lowered: true, priority: Math.max(before, THREAD_NICENESS.compute) });
    expect(reads).toEqual({ lowered: true, priority: Math.max(before, THREAD_NICENESS.reads) });
    // The thread that answers requests keeps its priority (setpriority on a thread id, not the process).
    expect(os.getPriority()).toBe(before);
  });
});
