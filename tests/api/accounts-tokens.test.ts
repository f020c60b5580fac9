/** Personal API tokens: shown once, stored hashed, accepted as Bearer; revoked/expired → 401; read scope cannot write. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { DB_HANDLE } from '../../api/src/db/db.module.js';
import type { OpenedDatabase } from '../../api/src/db/database.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

let t: TestApp;
let researcher: string;
let sqlite: OpenedDatabase['sqlite'];
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  sqlite = t.app.get<OpenedDatabase>(DB_HANDLE).sqlite;
});
afterAll(async () => {
  await t?.close();
});

describe('personal API tokens', () => {
  it('creates a token shown once, stored as SHA-256, listed without the secret', async () => {
    const expiresAt = new Date(Date.now() + 30 * 86_400_000).toISOString();
    const res = await t.http
      .post('/api/tokens')
      .set(auth(researcher))
      .send({ name: 'laptop notebook', scope: 'read-write', expiresAt });
    expect(res.status).toBe(201);
    expect(Object.keys(res.body).sort()).toEqual(['createdAt', 'expiresAt', 'id', 'name', 'prefix', 'scope', 'token']);
    // dgt_ + base64url of 32 bytes = 43 characters
    expect(res.body.token).toMatch(/^dgt_[A-Za-z0-9_-]{43}$/);
    expect(res.body.token.startsWith(res.body.prefix)).toBe(true);
    expect(res.body.expiresAt).toBe(Date.parse(expiresAt));
    const row = sqlite.prepare('SELECT token_hash FROM api_tokens WHERE id = ?').get(res.body.id) as {
      token_hash: string;
    };
    expect(row.token_hash).toBe(createHash('sha256').update(res.body.token).digest('hex'));

    const list = await t.http.get('/api/tokens').set(auth(researcher));
    expect(list.status).toBe(200);
    expect(list.body).toMatchObject({ total: 1, page: 1 });
    expect(JSON.stringify(list.body)).not.toContain(res.body.token);
    expect(list.body.items[0]).toMatchObject({
      id: res.body.id,
      name: 'laptop notebook',
      scope: 'read-write',
      revokedAt: null,
      lastUsedAt: null,
    });

    const me = await t.http.get('/api/auth/me').set(auth(res.body.token));
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({ user: { email: DEMO.researcher }, via: 'token', scope: 'read-write' });
    const after = await t.http.get('/api/tokens').set(auth(researcher));
    expect(typeof after.body.items[0].lastUsedAt).toBe('number');
  });

  it('answers 401 to a revoked token', async () => {
    const res = await t.http.post('/api/tokens').set(auth(researcher)).send({ name: 'to revoke', scope: 'read' });
    expect((await t.http.get('/api/auth/me').set(auth(res.body.token))).status).toBe(200);
    const del = await t.http.delete(`/api/tokens/${res.body.id}`).set(auth(researcher));
    expect(del.status).toBe(200);
    expect(typeof del.body.revokedAt).toBe('number');
    const after = await t.http.get('/api/auth/me').set(auth(res.body.token));
    expect(after.status).toBe(401);
    expect(after.body.message).toMatch(/revoked or expired/);
  });

  it('answers 401 to an expired token and to an unknown one', async () => {
    const res = await t.http
      .post('/api/tokens')
      .set(auth(researcher))
      .send({ name: 'short-lived', scope: 'read', expiresAt: Date.now() + 3600_000 });
    expect((await t.http.get('/api/auth/me').set(auth(res.body.token))).status).toBe(200);
    sqlite.prepare('UPDATE api_tokens SET expires_at = ? WHERE id = ?').run(Date.now() - 1, res.body.id);
    expect((await t.http.get('/api/auth/me').set(auth(res.body.token))).status).toBe(401);
    expect((await t.http.get('/api/auth/me').set(auth('dgt_' + 'A'.repeat(43)))).status).toBe(401);
  });

  it('lets a read-scope token read but not POST', async () => {
    const res = await t.http.post('/api/tokens').set(auth(researcher)).send({ name: 'read only', scope: 'read' });
    expect((await t.http.get('/api/tokens').set(auth(res.body.token))).status).toBe(200);
    const post = await t.http.post('/api/sweeps').set(auth(res.body.token)).send({});
    expect(post.status).toBe(403);
    expect(post.body.message).toMatch(/read scope/);
    const del = await t.http.delete(`/api/tokens/${res.body.id}`).set(auth(res.body.token));
    expect(del.status).toBe(403);
  });

  it('does not let a token mint tokens, nor one user revoke another user’s token', async () => {
    const rw = await t.http.post('/api/tokens').set(auth(researcher)).send({ name: 'rw', scope: 'read-write' });
    const minted = await t.http.post('/api/tokens').set(auth(rw.body.token)).send({ name: 'child', scope: 'read' });
    expect(minted.status).toBe(403);
    const reviewer = await t.login(DEMO.reviewer);
    expect((await t.http.delete(`/api/tokens/${rw.body.id}`).set(auth(reviewer))).status).toBe(404);
    expect((await t.http.get('/api/auth/me').set(auth(rw.body.token))).status).toBe(200);
  });

  it('validates name, scope and expiry with field-named errors', async () => {
    const r1 = await t.http.post('/api/tokens').set(auth(researcher)).send({ name: '', scope: 'admin' });
    expect(r1.status).toBe(400);
    expect(r1.body.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['name', 'scope']));
    const past = await t.http
      .post('/api/tokens')
      .set(auth(researcher))
      .send({ name: 'x', scope: 'read', expiresAt: '2001-01-01' });
    expect(past.status).toBe(400);
    expect(past.body.details[0]).toEqual({ path: 'expiresAt', message: 'must be in the future' });
    const far = await t.http
      .post('/api/tokens')
      .set(auth(researcher))
      .send({ name: 'x', scope: 'read', expiresAt: Date.now() + 400 * 86_400_000 });
    expect(far.status).toBe(400);
    expect(far.body.details[0].path).toBe('expiresAt');
  });

  it('stops accepting a token once its owner is deactivated', async () => {
    const admin = await t.login(DEMO.admin);
    const reviewer = await t.login(DEMO.reviewer);
    const tok = await t.http.post('/api/tokens').set(auth(reviewer)).send({ name: 'r', scope: 'read' });
    const id = (await t.http.get('/api/admin/users').query({ q: DEMO.reviewer }).set(auth(admin))).body.items[0].id;
    await t.http.patch(`/api/admin/users/${id}`).set(auth(admin)).send({ active: false });
    expect((await t.http.get('/api/auth/me').set(auth(tok.body.token))).status).toBe(401);
    await t.http.patch(`/api/admin/users/${id}`).set(auth(admin)).send({ active: true });
    expect((await t.http.get('/api/auth/me').set(auth(tok.body.token))).status).toBe(200);
  });
});
