import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, tempDataDir, type TestApp } from '../support/app.js';
import { freePort, spawnNode, startApiProcess, type Proc } from '../support/processes.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

/*
 * Security hardening: the expression sandbox, secrets kept out of logs and responses, the
 * production start-up refusals, upload file names and the security headers.
 */

const procs: Proc[] = [];
const dirs: string[] = [];
afterAll(async () => {
  for (const p of procs) await p.kill('SIGKILL');
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

/** A global an escaping expression would set; it must stay unset. */
const CANARY = '__driftgridCanary';
/** Known escape routes of expression evaluators (mathjs-specific ones first), each must be refused. */
const ESCAPES = [
  'import({x: 1}, {override: true})',
  'createUnit("furlong", "201.168 m")',
  'evaluate("1 + 1")',
  'parse("1 + 1")',
  'simplify("2 * Te_eV")',
  'derivative("Te_eV^2", "Te_eV")',
  'compile("1 + 1")',
  'chain(3).add(4).done()',
  'f(x) = x^2',
  `cos.constructor("globalThis.${CANARY} = 1")()`,
  `[].constructor.constructor("globalThis.${CANARY} = 1")()`,
  `Te_eV["constructor"]["constructor"]("globalThis.${CANARY} = 1")()`,
  'Te_eV.constructor',
  'config({number: "BigNumber"})',
  'resolve(Te_eV, {Te_eV: 1})',
  'typed("f", {"number": f(x) = x})',
  '{a: 1}.a',
  '{"constructor": 1}',
  'Te_eV = 5',
  '"abc"',
  '2 kg',
  '1:10',
  'matrix([1, 2])',
  '[1, 2][1]',
  'Te_eV; B_T',
  'x = cos; x.constructor',
  'help(cos)',
  'unit("5 cm")',
];

let t: TestApp;
let researcher: string;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
});
afterAll(async () => {
  await t?.close();
});

describe('the expression sandbox', () => {
  it('refuses every escape route in derived columns, fixed-value expressions and fit expressions, with no side effect', async () => {
    const created = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(smallSweep({ name: 'sandbox fit source' }));
    expect(created.status).toBe(201);
    const sweepId = created.body.id as number;
    await waitForSweep(t, researcher, sweepId);
    const count = () =>
      (
        t.sqlite().prepare('SELECT (SELECT COUNT(*) FROM sweeps) + (SELECT COUNT(*) FROM fits) n').get() as {
          n: number;
        }
      ).n;
    const before = count();
    const accepted: string[] = [];
    for (const expr of ESCAPES) {
      const derived = await t.http
        .post('/api/sweeps')
        .set(auth(researcher))
        .send(smallSweep({ derived: [{ name: 'q', expr }] }));
      if (derived.status !== 400 || !JSON.stringify(derived.body.details).includes('derived.0'))
        accepted.push(`derived ${expr} → ${derived.status} ${JSON.stringify(derived.body).slice(0, 160)}`);
      const fixed = await t.http
        .post('/api/sweeps')
        .set(auth(researcher))
        .send(smallSweep({ fixed: { ...smallSweep().fixed, Ti_eV: expr } }));
      if (fixed.status !== 400 || !JSON.stringify(fixed.body.details).includes('Ti_eV'))
        accepted.push(`fixed ${expr} → ${fixed.status} ${JSON.stringify(fixed.body).slice(0, 160)}`);
      const fit = await t.http
        .post('/api/fits')
        .set(auth(researcher))
        .send({
          source: { kind: 'sweep', id: sweepId },
          model: 'expression',
          expr,
          params: { a: 1 },
          y: 'vE_ms',
          x: ['Te_eV'],
        });
      if (fit.status !== 400 || !JSON.stringify(fit.body).includes('expr'))
        accepted.push(`fit ${expr} → ${fit.status} ${JSON.stringify(fit.body).slice(0, 160)}`);
      for (const r of [derived, fixed, fit]) expect(r.status, expr).toBeLessThan(500);
    }
    expect(accepted).toEqual([]);
    expect((globalThis as Record<string, unknown>)[CANARY]).toBeUndefined();
    expect(count()).toBe(before);
    // The sandbox is not simply refusing everything: the plain forms are accepted.
    const ok = await t.http
      .post('/api/sweeps/preview')
      .set(auth(researcher))
      .send(
        smallSweep({
          derived: [{ name: 'q', expr: 'vE_ms / max(abs(vDi_ms), 1)' }],
          fixed: { ...smallSweep().fixed, Ti_eV: 'Te_eV / 2' },
        }),
      );
    expect(ok.body.errors).toEqual([]);
  });
});

describe('security headers', () => {
  it('sends CSP, nosniff, frame protection and a referrer policy, and no x-powered-by, on api, error and ui responses', async () => {
    const responses = {
      health: await t.http.get('/api/health'),
      apiError: await t.http.get('/api/sweeps/abc').set(auth(researcher)),
      unauthenticated: await t.http.get('/api/sweeps'),
      ui: await t.http.get('/'),
      uiDeepLink: await t.http.get('/sweeps/1'),
    };
    for (const [name, r] of Object.entries(responses)) {
      const h = r.headers;
      expect(h['content-security-policy'], name).toMatch(/default-src 'self'/);
      expect(h['content-security-policy'], name).toMatch(/frame-ancestors 'self'|frame-ancestors 'none'/);
      expect(h['x-content-type-options'], name).toBe('nosniff');
      expect(h['x-frame-options'], name).toMatch(/SAMEORIGIN|DENY/);
      expect(h['referrer-policy'], name).toBeTruthy();
      expect(h['x-powered-by'], name).toBeUndefined();
    }
    // The ui is served (built) — else the ui rows above checked the api fallback only.
    if (responses.ui.status === 200) expect(responses.ui.headers['content-type']).toMatch(/text\/html/);
  });
});

describe('upload file names', () => {
  it('never uses the uploaded file name as a path', async () => {
    const target = `/tmp/driftgrid-pwned-${process.pid}.csv`;
    fs.rmSync(target, { force: true });
    const name = `../../../..${target}`;
    const res = await t.http
      .post('/api/datasets')
      .set(auth(researcher))
      .field('name', 'traversal check')
      .attach('file', Buffer.from('r,phi\n0,1\n1,2\n'), name);
    expect(res.status).toBeLessThan(500);
    expect(fs.existsSync(target)).toBe(false);
    // Nothing is written outside DATA_DIR under the uploaded name either.
    const found: string[] = [];
    const walk = (dir: string) => {
      for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
        if (e.isDirectory()) walk(path.join(dir, e.name));
        else if (e.name.includes('pwned')) found.push(path.join(dir, e.name));
      }
    };
    walk(t.dataDir);
    expect(found).toEqual([]);
  });
});

describe('production start-up', () => {
  const refuse = async (env: Record<string, string>, message: RegExp) => {
    const dataDir = tempDataDir();
    dirs.push(dataDir);
    const port = await freePort();
    const proc = spawnNode('api/dist/main.js', {
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATA_DIR: dataDir,
      ...env,
    });
    procs.push(proc);
    const code = await proc.exited;
    expect(code, proc.output()).not.toBe(0);
    expect(proc.output()).toMatch(message);
    expect(proc.output(), 'a clear message, not a stack trace').not.toMatch(/\n\s+at .+:\d+:\d+/);
  };

  it('refuses the default JWT secret', async () => {
    await refuse({}, /default JWT_SECRET/);
  });

  it('refuses to seed the demo users', async () => {
    await refuse({ JWT_SECRET: 'a-real-production-secret-of-some-length', DEMO_SEED: 'true' }, /demo users/);
  });

  it('starts for a trial with ALLOW_INSECURE_DEMO=true', async () => {
    const dataDir = tempDataDir();
    dirs.push(dataDir);
    const api = await startApiProcess({
      NODE_ENV: 'production',
      DATA_DIR: dataDir,
      DEMO_SEED: 'true',
      DEMO_CONTENT: 'false',
      ALLOW_INSECURE_DEMO: 'true',
    });
    procs.push(api.proc);
    expect((await fetch(`${api.baseUrl}/api/health`)).status).toBe(200);
    await api.proc.kill('SIGTERM');
  });

  it('refuses a database that still holds the demo users with the demo password', async () => {
    const dataDir = tempDataDir();
    dirs.push(dataDir);
    // A development start seeds the demo users; then the same DATA_DIR is started for production.
    const dev = await startApiProcess({ NODE_ENV: 'development', DATA_DIR: dataDir, DEMO_CONTENT: 'false' });
    procs.push(dev.proc);
    await dev.proc.kill('SIGTERM');
    await refuse({ DATA_DIR: dataDir, JWT_SECRET: 'a-real-production-secret-of-some-length' }, /demo/);
  });
});

describe('secrets stay out of logs and responses', () => {
  it('never prints or returns the JWT secret, passwords, token secrets or password hashes', async () => {
    const dataDir = tempDataDir();
    dirs.push(dataDir);
    const jwtSecret = 'zq-distinctive-jwt-secret-7f3a91c2e6';
    const api = await startApiProcess({
      DATA_DIR: dataDir,
      LOG_LEVEL: 'debug',
      JWT_SECRET: jwtSecret,
      DEMO_CONTENT: 'false',
      PUBLIC_URL: 'http://driftgrid.test:9',
    });
    procs.push(api.proc);
    const bodies: string[] = [];
    const call = async (method: string, route: string, body?: unknown, token?: string) => {
      const r = await fetch(`${api.baseUrl}${route}`, {
        method,
        headers: {
          ...(token ? { authorization: `Bearer ${token}` } : {}),
          ...(body ? { 'content-type': 'application/json' } : {}),
        },
        body: body ? JSON.stringify(body) : undefined,
      });
      const text = await r.text();
      bodies.push(`${method} ${route} ${r.status} ${JSON.stringify([...r.headers])} ${text}`);
      return { status: r.status, json: text && text.startsWith('{') ? JSON.parse(text) : null };
    };
    const login = async (email: string, password: string) =>
      (await call('POST', '/api/auth/login', { email, password })).json?.accessToken as string;
    const admin = await login(DEMO.admin, 'driftgrid-demo');
    let researcherToken = await login(DEMO.researcher, 'driftgrid-demo');
    await call('POST', '/api/auth/login', { email: DEMO.researcher, password: 'zq-wrong-password-1234' });
    const created = await call('POST', '/api/tokens', { name: 'secret check', scope: 'read' }, researcherToken);
    expect(created.status).toBe(201);
    const tokenSecret = created.json.token as string;
    await call('GET', '/api/tokens', undefined, researcherToken);
    await call('GET', '/api/auth/me', undefined, tokenSecret);
    // Password reset through the mailbox, then a change of password.
    await call('POST', '/api/auth/password-reset', { email: DEMO.researcher });
    let resetToken = '';
    for (let i = 0; i < 100 && !resetToken; i++) {
      const list = await call('GET', '/api/admin/mailbox?pageSize=50', undefined, admin);
      const hit = (list.json.items as { id: number; subject: string; to: string }[]).find(
        (m) => m.to.includes(DEMO.researcher) && /reset/i.test(m.subject),
      );
      if (hit)
        resetToken =
          /reset-password\?token=([A-Za-z0-9_-]+)/.exec(
            (await call('GET', `/api/admin/mailbox/${hit.id}`, undefined, admin)).json.text,
          )?.[1] ?? '';
      else await new Promise((r) => setTimeout(r, 50));
    }
    expect(resetToken).not.toBe('');
    const newPassword = 'zq-reset-password-5d2b8e';
    expect(
      (await call('POST', '/api/auth/password-reset/confirm', { token: resetToken, password: newPassword })).status,
    ).toBe(200);
    researcherToken = await login(DEMO.researcher, newPassword);
    const changed = 'zq-changed-password-a81c4f';
    expect(
      (await call('POST', '/api/auth/password', { current: newPassword, next: changed }, researcherToken)).status,
    ).toBe(200);
    researcherToken = await login(DEMO.researcher, changed);
    await call('GET', '/api/admin/users', undefined, admin);
    await call('GET', '/api/admin/audit?pageSize=200', undefined, admin);
    await call('PATCH', '/api/admin/users/2', { name: 'Rosa R.' }, admin);
    // Error paths: a forged token, an expired-looking token, malformed JSON.
    await call('GET', '/api/auth/me', undefined, `${researcherToken}x`);
    await fetch(`${api.baseUrl}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: `{"email":"${DEMO.admin}","password":"${changed}`,
    });
    await api.proc.kill('SIGTERM');

    const logs = api.proc.output();
    expect(logs.length).toBeGreaterThan(0);
    const leaks: string[] = [];
    const secrets: Record<string, string> = {
      jwtSecret,
      newPassword,
      changed,
      wrongPassword: 'zq-wrong-password-1234',
      resetToken,
    };
    for (const [name, s] of Object.entries(secrets)) {
      if (logs.includes(s)) leaks.push(`log holds ${name}`);
      bodies.forEach((b) => {
        // The reset token is legitimately in the mailed text the admin mailbox shows.
        if (b.includes(s) && !(name === 'resetToken' && b.includes('/api/admin/mailbox/')))
          leaks.push(`response holds ${name}: ${b.slice(0, 120)}`);
      });
    }
    if (logs.includes(tokenSecret)) leaks.push('log holds the API token secret');
    bodies
      .filter((b) => !b.startsWith('POST /api/tokens 201'))
      .forEach((b) => b.includes(tokenSecret) && leaks.push(`response holds the token secret: ${b.slice(0, 120)}`));
    if (/\$2[aby]\$\d\d\$/.test(logs)) leaks.push('log holds a bcrypt hash');
    bodies.forEach((b) => /\$2[aby]\$\d\d\$/.test(b) && leaks.push(`response holds a bcrypt hash: ${b.slice(0, 120)}`));
    // Bearer tokens of sessions do not belong in logs either.
    if (logs.includes(researcherToken) || logs.includes(admin)) leaks.push('log holds a session token');
    expect(leaks).toEqual([]);
  });
});
