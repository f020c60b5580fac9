import { isActiveState } from '@driftgrid/domain';
import Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { tempDataDir } from '../support/app.js';
import { apiJson, apiLogin, startApiProcess, type Proc } from '../support/processes.js';
import { smallSweep } from '../support/sweeps.js';

const procs: Proc[] = [];
const dirs: string[] = [];
afterAll(async () => {
  for (const p of procs) await p.kill('SIGKILL');
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

async function poll(
  baseUrl: string,
  token: string,
  id: number,
  until: (s: { status: string; progress: { done: number } }) => boolean,
  ms: number,
) {
  const deadline = Date.now() + ms;
  for (;;) {
    const r = await apiJson(baseUrl, token, 'GET', `/api/sweeps/${id}`);
    if (until(r.body)) return r.body;
    if (Date.now() > deadline) throw new Error(`timeout; last ${JSON.stringify(r.body?.progress)} ${r.body?.status}`);
    await new Promise((res) => setTimeout(res, 20));
  }
}

describe('recovery after kill -9 of the api (embedded queue)', () => {
  it('completes the sweep with exactly its points, no duplicates and no gaps', async () => {
    const dataDir = tempDataDir();
    dirs.push(dataDir);
    // Small chunks so the kill lands mid-sweep.
    const env = { DATA_DIR: dataDir, CHUNK_SIZE: '1000' };
    const first = await startApiProcess(env);
    procs.push(first.proc);
    const token = await apiLogin(first.baseUrl, 'researcher@example.com');
    const def = smallSweep({
      name: 'recovery scan',
      axes: [
        { param: 'Te_eV', kind: 'log', min: 1, max: 1000, count: 200 },
        { param: 'B_T', kind: 'linear', min: 0.1, max: 5, count: 1000 },
      ],
    });
    const created = await apiJson(first.baseUrl, token, 'POST', '/api/sweeps', def);
    expect(created.status).toBe(201);
    const id = created.body.id as number;
    const points = created.body.points as number;
    expect(points).toBe(200_000);
    await poll(first.baseUrl, token, id, (s) => s.progress.done > 0, 60_000);
    await first.proc.kill('SIGKILL');
    // What SQLite durably holds at the moment of the kill: work must be outstanding, else the test proves nothing.
    const atKill = new Database(path.join(dataDir, 'driftgrid.db'), { readonly: true });
    const persisted = (atKill.prepare('SELECT points_done AS n FROM sweeps WHERE id = ?').get(id) as { n: number }).n;
    atKill.close();
    expect(persisted).toBeLessThan(points);

    const second = await startApiProcess(env);
    procs.push(second.proc);
    const token2 = await apiLogin(second.baseUrl, 'researcher@example.com');
    const done = await poll(second.baseUrl, token2, id, (s) => !isActiveState(s.status), 120_000);
    expect(done.status).toBe('completed');
    expect(done.progress.done).toBe(points);
    await second.proc.kill('SIGTERM');

    const db = new Database(path.join(dataDir, 'driftgrid.db'), { readonly: true });
    const base = id * 2 ** 32;
    const stats = db
      .prepare('SELECT COUNT(*) n, MIN(id) - ? lo, MAX(id) - ? hi FROM results WHERE id BETWEEN ? AND ?')
      .get(base, base, base, base + 2 ** 32 - 1) as { n: number; lo: number; hi: number };
    // Rowids are unique, so count = points with min 0 and max points-1 means every idx is present once.
    expect(stats).toEqual({ n: points, lo: 0, hi: points - 1 });
    const chunks = db.prepare("SELECT COUNT(*) n FROM sweep_chunks WHERE sweep_id = ? AND state != 'done'").get(id) as {
      n: number;
    };
    expect(chunks.n).toBe(0);
    db.close();
  });
});
