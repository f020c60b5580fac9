import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

const auth = (token: string) => ({ authorization: `Bearer ${token}` });

describe('a password change ends the other sessions', () => {
  it('refuses tokens issued before the change and keeps the caller signed in with a fresh token', async () => {
    const laptop = await t.login(DEMO.reviewer);
    const desktop = await t.login(DEMO.reviewer);
    const res = await t.http
      .post('/api/auth/password')
      .set(auth(desktop))
      .send({ current: 'driftgrid-demo', next: 'reviewer-new-secret' });
    expect(res.status).toBe(200);
    expect(typeof res.body.accessToken).toBe('string');
    expect(res.body.user.email).toBe(DEMO.reviewer);

    const old = await t.http.get('/api/auth/me').set(auth(laptop));
    expect(old.status).toBe(401);
    expect(old.body.message).toMatch(/password was changed/);
    expect((await t.http.get('/api/auth/me').set(auth(desktop))).status).toBe(401);
    expect((await t.http.get('/api/auth/me').set(auth(res.body.accessToken))).status).toBe(200);
    // A new sign-in with the new password works as usual.
    expect(
      (await t.http.post('/api/auth/login').send({ email: DEMO.reviewer, password: 'reviewer-new-secret' })).status,
    ).toBe(200);
  });
});
