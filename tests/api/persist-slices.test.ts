import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { ResultsWriter } from '../../api/src/sweeps/results-writer.repository.js';
import { ROWS_PER_SLICE } from '../../api/src/sweeps/sweep-persistence.service.js';
import { SweepsRepository } from '../../api/src/sweeps/sweeps.repository.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

/*
 * Issue 14: the api thread writes results (SQLite has one writer), so a chunk's rows are written in
 * slices with the event loop free in between, never a whole chunk in one go. Checked by behaviour
 * (what runs between two writes), never by timings.
 */

let t: TestApp;
let researcher: string;

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
});

afterAll(async () => {
  await t?.close();
});

/** 60 × 100 = 6,000 points: more than one default chunk (5,000), each chunk many slices. */
const bigEnough = (name: string) =>
  smallSweep({
    name,
    axes: [
      { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 60 },
      { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 100 },
    ],
  });

async function submit(name: string): Promise<number> {
  const res = await t.http.post('/api/sweeps').set('authorization', `Bearer ${researcher}`).send(bigEnough(name));
  expect(res.status).toBe(201);
  return res.body.id as number;
}

describe('chunk persistence in slices', () => {
  it('writes at most one slice per transaction and lets other work run between slices', async () => {
    const writer = t.app.get(ResultsWriter);
    const events: string[] = [];
    const write = writer.writeRows.bind(writer);
    const spy = vi.spyOn(writer, 'writeRows').mockImplementation((slots, firstId, flags, arrays, n) => {
      events.push(`write ${n}`);
      // Stands for a request that arrives while rows are being written: it must run before the next slice.
      setImmediate(() => events.push('turn'));
      write(slots, firstId, flags, arrays, n);
    });
    try {
      const id = await submit('sliced persistence');
      const done = await waitForSweep(t, researcher, id);
      expect(done.status).toBe('completed');
      expect(done.progress.done).toBe(6000);
      const writes = events.filter((e) => e.startsWith('write'));
      const rows = writes.map((e) => Number(e.split(' ')[1]));
      expect(rows.reduce((a, b) => a + b, 0)).toBe(6000);
      expect(Math.max(...rows)).toBeLessThanOrEqual(ROWS_PER_SLICE);
      // Between any two writes, the work queued during the first one has run.
      for (let i = 0; i + 1 < events.length; i++)
        if (events[i]!.startsWith('write')) expect(events.slice(i + 1).indexOf('turn')).toBe(0);
      // Every row landed once: 6,000 rows, indices 0 … 5,999.
      const n = t
        .sqlite()
        .prepare('SELECT COUNT(*) AS n, MIN(id) - ? AS lo, MAX(id) - ? AS hi FROM results WHERE id BETWEEN ? AND ?')
        .get(id * 2 ** 32, id * 2 ** 32, id * 2 ** 32, (id + 1) * 2 ** 32 - 1) as { n: number; lo: number; hi: number };
      expect(n).toEqual({ n: 6000, lo: 0, hi: 5999 });
    } finally {
      spy.mockRestore();
    }
  });

  it('removes the rows of a chunk whose sweep is deleted while they are being written', async () => {
    const writer = t.app.get(ResultsWriter);
    const sweeps = t.app.get(SweepsRepository);
    let target = 0;
    let deleted = false;
    const write = writer.writeRows.bind(writer);
    const spy = vi.spyOn(writer, 'writeRows').mockImplementation((slots, firstId, flags, arrays, n) => {
      write(slots, firstId, flags, arrays, n);
      // After the first slice of the sweep's first chunk, the sweep is deleted (as a request would, between slices).
      if (!deleted && target && Math.floor(firstId / 2 ** 32) === target) {
        deleted = true;
        setImmediate(() => sweeps.delete(target));
      }
    });
    try {
      target = await submit('deleted while written');
      const deadline = Date.now() + 60_000;
      while (!deleted && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
      expect(deleted).toBe(true);
      // Let every chunk still in flight reach its last transaction.
      await new Promise((r) => setTimeout(r, 1500));
      const left = t
        .sqlite()
        .prepare('SELECT COUNT(*) AS n FROM results WHERE id BETWEEN ? AND ?')
        .get(target * 2 ** 32, (target + 1) * 2 ** 32 - 1) as { n: number };
      expect(left.n).toBe(0);
    } finally {
      spy.mockRestore();
    }
  });
});
