/**
 * Issue 14 §2.3: personal API tokens and passwords. A reset (the "I lost control" path) revokes
 * every token and the reset mail says so; a change offers to revoke them and the api tells how many
 * are active.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

let t: TestApp;
let admin: string;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestApp();
  admin = await t.login(DEMO.admin);
});
afterAll(async () => {
  await t?.close();
});

async function mintTokens(session: string, n: number): Promise<string[]> {
  const out: string[] = [];
  for (let i = 0; i < n; i++) {
    const res = await t.http
      .post('/api/tokens')
      .set(auth(session))
      .send({ name: `probe script ${i}`, scope: 'read' });
    expect(res.status).toBe(201);
    out.push(res.body.token as string);
  }
  return out;
}

const works = async (secret: string) => (await t.http.get('/api/auth/me').set(auth(secret))).status === 200;

async function latestMail(to: string, subjectPart: string): Promise<string> {
  for (let i = 0; i < 100; i++) {
    const list = await t.http.get('/api/admin/mailbox').query({ pageSize: 100 }).set(auth(admin));
    const hit = (list.body.items as { id: number; to: string; subject: string }[]).find(
      (m) => m.to.includes(to) && m.subject.includes(subjectPart),
    );
    if (hit) return (await t.http.get(`/api/admin/mailbox/${hit.id}`).set(auth(admin))).body.text as string;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no mail to ${to}`);
}

describe('tokens and password resets', () => {
  it('a reset revokes every token of the account, says so in the mail and in the answer', async () => {
    const session = await t.login(DEMO.researcher);
    const secrets = await mintTokens(session, 3);
    // One already revoked: it is not counted again.
    const list = await t.http.get('/api/tokens').set(auth(session));
    await t.http.delete(`/api/tokens/${list.body.items[0].id}`).set(auth(session));
    expect((await t.http.get('/api/tokens/active').set(auth(session))).body).toEqual({ count: 2 });

    expect((await t.http.post('/api/auth/password-reset').send({ email: DEMO.researcher })).status).toBe(202);
    const mail = await latestMail(DEMO.researcher, 'Reset');
    expect(mail).toMatch(/revokes? all your personal API tokens/i);
    const token = /reset-password\?token=([\w-]+)/.exec(mail)![1]!;
    const res = await t.http
      .post('/api/auth/password-reset/confirm')
      .send({ token, password: 'researcher-after-reset' });
    expect(res.status).toBe(200);
    expect(res.body.tokensRevoked).toBe(2);
    expect(res.body.message).toMatch(/2 personal API tokens were revoked/);
    for (const s of secrets) expect(await works(s)).toBe(false);
    const fresh = await t.login(DEMO.researcher, 'researcher-after-reset');
    expect((await t.http.get('/api/tokens/active').set(auth(fresh))).body).toEqual({ count: 0 });
    const rows = (await t.http.get('/api/tokens').set(auth(fresh))).body.items as { revokedAt: number | null }[];
    expect(rows).toHaveLength(3);
    expect(rows.every((r) => r.revokedAt !== null)).toBe(true);
  });
});

describe('tokens and password changes', () => {
  it('a change keeps tokens unless asked; the active count is offered', async () => {
    const session = await t.login(DEMO.reviewer);
    const [keep] = await mintTokens(session, 1);
    const res = await t.http
      .post('/api/auth/password')
      .set(auth(session))
      .send({ current: 'driftgrid-demo', next: 'reviewer-second-pass' });
    expect(res.status).toBe(200);
    expect(res.body.tokensRevoked).toBe(0);
    expect(await works(keep!)).toBe(true);

    const s2 = res.body.accessToken as string;
    await mintTokens(s2, 1);
    expect((await t.http.get('/api/tokens/active').set(auth(s2))).body).toEqual({ count: 2 });
    const res2 = await t.http
      .post('/api/auth/password')
      .set(auth(s2))
      .send({ current: 'reviewer-second-pass', next: 'reviewer-third-pass', revokeTokens: true });
    expect(res2.status).toBe(200);
    expect(res2.body.tokensRevoked).toBe(2);
    expect(res2.body.message).toMatch(/2 personal API tokens were revoked/);
    expect(await works(keep!)).toBe(false);
    expect((await t.http.get('/api/tokens/active').set(auth(res2.body.accessToken))).body).toEqual({ count: 0 });
  });

  it('revokeTokens must be true or false', async () => {
    const session = await t.login(DEMO.admin);
    const res = await t.http
      .post('/api/auth/password')
      .set(auth(session))
      .send({ current: 'driftgrid-demo', next: 'admin-other-pass', revokeTokens: 'yes' });
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe('revokeTokens');
  });
});
