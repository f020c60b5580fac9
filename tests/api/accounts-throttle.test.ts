/** Sign-in throttling with a deliberately low limit (the other suites run with the NODE_ENV=test default). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ LOGIN_THROTTLE_LIMIT: '3' });
});
afterAll(async () => {
  await t?.close();
});

describe('login throttling', () => {
  it('answers 429 after the limit, with the same message for a real and an unknown account', async () => {
    const statuses = async (email: string) => {
      const out: number[] = [];
      let last: { message?: string } = {};
      for (let i = 0; i < 4; i++) {
        const res = await t.http.post('/api/auth/login').send({ email, password: 'wrong-password' });
        out.push(res.status);
        last = res.body;
      }
      return { out, last };
    };
    const real = await statuses(DEMO.researcher);
    const ghost = await statuses('ghost@example.org');
    expect(real.out).toEqual([401, 401, 401, 429]);
    expect(ghost.out).toEqual([401, 401, 401, 429]);
    expect(real.last.message).toBe(ghost.last.message);
    expect(real.last.message).not.toMatch(/exist|unknown|researcher/i);
    // Even the right password is refused while throttled.
    expect(
      (await t.http.post('/api/auth/login').send({ email: DEMO.researcher, password: 'driftgrid-demo' })).status,
    ).toBe(429);
  });

  it('throttles password-reset requests the same way, and leaves other routes alone', async () => {
    const codes: number[] = [];
    for (let i = 0; i < 4; i++)
      codes.push((await t.http.post('/api/auth/password-reset').send({ email: DEMO.reviewer })).status);
    expect(codes).toEqual([202, 202, 202, 429]);
    // A different address still gets through, and the catalogue-style routes are never throttled.
    expect((await t.http.post('/api/auth/login').send({ email: DEMO.admin, password: 'driftgrid-demo' })).status).toBe(
      200,
    );
    const admin = await t.http.post('/api/auth/login').send({ email: DEMO.admin, password: 'driftgrid-demo' });
    for (let i = 0; i < 20; i++)
      expect((await t.http.get('/api/auth/me').set('authorization', `Bearer ${admin.body.accessToken}`)).status).toBe(
        200,
      );
  });
});
