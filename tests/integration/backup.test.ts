import fs from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { backup, restore } from '../../api/src/ops/backup.js';
import { DEMO, startTestApp, tempDataDir, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

const dirs: string[] = [];
const apps: TestApp[] = [];
afterAll(async () => {
  for (const a of apps) await a.close();
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

describe('online backup and restore', () => {
  it('copies a live database consistently and a restore serves the same sweeps', async () => {
    const live = await startTestApp();
    apps.push(live);
    const token = await live.login(DEMO.researcher);
    const created = await live.http
      .post('/api/sweeps')
      .set('authorization', `Bearer ${token}`)
      .send(smallSweep({ name: 'backed up scan' }));
    const before = await waitForSweep(live, token, created.body.id);
    fs.mkdirSync(path.join(live.dataDir, 'archives'), { recursive: true });
    fs.writeFileSync(path.join(live.dataDir, 'archives', 'sweep-test.zip'), 'not really a zip, but immutable bytes');

    const out = path.join(tempDataDir('driftgrid-backup-'), 'copy');
    dirs.push(path.dirname(out));
    const manifest = await backup(live.dataDir, out);
    expect(manifest.database.integrity).toBe('ok');
    expect(manifest.archives.map((a) => a.file)).toEqual(['archives/sweep-test.zip']);

    const fresh = tempDataDir('driftgrid-restore-');
    dirs.push(fresh);
    restore(out, fresh);
    expect(() => restore(out, fresh)).toThrow(/fresh DATA_DIR/);
    const restored = await startTestApp({ DATA_DIR: fresh });
    apps.push(restored);
    const token2 = await restored.login(DEMO.researcher);
    const after = await restored.http.get(`/api/sweeps/${before.id}`).set('authorization', `Bearer ${token2}`);
    expect(after.status).toBe(200);
    expect(after.body).toMatchObject({ name: 'backed up scan', status: 'completed', points: before.points });
    const n = restored.sqlite().prepare('SELECT COUNT(*) n FROM results').get() as { n: number };
    expect(n.n).toBe(before.points);
  });

  it('refuses a backup whose files do not match the manifest', async () => {
    const src = tempDataDir();
    dirs.push(src);
    const a = await startTestApp({ DATA_DIR: src });
    await a.close();
    const out = path.join(tempDataDir('driftgrid-backup-'), 'copy');
    dirs.push(path.dirname(out));
    await backup(src, out);
    fs.appendFileSync(path.join(out, 'driftgrid.db'), 'tampered');
    const fresh = tempDataDir();
    dirs.push(fresh);
    expect(() => restore(out, fresh)).toThrow(/SHA-256/);
  });
});
