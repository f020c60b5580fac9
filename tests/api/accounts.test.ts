/**
 * Invitations, password reset and change of password, end to end through the built-in SMTP
 * mailbox: the api really sends over SMTP to its loopback fake; the test reads the message from
 * GET /api/admin/mailbox, extracts the link and follows it. Time is moved by editing expires_at.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DB_HANDLE } from '../../api/src/db/db.module.js';
import type { OpenedDatabase } from '../../api/src/db/database.js';
import { PASSWORD_RESET_ACCEPTED } from '@driftgrid/domain';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

let t: TestApp;
let admin: string;
let sqlite: OpenedDatabase['sqlite'];

beforeAll(async () => {
  t = await startTestApp({ PUBLIC_URL: 'http://driftgrid.test:8080' });
  admin = await t.login(DEMO.admin);
  sqlite = t.app.get<OpenedDatabase>(DB_HANDLE).sqlite;
});
afterAll(async () => {
  await t?.close();
});

const auth = (token: string) => ({ authorization: `Bearer ${token}` });

/** The newest message to an address; polls because reset mails are sent in the background. */
async function latestMailTo(
  to: string,
  subjectPart: string,
): Promise<{ id: number; text: string; html: string | null; subject: string; from: string }> {
  for (let attempt = 0; attempt < 100; attempt++) {
    const list = await t.http.get('/api/admin/mailbox').query({ pageSize: 100 }).set(auth(admin));
    expect(list.status).toBe(200);
    const hit = (list.body.items as { id: number; to: string; subject: string }[]).find(
      (m) => m.to.includes(to) && m.subject.includes(subjectPart),
    );
    if (hit) {
      const one = await t.http.get(`/api/admin/mailbox/${hit.id}`).set(auth(admin));
      expect(one.status).toBe(200);
      return one.body;
    }
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no mail to ${to} with "${subjectPart}"`);
}

function linkToken(text: string, path: string): string {
  const m = new RegExp(`http://driftgrid\\.test:8080${path}\\?token=([A-Za-z0-9_-]+)`).exec(text);
  if (!m) throw new Error(`no ${path} link in: ${text}`);
  return m[1]!;
}

async function mailboxCount(): Promise<number> {
  return (await t.http.get('/api/admin/mailbox').set(auth(admin))).body.total;
}

describe('invitations', () => {
  it('invites, mails a single-use link, and the invitee is signed in on accepting', async () => {
    const inv = await t.http
      .post('/api/admin/invitations')
      .set(auth(admin))
      .send({ email: 'Nadia.Ionflux@example.org', role: 'researcher' });
    expect(inv.status).toBe(201);
    expect(inv.body).toMatchObject({
      email: 'nadia.ionflux@example.org',
      role: 'researcher',
      status: 'pending',
      mailed: true,
    });
    // 7 days (brief): expiresAt - createdAt
    expect(inv.body.expiresAt - inv.body.createdAt).toBe(7 * 24 * 3600_000);
    expect(JSON.stringify(inv.body)).not.toMatch(/token/i);

    const mail = await latestMailTo('nadia.ionflux@example.org', 'invited');
    expect(mail.subject).toContain('Driftgrid');
    expect(mail.from).toContain('Driftgrid');
    expect(mail.text).toContain('Driftgrid');
    expect(mail.html).toContain('Driftgrid');
    expect(mail.html).not.toMatch(/<img|https?:\/\/[^"]*\.(png|jpe?g|gif|svg)/i);
    const token = linkToken(mail.text, '/accept-invite');
    expect(mail.html).toContain(`/accept-invite?token=${token}`);

    // The database keeps only the SHA-256 of the token.
    const row = sqlite.prepare('SELECT token_hash FROM invitations WHERE id = ?').get(inv.body.id) as {
      token_hash: string;
    };
    expect(row.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(row.token_hash).not.toContain(token);

    const accepted = await t.http
      .post('/api/auth/accept-invite')
      .send({ token, name: 'Nadia Ionflux', password: 'argon-column-2026' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({
      email: 'nadia.ionflux@example.org',
      name: 'Nadia Ionflux',
      role: 'researcher',
    });
    const me = await t.http.get('/api/auth/me').set(auth(accepted.body.accessToken));
    expect(me.status).toBe(200);
    expect(me.body.user.role).toBe('researcher');
    expect(await t.login('nadia.ionflux@example.org', 'argon-column-2026')).toBeTruthy();

    const again = await t.http
      .post('/api/auth/accept-invite')
      .send({ token, name: 'Someone Else', password: 'another-password-1' });
    expect(again.status).toBe(400);
    expect(again.body.message).toMatch(/already been used/);

    const list = await t.http.get('/api/admin/invitations').set(auth(admin));
    expect(list.body.items.find((i: { id: number }) => i.id === inv.body.id)).toMatchObject({
      status: 'accepted',
      invitedBy: { email: DEMO.admin },
    });
  });

  it('refuses an expired invitation link with a clear 400', async () => {
    const inv = await t.http
      .post('/api/admin/invitations')
      .set(auth(admin))
      .send({ email: 'late.comer@example.org', role: 'reviewer' });
    expect(inv.status).toBe(201);
    const token = linkToken((await latestMailTo('late.comer@example.org', 'invited')).text, '/accept-invite');
    sqlite.prepare('UPDATE invitations SET expires_at = ? WHERE id = ?').run(Date.now() - 1000, inv.body.id);
    const res = await t.http
      .post('/api/auth/accept-invite')
      .send({ token, name: 'Late Comer', password: 'deuterium-edge-1' });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/expired/);
    expect(res.body.details[0].path).toBe('token');
    expect(
      (await t.http.post('/api/auth/login').send({ email: 'late.comer@example.org', password: 'deuterium-edge-1' }))
        .status,
    ).toBe(401);
  });

  it('refuses an unknown token, a withdrawn invitation and an address that already has an account', async () => {
    const bad = await t.http
      .post('/api/auth/accept-invite')
      .send({ token: 'x'.repeat(43), name: 'Nobody', password: 'some-long-password' });
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/not valid/);

    const inv = await t.http
      .post('/api/admin/invitations')
      .set(auth(admin))
      .send({ email: 'withdrawn@example.org', role: 'researcher' });
    const token = linkToken((await latestMailTo('withdrawn@example.org', 'invited')).text, '/accept-invite');
    expect((await t.http.delete(`/api/admin/invitations/${inv.body.id}`).set(auth(admin))).body.status).toBe('revoked');
    const res = await t.http.post('/api/auth/accept-invite').send({ token, name: 'W', password: 'some-long-password' });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/withdrawn/);

    const dup = await t.http
      .post('/api/admin/invitations')
      .set(auth(admin))
      .send({ email: DEMO.researcher, role: 'researcher' });
    expect(dup.status).toBe(409);
  });

  it('validates the invitation and acceptance bodies field by field', async () => {
    const r1 = await t.http.post('/api/admin/invitations').set(auth(admin)).send({ email: 'nope', role: 'superuser' });
    expect(r1.status).toBe(400);
    expect(r1.body.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['email', 'role']));
    const r2 = await t.http
      .post('/api/auth/accept-invite')
      .send({ token: 'x'.repeat(43), name: '', password: 'short' });
    expect(r2.status).toBe(400);
    expect(r2.body.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['name', 'password']));
  });
});

describe('password reset', () => {
  it('answers identically for a known and an unknown address, and mails only the known one', async () => {
    const before = await mailboxCount();
    const unknown = await t.http.post('/api/auth/password-reset').send({ email: 'no-such-person@example.org' });
    const known = await t.http.post('/api/auth/password-reset').send({ email: DEMO.reviewer });
    expect(unknown.status).toBe(202);
    expect(known.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    expect(known.body).toEqual({ message: PASSWORD_RESET_ACCEPTED });
    const mail = await latestMailTo(DEMO.reviewer, 'Reset');
    expect(mail.text).toContain('Driftgrid');
    expect(await mailboxCount()).toBe(before + 1);
  });

  it('resets the password with the mailed link, once', async () => {
    await t.http.post('/api/auth/password-reset').send({ email: DEMO.researcher });
    const token = linkToken((await latestMailTo(DEMO.researcher, 'Reset')).text, '/reset-password');
    const ok = await t.http.post('/api/auth/password-reset/confirm').send({ token, password: 'a-brand-new-secret' });
    expect(ok.status).toBe(200);
    expect(
      (await t.http.post('/api/auth/login').send({ email: DEMO.researcher, password: 'driftgrid-demo' })).status,
    ).toBe(401);
    expect(await t.login(DEMO.researcher, 'a-brand-new-secret')).toBeTruthy();
    const reuse = await t.http.post('/api/auth/password-reset/confirm').send({ token, password: 'yet-another-secret' });
    expect(reuse.status).toBe(400);
    expect(reuse.body.message).toMatch(/already been used/);
    // put the demo password back for the other tests
    const tok = await t.login(DEMO.researcher, 'a-brand-new-secret');
    expect(
      (
        await t.http
          .post('/api/auth/password')
          .set(auth(tok))
          .send({ current: 'a-brand-new-secret', next: 'driftgrid-demo' })
      ).status,
    ).toBe(200);
  });

  it('refuses an expired reset link (valid one hour)', async () => {
    await t.http.post('/api/auth/password-reset').send({ email: DEMO.admin });
    const token = linkToken((await latestMailTo(DEMO.admin, 'Reset')).text, '/reset-password');
    const row = sqlite
      .prepare('SELECT id, created_at, expires_at FROM password_resets ORDER BY id DESC LIMIT 1')
      .get() as { id: number; created_at: number; expires_at: number };
    expect(row.expires_at - row.created_at).toBe(3600_000);
    sqlite.prepare('UPDATE password_resets SET expires_at = ? WHERE id = ?').run(Date.now() - 1, row.id);
    const res = await t.http.post('/api/auth/password-reset/confirm').send({ token, password: 'too-late-password' });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/expired/);
    expect(await t.login(DEMO.admin)).toBeTruthy();
  });
});

describe('change password', () => {
  it('needs the current password and names the field when it is wrong', async () => {
    const tok = await t.login(DEMO.reviewer);
    const wrong = await t.http
      .post('/api/auth/password')
      .set(auth(tok))
      .send({ current: 'not-it-at-all', next: 'reviewer-new-pass' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.details).toEqual([{ path: 'current', message: 'is not your current password' }]);
    const short = await t.http
      .post('/api/auth/password')
      .set(auth(tok))
      .send({ current: 'driftgrid-demo', next: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.details[0].path).toBe('next');
    const ok = await t.http
      .post('/api/auth/password')
      .set(auth(tok))
      .send({ current: 'driftgrid-demo', next: 'reviewer-new-pass' });
    expect(ok.status).toBe(200);
    expect(await t.login(DEMO.reviewer, 'reviewer-new-pass')).toBeTruthy();
    // The change ended the old session; the response carries the caller's fresh one.
    const back = await t.http
      .post('/api/auth/password')
      .set(auth(ok.body.accessToken))
      .send({ current: 'reviewer-new-pass', next: 'driftgrid-demo' });
    expect(back.status).toBe(200);
  });

  it('is not available to an API token', async () => {
    const tok = await t.login(DEMO.reviewer);
    const created = await t.http.post('/api/tokens').set(auth(tok)).send({ name: 'script', scope: 'read-write' });
    const res = await t.http
      .post('/api/auth/password')
      .set(auth(created.body.token))
      .send({ current: 'driftgrid-demo', next: 'stolen-token-pass' });
    expect(res.status).toBe(403);
  });
});

describe('admin users and audit log', () => {
  it('lists users paged with q and role filters', async () => {
    const all = await t.http.get('/api/admin/users').set(auth(admin));
    expect(all.status).toBe(200);
    expect(all.body).toMatchObject({ page: 1, pageSize: 50 });
    expect(all.body.total).toBeGreaterThanOrEqual(3);
    expect(all.body.items[0]).not.toHaveProperty('passwordHash');
    const reviewers = await t.http.get('/api/admin/users').query({ role: 'reviewer' }).set(auth(admin));
    expect(reviewers.body.items.every((u: { role: string }) => u.role === 'reviewer')).toBe(true);
    const q = await t.http.get('/api/admin/users').query({ q: 'rosa' }).set(auth(admin));
    expect(q.body.items.map((u: { email: string }) => u.email)).toEqual([DEMO.researcher]);
    const badPage = await t.http.get('/api/admin/users').query({ pageSize: 5000 }).set(auth(admin));
    expect(badPage.status).toBe(400);
    expect(badPage.body.details[0].path).toBe('pageSize');
  });

  it('keeps the last active admin: demotion and deactivation are 409', async () => {
    const users = (await t.http.get('/api/admin/users').query({ role: 'admin' }).set(auth(admin))).body.items as {
      id: number;
      email: string;
    }[];
    expect(users).toHaveLength(1);
    const adminId = users[0]!.id;
    const demote = await t.http.patch(`/api/admin/users/${adminId}`).set(auth(admin)).send({ role: 'researcher' });
    expect(demote.status).toBe(409);
    expect(demote.body.message).toMatch(/last active admin/);
    const deactivate = await t.http.patch(`/api/admin/users/${adminId}`).set(auth(admin)).send({ active: false });
    expect(deactivate.status).toBe(409);

    // With a second admin, the first may step down.
    const reviewerId = (await t.http.get('/api/admin/users').query({ q: DEMO.reviewer }).set(auth(admin))).body.items[0]
      .id;
    expect(
      (await t.http.patch(`/api/admin/users/${reviewerId}`).set(auth(admin)).send({ role: 'admin' })).body.role,
    ).toBe('admin');
    const reviewerAdmin = await t.login(DEMO.reviewer);
    expect(
      (await t.http.patch(`/api/admin/users/${adminId}`).set(auth(reviewerAdmin)).send({ role: 'researcher' })).status,
    ).toBe(200);
    // Now the former reviewer is the last admin.
    expect(
      (await t.http.patch(`/api/admin/users/${reviewerId}`).set(auth(reviewerAdmin)).send({ active: false })).status,
    ).toBe(409);
    // Restore.
    expect(
      (await t.http.patch(`/api/admin/users/${adminId}`).set(auth(reviewerAdmin)).send({ role: 'admin' })).status,
    ).toBe(200);
    expect(
      (await t.http.patch(`/api/admin/users/${reviewerId}`).set(auth(admin)).send({ role: 'reviewer' })).status,
    ).toBe(200);
  });

  it('deactivation signs the user out at once and refuses sign-in', async () => {
    const inv = await t.http
      .post('/api/admin/invitations')
      .set(auth(admin))
      .send({ email: 'short.stay@example.org', role: 'researcher' });
    expect(inv.status).toBe(201);
    const token = linkToken((await latestMailTo('short.stay@example.org', 'invited')).text, '/accept-invite');
    const signedIn = await t.http
      .post('/api/auth/accept-invite')
      .send({ token, name: 'Short Stay', password: 'short-stay-pass' });
    const off = await t.http
      .patch(`/api/admin/users/${signedIn.body.user.id}`)
      .set(auth(admin))
      .send({ active: false });
    expect(off.status).toBe(200);
    expect(off.body.active).toBe(false);
    expect((await t.http.get('/api/auth/me').set(auth(signedIn.body.accessToken))).status).toBe(401);
    expect(
      (await t.http.post('/api/auth/login').send({ email: 'short.stay@example.org', password: 'short-stay-pass' }))
        .status,
    ).toBe(401);
  });

  it('records admin actions in the audit log with who, what and when', async () => {
    const log = await t.http.get('/api/admin/audit').query({ pageSize: 200 }).set(auth(admin));
    expect(log.status).toBe(200);
    const actions = (log.body.items as { action: string }[]).map((e) => e.action);
    expect(actions).toEqual(
      expect.arrayContaining(['invitation.create', 'invitation.revoke', 'invitation.accept', 'user.update']),
    );
    const update = (
      log.body.items as { action: string; actor: { email: string }; createdAt: number; details: { after: unknown } }[]
    ).find((e) => e.action === 'user.update')!;
    expect(update.actor.email).toMatch(/@example\.com$/);
    expect(typeof update.createdAt).toBe('number');
    expect(update.details.after).toBeDefined();
  });

  it('answers 404 for a missing mailbox message or user', async () => {
    expect((await t.http.get('/api/admin/mailbox/999999').set(auth(admin))).status).toBe(404);
    expect((await t.http.patch('/api/admin/users/999999').set(auth(admin)).send({ name: 'X' })).status).toBe(404);
    expect((await t.http.get('/api/admin/mailbox/abc').set(auth(admin))).status).toBe(400);
  });
});
