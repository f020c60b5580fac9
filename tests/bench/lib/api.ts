/**
 * Drives the built api (api/dist/main.js) as a child process on a fresh DATA_DIR, on 127.0.0.1:
 * start, sign in, submit a sweep and wait for it, count its stored rows straight from SQLite.
 */
import Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';
import { apiJson, apiLogin, freePort, REPO, spawnNode, waitForHealth, type Proc } from '../../support/processes.js';
import { removeDir, tempDir, track } from './resources.js';
import { isActiveState } from '@driftgrid/domain';

export const ROW_SPAN = 2 ** 32;

export interface ApiHandle {
  baseUrl: string;
  proc: Proc;
  pid: number;
  dataDir: string;
  token: string;
  dbFile: string;
  /** Spawn → healthy → signed in, ms. */
  startMs: number;
  stop(): Promise<void>;
}

/** Stops a child: SIGTERM, then SIGKILL if it has not exited after `graceMs`. */
export async function stopProc(proc: Proc, graceMs = 8000): Promise<void> {
  if (proc.child.exitCode !== null || proc.child.signalCode !== null) return;
  const t = setTimeout(() => proc.child.kill('SIGKILL'), graceMs);
  await proc.kill('SIGTERM');
  clearTimeout(t);
}

/** BENCH_CPU_PROF=1: each api writes a V8 CPU profile here when it exits (git-ignored). */
export const PROFILE_DIR = path.join(REPO, 'tests', '.tmp', 'bench-profiles');

export async function startApi(label: string, env: Record<string, string> = {}): Promise<ApiHandle> {
  const t0 = performance.now();
  const profile = process.env.BENCH_CPU_PROF === '1';
  if (profile) fs.mkdirSync(PROFILE_DIR, { recursive: true });
  const dataDir = tempDir(label);
  const port = await freePort();
  const apiEnv = {
    NODE_ENV: 'test',
    LOG_LEVEL: 'warn',
    HOST: '127.0.0.1',
    PORT: String(port),
    DEMO_SEED: 'true',
    DATA_DIR: dataDir,
    ...env,
  };
  const proc = profile
    ? spawnNode('api/dist/main.js', apiEnv, [
        '--cpu-prof',
        `--cpu-prof-dir=${PROFILE_DIR}`,
        `--cpu-prof-name=api-${label}-${Date.now()}.cpuprofile`,
      ])
    : spawnNode('api/dist/main.js', apiEnv);
  const stop = track(`api ${label}`, async () => {
    await stopProc(proc);
    removeDir(dataDir);
  });
  const baseUrl = `http://127.0.0.1:${port}`;
  try {
    await waitForHealth(baseUrl, proc, 60_000);
    // Read-pool threads load for a second or two after the api answers: memory baselines come after.
    await waitForReadThreads(baseUrl, 60_000);
    const token = await apiLogin(baseUrl, 'researcher@example.com');
    const api: ApiHandle = {
      baseUrl,
      proc,
      pid: proc.child.pid!,
      dataDir,
      token,
      dbFile: path.join(dataDir, 'driftgrid.db'),
      stop,
      startMs: 0,
    };
    await waitIdle(api);
    api.startMs = performance.now() - t0;
    return api;
  } catch (e) {
    await stop();
    throw e;
  }
}

/** Waits until no sweep of the demo seed (if any) is queued or running, so it cannot skew a figure. */
async function waitIdle(api: ApiHandle, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await apiJson(api.baseUrl, api.token, 'GET', '/api/sweeps?pageSize=1000');
    if (r.status !== 200) return; // catalogue route missing: nothing to wait for
    const busy = (r.body.items as { status: string }[]).filter((s) => isActiveState(s.status));
    if (!busy.length) return;
    if (Date.now() > deadline) throw new Error(`demo sweeps still running after ${timeoutMs} ms`);
    await new Promise((res) => setTimeout(res, 200));
  }
}

export interface SweepRun {
  id: number;
  points: number;
  chunks: number;
  /** Submit (before POST) to the poll that saw `completed`, client clock. */
  wallMs: number;
  /** finishedAt − createdAt from the api (ms resolution of its clock). */
  serverMs: number;
  computeMs: number;
  rows: number;
  workers: { id: string; chunks: number; points: number }[];
}

/** Submits a sweep and waits for it; anything but `completed` with every row stored throws. */
export async function runSweep(api: ApiHandle, definition: unknown, timeoutMs = 600_000): Promise<SweepRun> {
  const t0 = performance.now();
  const created = await apiJson(api.baseUrl, api.token, 'POST', '/api/sweeps', definition);
  if (created.status !== 201)
    throw new Error(`POST /api/sweeps answered ${created.status}: ${JSON.stringify(created.body)}`);
  const id = created.body.id as number;
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await apiJson(api.baseUrl, api.token, 'GET', `/api/sweeps/${id}`);
    if (r.status !== 200) throw new Error(`GET /api/sweeps/${id} answered ${r.status}: ${JSON.stringify(r.body)}`);
    const s = r.body;
    if (s.status === 'completed') {
      const wallMs = performance.now() - t0;
      const rows = countRows(api.dbFile, id);
      if (rows !== s.points) throw new Error(`sweep ${id} completed with ${rows} stored rows, expected ${s.points}`);
      return {
        id,
        points: s.points,
        chunks: s.chunks,
        wallMs,
        rows,
        serverMs: Date.parse(s.finishedAt) - Date.parse(s.createdAt),
        computeMs: s.provenance?.computeMs ?? NaN,
        workers: s.provenance?.workers ?? [],
      };
    }
    if (!isActiveState(s.status)) {
      throw new Error(
        `sweep ${id} ended ${s.status}${s.error ? `: ${s.error}` : ''}\napi output:\n${api.proc.output().slice(-3000)}`,
      );
    }
    if (api.proc.child.exitCode !== null)
      throw new Error(`api exited during sweep ${id}:\n${api.proc.output().slice(-3000)}`);
    if (Date.now() > deadline)
      throw new Error(`sweep ${id} still ${s.status} after ${timeoutMs} ms (${s.progress.done}/${s.progress.total})`);
    await new Promise((res) => setTimeout(res, 100));
  }
}

/**
 * The first sweep after an api start pays one-off costs (compute thread, queue scripts, JIT): a
 * small sweep is run first so the measured sweeps show steady state; its time is returned.
 */
export async function warmUp(api: ApiHandle, definition: unknown): Promise<number> {
  return (await runSweep(api, definition)).wallMs;
}

/** Rows of a sweep in the results table (rowid range), read on a separate connection. */
export function countRows(dbFile: string, sweepId: number): number {
  const db = new Database(dbFile, { readonly: true, fileMustExist: true });
  try {
    const r = db
      .prepare('select count(*) as n from results where id >= ? and id < ?')
      .get(sweepId * ROW_SPAN, (sweepId + 1) * ROW_SPAN) as { n: number };
    return r.n;
  } finally {
    db.close();
  }
}

/** Checkpoints the WAL into the main file, then returns the size of driftgrid.db plus -wal. */
export function checkpointedBytes(dbFile: string): { dbBytes: number; walBytes: number; total: number } {
  const db = new Database(dbFile, { fileMustExist: true });
  try {
    db.pragma('busy_timeout = 5000');
    db.pragma('wal_checkpoint(TRUNCATE)');
  } finally {
    db.close();
  }
  const size = (f: string) => (fs.existsSync(f) ? fs.statSync(f).size : 0);
  const dbBytes = size(dbFile);
  const walBytes = size(`${dbFile}-wal`);
  return { dbBytes, walBytes, total: dbBytes + walBytes };
}

/** GET a route and time it; `available` is false on 404/405 (route not built yet). */
export async function timedGet(
  api: ApiHandle,
  route: string,
): Promise<{ ms: number; status: number; body: unknown; bytes: number }> {
  const t0 = performance.now();
  const r = await fetch(`${api.baseUrl}${route}`, { headers: { authorization: `Bearer ${api.token}` } });
  const text = await r.text();
  const ms = performance.now() - t0;
  let body: unknown = text;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    /* not JSON */
  }
  return { ms, status: r.status, body, bytes: text.length };
}

/** Waits until GET /api/health says every read-pool thread has loaded (or the pool is off). */
async function waitForReadThreads(baseUrl: string, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const h = (await (await fetch(`${baseUrl}/api/health`)).json()) as { reads?: { threads: number; ready: number } };
    if (!h.reads || h.reads.ready >= h.reads.threads) return;
    if (Date.now() > deadline) throw new Error(`read threads not loaded after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
