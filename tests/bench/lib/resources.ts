/**
 * Everything the bench starts (child processes, Redis, temp dirs) is registered here so one
 * cleanup pass can stop and remove it, also after a failure or Ctrl+C.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

type Stopper = { label: string; stop: () => Promise<void> };

const stoppers: Stopper[] = [];
const dirs = new Set<string>();

/** Registers a stop function; returns an idempotent stop that also unregisters it. */
export function track(label: string, stop: () => Promise<void>): () => Promise<void> {
  let done = false;
  const entry: Stopper = {
    label,
    stop: async () => {
      if (done) return;
      done = true;
      await stop();
    },
  };
  stoppers.push(entry);
  return async () => {
    const i = stoppers.indexOf(entry);
    if (i >= 0) stoppers.splice(i, 1);
    await entry.stop();
  };
}

export function tempDir(prefix: string): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), `driftgrid-bench-${prefix}-`));
  dirs.add(dir);
  return dir;
}

export function removeDir(dir: string): void {
  fs.rmSync(dir, { recursive: true, force: true });
  dirs.delete(dir);
}

/** Stops every tracked thing (newest first) and removes every temp dir; never throws. */
export async function cleanupAll(): Promise<void> {
  while (stoppers.length) {
    const s = stoppers.pop()!;
    try {
      await withTimeout(s.stop(), 10_000, s.label);
    } catch (e) {
      console.error(`cleanup of ${s.label} failed: ${e instanceof Error ? e.message : JSON.stringify(e)}`);
    }
  }
  for (const d of [...dirs]) {
    try {
      removeDir(d);
    } catch (e) {
      console.error(`could not remove ${d}: ${e instanceof Error ? e.message : JSON.stringify(e)}`);
    }
  }
}

function withTimeout<T>(p: Promise<T>, ms: number, label: string): Promise<T> {
  return new Promise((resolve, reject) => {
    const t = setTimeout(() => reject(new Error(`${label} did not stop within ${ms} ms`)), ms);
    p.then(
      (v) => {
        clearTimeout(t);
        resolve(v);
      },
      (e: unknown) => {
        clearTimeout(t);
        reject(e instanceof Error ? e : new Error(JSON.stringify(e)));
      },
    );
  });
}
