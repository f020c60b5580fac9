import { MantineProvider } from '@mantine/core';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { setSession, clearSession } from '../../auth/session.js';
import { useSweep, type SweepView } from '../../api/sweeps.js';
import { ExportActions } from './ExportActions.js';

const SHA = 'ab'.repeat(32);

function sweep(patch: Partial<SweepView> = {}): SweepView {
  return {
    id: 7,
    name: 'Argon column scan',
    model: 'cross-field',
    status: 'completed',
    points: 35,
    progress: { done: 35, total: 35, fraction: 1 },
    chunks: 1,
    definition: {
      name: 'Argon column scan',
      model: 'cross-field',
      axes: [{ kind: 'linear', param: 'B_T', min: 0.05, max: 0.5, count: 5 }],
    },
    columns: [],
    tags: [],
    owner: { id: 2, name: 'Ruth Researcher', email: 'researcher@example.com' },
    visibility: 'private',
    sharedWith: [],
    createdAt: '2026-01-01T00:00:00.000Z',
    startedAt: null,
    finishedAt: '2026-01-01T00:01:00.000Z',
    error: null,
    flagsSummary: { invalidPoints: 0, byFlag: {} },
    provenance: { modelVersion: '1.0.0', appVersion: '0.1.0', computeMs: 1, workers: [] },
    ...patch,
  };
}

/** Renders ExportActions the way a page does: from the cached GET /api/sweeps/:id. */
function Host() {
  const { data } = useSweep(7);
  return data ? <ExportActions sweep={data} /> : null;
}

function mount(me: { id: number; role: string }, current: SweepView, archived?: SweepView) {
  setSession({
    accessToken: 'test-token',
    user: { id: me.id, email: 'x@example.com', name: 'X', role: me.role as 'researcher' },
  });
  const calls: { url: string; method: string }[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init?: RequestInit) => {
      calls.push({ url, method: init?.method ?? 'GET' });
      const json = (body: unknown) =>
        new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } });
      if (url.startsWith('/api/auth/me'))
        return json({ id: me.id, email: 'x@example.com', name: 'X', role: me.role, quota: {}, usage: {} });
      if (url === '/api/sweeps/7/archive' && init?.method === 'POST') {
        current = archived!;
        return json(archived);
      }
      if (url === '/api/sweeps/7') return json(current);
      return new Response('{}', { status: 404 });
    }),
  );
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <MantineProvider env="test">
      <QueryClientProvider client={qc}>
        <Host />
      </QueryClientProvider>
    </MantineProvider>,
  );
  return calls;
}

beforeEach(() => clearSession());
afterEach(() => vi.unstubAllGlobals());

describe('ExportActions', () => {
  it('lets the owner archive a completed sweep after a confirmation that says it freezes the sweep', async () => {
    const archived = sweep({
      status: 'archived',
      archive: { sha256: SHA, bytes: 5120, archivedAt: '2026-01-02T00:00:00.000Z' },
    });
    const calls = mount({ id: 2, role: 'researcher' }, sweep(), archived);
    fireEvent.click(await screen.findByTestId('archive-open'));
    expect((await screen.findByText(/Archiving freezes the sweep/)).textContent).toMatch(/cannot be undone/);
    fireEvent.click(screen.getByTestId('archive-confirm'));
    const digest = await screen.findByTestId('archive-sha256');
    expect(digest.textContent).toBe(SHA);
    expect(calls.filter((c) => c.method === 'POST').map((c) => c.url)).toEqual(['/api/sweeps/7/archive']);
    await waitFor(() => expect(screen.queryByTestId('archive-open')).toBeNull());
  });

  it('offers no archive action to a reviewer, and shows the digest of an archived sweep', async () => {
    mount(
      { id: 3, role: 'reviewer' },
      sweep({ status: 'archived', archive: { sha256: SHA, bytes: 100, archivedAt: '2026-01-02T00:00:00.000Z' } }),
    );
    expect((await screen.findByTestId('archive-sha256')).textContent).toBe(SHA);
    expect(screen.getByTestId('export-download')).toBeTruthy();
    expect(screen.queryByTestId('archive-open')).toBeNull();
  });

  it('keeps the export disabled until the sweep has completed', async () => {
    mount({ id: 2, role: 'researcher' }, sweep({ status: 'running' }));
    const button = await screen.findByTestId('export-download');
    expect((button as HTMLButtonElement).disabled).toBe(true);
    expect(screen.queryByTestId('archive-open')).toBeNull();
  });
});
