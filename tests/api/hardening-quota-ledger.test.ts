/**
 * Issue 14 §2.1: the rolling 30-day points quota counts points in a ledger that deleting or
 * cancelling a sweep does not touch, so "run, download, delete, repeat" cannot refund it.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
let admin: string;
let researcher: string;
let rosaId: number;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

// smallSweep is 7 × 5 = 35 points.
const POINTS = 35;

async function used(): Promise<number> {
  const me = await t.http.get('/api/auth/me').set(auth(researcher));
  expect(me.status).toBe(200);
  return me.body.usage.pointsLast30Days as number;
}

beforeAll(async () => {
  t = await startTestApp();
  admin = await t.login(DEMO.admin);
  researcher = await t.login(DEMO.researcher);
  rosaId = (await t.http.get('/api/auth/me').set(auth(researcher))).body.user.id;
});
afterAll(async () => {
  await t?.close();
});

describe('the 30-day points ledger', () => {
  it('keeps the points of a deleted sweep', async () => {
    const before = await used();
    const s = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(smallSweep({ name: 'ledger delete' }));
    expect(s.status).toBe(201);
    expect(s.body.points).toBe(POINTS);
    await waitForSweep(t, researcher, s.body.id);
    expect(await used()).toBe(before + POINTS);
    expect((await t.http.delete(`/api/sweeps/${s.body.id}`).set(auth(researcher))).status).toBe(204);
    expect(await used()).toBe(before + POINTS);
  });

  it('keeps the points of a cancelled sweep, also after it is deleted', async () => {
    const before = await used();
    // Large enough to still be queued or running when the cancel arrives.
    const s = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(
        smallSweep({
          name: 'ledger cancel',
          axes: [
            { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 400 },
            { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 500 },
          ],
        }),
      );
    expect(s.status).toBe(201);
    const cancel = await t.http.post(`/api/sweeps/${s.body.id}/cancel`).set(auth(researcher));
    expect(cancel.status).toBe(200);
    expect(await used()).toBe(before + 200_000);
    expect((await t.http.delete(`/api/sweeps/${s.body.id}`).set(auth(researcher))).status).toBe(204);
    expect(await used()).toBe(before + 200_000);
  });

  it('refuses a new sweep once the ledger is full, however many sweeps were deleted', async () => {
    const spent = await used();
    const cap = spent + 2 * POINTS;
    const put = await t.http
      .put(`/api/admin/quotas/users/${rosaId}`)
      .set(auth(admin))
      .send({ maxPointsPer30Days: cap });
    expect(put.status).toBe(200);
    for (let i = 0; i < 2; i++) {
      const s = await t.http
        .post('/api/sweeps')
        .set(auth(researcher))
        .send(smallSweep({ name: `ledger loop ${i}` }));
      expect(s.status).toBe(201);
      await waitForSweep(t, researcher, s.body.id);
      expect((await t.http.delete(`/api/sweeps/${s.body.id}`).set(auth(researcher))).status).toBe(204);
    }
    const third = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(smallSweep({ name: 'ledger loop 2' }));
    expect(third.status).toBe(429);
    expect(third.body.details).toEqual([expect.objectContaining({ path: 'maxPointsPer30Days' })]);
    expect(await used()).toBe(cap);
  });
});
