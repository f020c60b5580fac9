/** Quota admin routes (SPEC §6 shapes) and quota + usage on GET /api/auth/me. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

let t: TestApp;
let admin: string;
let researcher: string;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestApp();
  admin = await t.login(DEMO.admin);
  researcher = await t.login(DEMO.researcher);
});
afterAll(async () => {
  await t?.close();
});

describe('quota admin', () => {
  it('GET /api/admin/quotas gives role defaults and overrides', async () => {
    const res = await t.http.get('/api/admin/quotas').set(auth(admin));
    expect(res.status).toBe(200);
    expect(Object.keys(res.body.defaults).sort()).toEqual(['admin', 'researcher', 'reviewer']);
    expect(res.body.defaults.reviewer).toEqual({
      maxPointsPerSweep: 0,
      maxRunningSweeps: 0,
      maxPointsPer30Days: 0,
      maxStoredPoints: 0,
    });
    expect(res.body.overrides).toEqual([]);
  });

  it('PUT a partial role default and a per-user override; null clears a field; me reflects it', async () => {
    const role = await t.http.put('/api/admin/quotas/roles/researcher').set(auth(admin)).send({ maxRunningSweeps: 5 });
    expect(role.status).toBe(200);
    expect(role.body.defaults.researcher).toMatchObject({ maxRunningSweeps: 5, maxPointsPerSweep: 2_000_000 });

    const me0 = await t.http.get('/api/auth/me').set(auth(researcher));
    const rosaId = me0.body.user.id;
    const user = await t.http
      .put(`/api/admin/quotas/users/${rosaId}`)
      .set(auth(admin))
      .send({ maxPointsPerSweep: 1000 });
    expect(user.status).toBe(200);
    expect(user.body.overrides).toEqual([
      {
        userId: rosaId,
        email: DEMO.researcher,
        name: 'Rosa Researcher',
        role: 'researcher',
        maxPointsPerSweep: 1000,
        maxRunningSweeps: null,
        maxPointsPer30Days: null,
        maxStoredPoints: null,
      },
    ]);

    const me = await t.http.get('/api/auth/me').set(auth(researcher));
    expect(me.body.quota).toEqual({
      maxPointsPerSweep: 1000,
      maxRunningSweeps: 5,
      maxPointsPer30Days: 20_000_000,
      maxStoredPoints: 50_000_000,
    });
    expect(me.body.usage).toEqual({ runningSweeps: 0, pointsLast30Days: 0, storedPoints: 0 });

    const cleared = await t.http
      .put(`/api/admin/quotas/users/${rosaId}`)
      .set(auth(admin))
      .send({ maxPointsPerSweep: null });
    expect(cleared.body.overrides).toEqual([]);
    expect((await t.http.get('/api/auth/me').set(auth(researcher))).body.quota.maxPointsPerSweep).toBe(2_000_000);
  });

  it('rejects bad quota bodies naming the field, unknown roles and users', async () => {
    const neg = await t.http
      .put('/api/admin/quotas/roles/researcher')
      .set(auth(admin))
      .send({ maxPointsPerSweep: -1, extra: 1 });
    expect(neg.status).toBe(400);
    expect(neg.body.details.map((d: { path: string }) => d.path)).toContain('maxPointsPerSweep');
    const nullRole = await t.http
      .put('/api/admin/quotas/roles/researcher')
      .set(auth(admin))
      .send({ maxRunningSweeps: null });
    expect(nullRole.status).toBe(400);
    expect((await t.http.put('/api/admin/quotas/roles/wizard').set(auth(admin)).send({})).status).toBe(400);
    expect(
      (await t.http.put('/api/admin/quotas/users/999999').set(auth(admin)).send({ maxRunningSweeps: 1 })).status,
    ).toBe(404);
  });
});
