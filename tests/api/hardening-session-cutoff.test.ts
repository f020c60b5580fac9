/**
 * Issue 14 §2.4: a session started in the same second (or millisecond) as a password change or
 * reset must not survive it. The api's injected Clock is frozen, so every step below happens at
 * one instant: a cut-off that compares times cannot separate them, a session version can.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Clock } from '../../api/src/common/clock.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

let t: TestApp;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestApp();
  // A fake clock: the provider the api injects everywhere, frozen inside the current second.
  const frozen = Math.floor(Date.now() / 1000) * 1000 + 500;
  const clock = t.app.get(Clock);
  clock.now = () => frozen;
});
afterAll(async () => {
  await t?.close();
});

const me = async (token: string) => (await t.http.get('/api/auth/me').set(auth(token))).status;

describe('sessions and a password change at the same instant', () => {
  it('a change ends a session started the same second; the caller continues on its fresh session', async () => {
    const laptop = await t.login(DEMO.reviewer);
    const desktop = await t.login(DEMO.reviewer);
    const res = await t.http
      .post('/api/auth/password')
      .set(auth(desktop))
      .send({ current: 'driftgrid-demo', next: 'reviewer-new-secret' });
    expect(res.status).toBe(200);
    const old = await t.http.get('/api/auth/me').set(auth(laptop));
    expect(old.status).toBe(401);
    expect(old.body.message).toMatch(/password was changed/);
    expect(await me(desktop)).toBe(401);
    expect(await me(res.body.accessToken)).toBe(200);
    // A sign-in after the change, still the same instant, is a valid session.
    expect(await me(await t.login(DEMO.reviewer, 'reviewer-new-secret'))).toBe(200);
  });

  it('a reset ends every session started the same second', async () => {
    const session = await t.login(DEMO.researcher);
    expect((await t.http.post('/api/auth/password-reset').send({ email: DEMO.researcher })).status).toBe(202);
    // The link's token from the stored mail (the built-in relay keeps every message).
    let link: string | undefined;
    for (let i = 0; i < 50 && !link; i++) {
      const row = t
        .sqlite()
        .prepare('SELECT text FROM mail_messages WHERE "to" LIKE ? AND subject LIKE \'Reset%\' ORDER BY id DESC')
        .get(`%${DEMO.researcher}%`) as { text: string } | undefined;
      link = row?.text.match(/reset-password\?token=([\w%-]+)/)?.[1];
      if (!link) await new Promise((r) => setTimeout(r, 100));
    }
    expect(link).toBeDefined();
    const confirm = await t.http
      .post('/api/auth/password-reset/confirm')
      .send({ token: decodeURIComponent(link!), password: 'researcher-new-secret' });
    expect(confirm.status).toBe(200);
    expect(await me(session)).toBe(401);
    expect(await me(await t.login(DEMO.researcher, 'researcher-new-secret'))).toBe(200);
  });
});
