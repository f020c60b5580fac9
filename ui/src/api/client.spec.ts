import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { setSession } from '../auth/session.js';
import { ApiError, api, buildUrl, setUnauthorizedHandler } from './client.js';
import { meView } from './auth.js';
import { queryKeys } from './queryKeys.js';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
  setUnauthorizedHandler(null);
});

const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

describe('api client', () => {
  it('adds the bearer token and the /api prefix', async () => {
    setSession({ accessToken: 'abc', user: { id: 1, email: 'a@example.com', name: 'A', role: 'admin' } });
    fetchMock.mockResolvedValueOnce(json(200, { ok: true }));
    await expect(api.get('/models', { q: 'drift', empty: '', none: undefined })).resolves.toEqual({ ok: true });
    const [url, init] = fetchMock.mock.calls[0]!;
    expect(url).toBe('/api/models?q=drift');
    expect((init?.headers as Record<string, string>).Authorization).toBe('Bearer abc');
  });

  it('parses the error shape into ApiError with details', async () => {
    fetchMock.mockResolvedValueOnce(
      json(400, {
        statusCode: 400,
        error: 'Bad Request',
        message: 'Invalid sweep definition',
        details: [{ path: 'axes.0.min', message: 'must be > 0' }],
      }),
    );
    const err = await api.post('/sweeps', {}).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    const e = err as ApiError;
    expect(e.status).toBe(400);
    expect(e.message).toBe('Invalid sweep definition');
    expect(e.detailFor('axes.0.min')).toBe('must be > 0');
  });

  it('copes with non-JSON failures', async () => {
    fetchMock.mockResolvedValueOnce(
      new Response('<html>bad gateway</html>', { status: 502, statusText: 'Bad Gateway' }),
    );
    const e = (await api.get('/health').catch((x: unknown) => x)) as ApiError;
    expect(e.status).toBe(502);
    expect(e.message).toBe('Request failed (502 Bad Gateway).');
  });

  it('calls the unauthorized handler on a 401 only when a token was sent', async () => {
    const handler = vi.fn();
    setUnauthorizedHandler(handler);
    fetchMock.mockResolvedValue(json(401, { statusCode: 401, error: 'Unauthorized', message: 'Token expired' }));
    await api.post('/auth/login', { email: 'x', password: 'y' }, { auth: false }).catch(() => undefined);
    expect(handler).not.toHaveBeenCalled();
    setSession({ accessToken: 'old', user: { id: 1, email: 'a@example.com', name: 'A', role: 'admin' } });
    await api.get('/sweeps').catch(() => undefined);
    expect(handler).toHaveBeenCalledTimes(1);
  });

  it('resolves 204 to undefined', async () => {
    fetchMock.mockResolvedValueOnce(new Response(null, { status: 204 }));
    await expect(api.delete('/tokens/3')).resolves.toBeUndefined();
  });

  it('builds urls with query strings', () => {
    expect(buildUrl('sweeps', { page: 2, pageSize: 50 })).toBe('/api/sweeps?page=2&pageSize=50');
    expect(buildUrl('/api/health')).toBe('/api/health');
  });
});

describe('meView', () => {
  it('flattens GET /api/auth/me into the user with its quota and usage', () => {
    const user = { id: 2, email: 'r@example.com', name: 'Rosa Researcher', role: 'researcher' as const };
    const quota = { maxPointsPerSweep: 1e6, maxRunningSweeps: 3, maxPointsPer30Days: 2e7, maxStoredPoints: 5e7 };
    const usage = { storedPoints: 10, runningSweeps: 0, pointsLast30Days: 10 };
    const me = meView({ user, via: 'session', scope: 'read-write', quota, usage });
    expect(me).toEqual({ ...user, quota, usage });
  });
});

describe('queryKeys', () => {
  it('nests results and series under the sweep so one invalidation covers them', () => {
    const detail = queryKeys.sweeps.detail(5);
    expect(queryKeys.sweeps.results(5, { page: 1 }).slice(0, detail.length)).toEqual([...detail]);
    expect(queryKeys.sweeps.series('5', { x: 'Te_eV' }).slice(0, detail.length)).toEqual([...detail]);
    expect(queryKeys.sweeps.list({ status: 'running' }).slice(0, 2)).toEqual([...queryKeys.sweeps.lists()]);
  });
});
