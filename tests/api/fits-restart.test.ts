import { afterAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, tempDataDir, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';
import fs from 'node:fs';

/**
 * A queued fit keeps its data in memory; when the process stops before it finishes, the next start
 * marks it failed with a message saying so (it is never left "queued" for ever, nor shown as done).
 */
describe('fits interrupted by a restart', () => {
  const dir = tempDataDir();
  let t: TestApp | undefined;
  afterAll(async () => {
    await t?.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('are marked failed on the next start', async () => {
    t = await startTestApp({ DATA_DIR: dir });
    const token = await t.login(DEMO.researcher);
    const res = await t.http.post('/api/sweeps').set('authorization', `Bearer ${token}`).send(smallSweep());
    await waitForSweep(t, token, res.body.id);
    const fit = await t.http
      .post('/api/fits')
      .set('authorization', `Bearer ${token}`)
      .send({ source: { kind: 'sweep', id: res.body.id }, model: 'power-law', y: 'vDe_ms', x: ['Te_eV', 'B_T'] });
    expect(fit.status).toBe(201);
    // Stand-in for a fit that was running when the process died.
    t.sqlite()
      .prepare("UPDATE fits SET status = 'running', result = NULL, progress = 0.1, finished_at = NULL WHERE id = ?")
      .run(fit.body.id);
    await t.close();
    t = await startTestApp({ DATA_DIR: dir });
    const again = await t.login(DEMO.researcher);
    const g = await t.http.get(`/api/fits/${fit.body.id}`).set('authorization', `Bearer ${again}`);
    expect(g.status).toBe(200);
    expect(g.body.status).toBe('failed');
    expect(g.body.error).toMatch(/server stopped before this fit finished/);
    expect(g.body.parameters).toBeUndefined();
  }, 60_000);
});
