/**
 * Role matrix over EVERY route: the table below lists who may call each route. The test enumerates
 * the routes the running app actually serves (its Express router and its OpenAPI document) and fails
 * when one has no entry, so a new route cannot ship without deciding who may call it.
 *
 * For each route: anonymous → 401 unless public; a role outside the entry → 403; a role inside
 * → anything but 401/403 (400/404/409 are fine: ids in the paths do not exist, bodies are empty).
 * A read-scope API token → 403 on every state-changing route it could otherwise reach.
 */
import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

type Role = 'admin' | 'researcher' | 'reviewer';
type Who = 'public' | readonly Role[];

const ALL: readonly Role[] = ['admin', 'researcher', 'reviewer'];
const ADMIN: readonly Role[] = ['admin'];
const CREATORS: readonly Role[] = ['researcher', 'admin'];

/** `METHOD /api/path/{param}` → who. Entries for routes not (yet) served are ignored. */
export const ROLE_MATRIX: Record<string, Who> = {
  'GET /api/health': 'public',
  'GET /api/docs': 'public',
  'POST /api/auth/login': 'public',
  'GET /api/auth/me': ALL,
  'POST /api/auth/accept-invite': 'public',
  'POST /api/auth/password-reset': 'public',
  'POST /api/auth/password-reset/confirm': 'public',
  'POST /api/auth/password': ALL,
  'POST /api/tokens': ALL,
  'GET /api/tokens': ALL,
  'GET /api/tokens/active': ALL,
  'DELETE /api/tokens/{id}': ALL,
  'POST /api/admin/invitations': ADMIN,
  'GET /api/admin/invitations': ADMIN,
  'DELETE /api/admin/invitations/{id}': ADMIN,
  'GET /api/admin/users': ADMIN,
  'PATCH /api/admin/users/{id}': ADMIN,
  'GET /api/admin/audit': ADMIN,
  'GET /api/admin/mailbox': ADMIN,
  'GET /api/admin/mailbox/{id}': ADMIN,
  'GET /api/admin/quotas': ADMIN,
  'PUT /api/admin/quotas/roles/{role}': ADMIN,
  'PUT /api/admin/quotas/users/{id}': ADMIN,
  'GET /api/admin/queue': ADMIN,
  'POST /api/admin/queue/pause': ADMIN,
  'POST /api/admin/queue/resume': ADMIN,
  'GET /api/models': ALL,
  'GET /api/models/{id}': ALL,
  'POST /api/models/{id}/evaluate': ALL,
  'POST /api/sweeps/preview': CREATORS,
  'POST /api/sweeps': CREATORS,
  'GET /api/sweeps': ALL,
  'GET /api/sweeps/{id}': ALL,
  'POST /api/sweeps/{id}/cancel': CREATORS,
  'POST /api/sweeps/{id}/archive': CREATORS,
  'DELETE /api/sweeps/{id}': CREATORS,
  'GET /api/sweeps/{id}/results': ALL,
  'GET /api/sweeps/{id}/series': ALL,
  'GET /api/sweeps/{id}/export': ALL,
  'GET /api/sweeps/{id}/sensitivity': ALL,
  'POST /api/datasets': CREATORS,
  // Reviewers may read datasets shared with them (the datasets module's choice).
  'GET /api/datasets': ALL,
  'GET /api/datasets/{id}': ALL,
  'GET /api/datasets/{id}/rows': ALL,
  'GET /api/datasets/{id}/series': ALL,
  'GET /api/datasets/{id}/export': ALL,
  'DELETE /api/datasets/{id}': CREATORS,
  'POST /api/fits': CREATORS,
  'GET /api/fits': ALL,
  'GET /api/fits/{id}': ALL,
  'GET /api/users/directory': CREATORS,
  'PUT /api/sweeps/{id}/sharing': CREATORS,
  'PUT /api/datasets/{id}/sharing': CREATORS,
};

/** Non-GET routes that store nothing, so read-scope tokens may call them (marked in their controller). */
const READ_SCOPE_OK = new Set(['POST /api/models/{id}/evaluate']);

/** Routes served outside the access guard (Swagger's own pages), matched as prefixes. */
const DOCS_PREFIX = '/api/docs';

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;

/** Express 5 route paths (`/api/sweeps/:id`) in OpenAPI form (`/api/sweeps/{id}`). */
function toOpenApiPath(p: string): string {
  return p.replace(/:([A-Za-z0-9_]+)/g, '{$1}');
}

function routerRoutes(app: Express): string[] {
  const router =
    (app as unknown as { router?: { stack: unknown[] }; _router?: { stack: unknown[] } }).router ??
    (app as unknown as { _router: { stack: unknown[] } })._router;
  const out: string[] = [];
  for (const layer of router.stack as { route?: { path: string | string[]; methods: Record<string, boolean> } }[]) {
    if (!layer.route) continue;
    const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
    for (const p of paths) {
      if (typeof p !== 'string' || !p.startsWith('/api/')) continue;
      for (const [m, on] of Object.entries(layer.route.methods)) {
        if (on && (METHODS as readonly string[]).includes(m)) out.push(`${m.toUpperCase()} ${toOpenApiPath(p)}`);
      }
    }
  }
  return out;
}

function concrete(path: string): string {
  return path.replace('{role}', 'researcher').replace(/\{[^}]+\}/g, '999999');
}

let t: TestApp;
let served: string[];
const tokens: Partial<Record<Role, string>> = {};
let readToken: string;

beforeAll(async () => {
  t = await startTestApp();
  for (const r of ALL) tokens[r] = await t.login(DEMO[r]);
  const doc = await t.http.get('/api/docs/openapi.json');
  expect(doc.status).toBe(200);
  const fromDoc = Object.entries(doc.body.paths as Record<string, Record<string, unknown>>).flatMap(([p, ops]) =>
    Object.keys(ops)
      .filter((m) => (METHODS as readonly string[]).includes(m))
      .map((m) => `${m.toUpperCase()} ${p}`),
  );
  const fromRouter = routerRoutes(t.app.getHttpAdapter().getInstance() as Express).filter(
    (r) => !r.split(' ')[1]!.startsWith(DOCS_PREFIX),
  );
  served = [...new Set([...fromDoc, ...fromRouter])].sort();
  const created = await t.http
    .post('/api/tokens')
    .set('authorization', `Bearer ${tokens.researcher}`)
    .send({ name: 'matrix read', scope: 'read' });
  expect(created.status).toBe(201);
  readToken = created.body.token;
});
afterAll(async () => {
  await t?.close();
});

function call(route: string, bearer?: string) {
  const [method, path] = route.split(' ') as [string, string];
  const req = t.http[method.toLowerCase() as (typeof METHODS)[number]](concrete(path));
  if (bearer) req.set('authorization', `Bearer ${bearer}`);
  return method === 'GET' ? req : req.send({});
}

describe('role matrix', () => {
  it('finds the routes it checks (router and OpenAPI agree on a known core)', () => {
    expect(served).toEqual(
      expect.arrayContaining(['POST /api/auth/login', 'GET /api/auth/me', 'GET /api/admin/users', 'POST /api/tokens']),
    );
  });

  it('has an entry for every served route', () => {
    const missing = served.filter((r) => !(r in ROLE_MATRIX));
    expect(
      missing,
      `routes without a ROLE_MATRIX entry in tests/api/role-matrix.test.ts: ${missing.join(', ')}`,
    ).toEqual([]);
  });

  it('answers anonymous callers 401 on every non-public route', async () => {
    const wrong: string[] = [];
    for (const route of served) {
      const who = ROLE_MATRIX[route];
      if (!who) continue;
      const res = await call(route);
      if (who === 'public' ? [401, 403].includes(res.status) : res.status !== 401)
        wrong.push(`${route} → ${res.status}`);
    }
    expect(wrong).toEqual([]);
  });

  it('lets exactly the listed roles through and answers the others 403', async () => {
    const wrong: string[] = [];
    for (const route of served) {
      const who = ROLE_MATRIX[route];
      if (!who) continue;
      for (const role of ALL) {
        const res = await call(route, tokens[role]);
        const allowed = who === 'public' || who.includes(role);
        if (allowed ? [401, 403].includes(res.status) : res.status !== 403)
          wrong.push(`${role} ${route} → ${res.status} ${res.body?.message ?? ''}`);
      }
    }
    expect(wrong).toEqual([]);
  });

  it('refuses a read-scope token on every state-changing route a researcher may call', async () => {
    const wrong: string[] = [];
    for (const route of served) {
      const who = ROLE_MATRIX[route];
      if (
        !who ||
        who === 'public' ||
        !who.includes('researcher') ||
        route.startsWith('GET ') ||
        READ_SCOPE_OK.has(route)
      )
        continue;
      const res = await call(route, readToken);
      if (res.status !== 403) wrong.push(`${route} → ${res.status}`);
    }
    expect(wrong).toEqual([]);
  });
});
