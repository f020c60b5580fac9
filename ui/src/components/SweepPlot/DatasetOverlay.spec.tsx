import { MantineProvider } from '@mantine/core';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { DatasetColumn, DatasetView } from '@driftgrid/domain';
import { clearSession, setSession } from '../../auth/session.js';
import type { OverlaySeries } from './chartOptions.js';
import { DatasetOverlay } from './DatasetOverlay.js';

// An invented probe scan of the argon column: Te in eV, a dimensionless ratio, radius in m.
const col = (name: string, canonicalUnit: string): DatasetColumn => ({
  name,
  kind: 'number',
  unit: canonicalUnit,
  canonicalUnit,
  quantity: null,
});
const probe: DatasetView = {
  id: 4,
  name: 'Probe scan',
  fileName: 'probe.csv',
  rows: 4,
  columns: [
    { name: 'tip', kind: 'text', unit: '', canonicalUnit: '', quantity: null },
    col('r', 'm'),
    col('Te', 'eV'),
    col('ratio', '1'),
  ],
  visibility: 'private',
  sha256: 'cd'.repeat(32),
  owner: { id: 2, name: 'R' },
  sharedWith: [],
  createdAt: '2026-01-01T00:00:00.000Z',
};
const values: Record<string, number[]> = {
  r: [0.01, 0.02, 0.03, 0.04],
  Te: [-1, 3, 9, 27],
  ratio: [0.1, 0.2, 0.3, 0.4],
};
const unitOf: Record<string, string> = { r: 'm', Te: 'eV', ratio: '1' };

function mount(scales = { x: false, y: false }) {
  setSession({ accessToken: 't', user: { id: 2, email: 'x@example.com', name: 'X', role: 'researcher' } });
  const urls: string[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string) => {
      urls.push(url);
      const json = (body: unknown) =>
        new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } });
      if (url.startsWith('/api/datasets?')) return json({ items: [probe], total: 1, page: 1, pageSize: 200 });
      const m = /^\/api\/datasets\/4\/series\?(.*)$/.exec(url);
      if (m) {
        const q = new URLSearchParams(m[1]);
        const x = q.get('x')!;
        const y = q.get('y')!;
        return json({
          x: { name: x, unit: unitOf[x], quantity: null },
          y: { name: y, unit: unitOf[y], quantity: null },
          n: 4,
          total: 4,
          points: { x: values[x], y: values[y] },
        });
      }
      return new Response('{}', { status: 404 });
    }),
  );
  const seen: (OverlaySeries | null)[] = [];
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <MantineProvider env="test">
      <QueryClientProvider client={qc}>
        <MemoryRouter>
          <DatasetOverlay
            plot={{ x: { name: 'Te_eV', unit: 'eV' }, y: { name: 'rho_i_over_Ln', unit: '1' } }}
            scales={scales}
            onOverlay={(o) => seen.push(o)}
          />
        </MemoryRouter>
      </QueryClientProvider>
    </MantineProvider>,
  );
  return { urls, seen };
}

async function chooseDataset() {
  fireEvent.click(screen.getByLabelText('Overlay a dataset'));
  const input = await screen.findByTestId('overlay-dataset');
  fireEvent.click(input);
  fireEvent.click(await screen.findByText('Probe scan (4 rows)'));
}

beforeEach(() => clearSession());
afterEach(() => vi.unstubAllGlobals());

describe('DatasetOverlay', () => {
  it('fetches nothing until switched on, then defaults to the columns in the plot units and hands the points over', async () => {
    const { urls, seen } = mount();
    expect(urls).toEqual([]);
    await chooseDataset();
    await waitFor(() => expect(seen.at(-1)?.points).toHaveLength(4));
    expect(urls.some((u) => u.includes('/api/datasets/4/series?x=Te&y=ratio'))).toBe(true);
    expect(seen.at(-1)).toEqual({
      name: 'Dataset: Probe scan',
      points: [
        [-1, 0.1],
        [3, 0.2],
        [9, 0.3],
        [27, 0.4],
      ],
    });
    expect((screen.getByTestId('overlay-x') as HTMLInputElement).value).toBe('Te (eV)');
    expect(screen.getByTestId('overlay-summary').textContent).toBe('4 points of “Probe scan” drawn.');
  });

  it('counts the points a log x axis leaves out', async () => {
    const { seen } = mount({ x: true, y: false });
    await chooseDataset();
    await waitFor(() => expect(seen.at(-1)?.points).toHaveLength(3));
    expect(screen.getByTestId('overlay-summary').textContent).toContain(
      '1 point with a value ≤ 0 left out on the log axis',
    );
  });

  it('warns, naming both units, and draws nothing when a column in another unit is picked', async () => {
    const { seen } = mount();
    await chooseDataset();
    await waitFor(() => expect(seen.at(-1)?.points).toHaveLength(4));
    const xInput = screen.getByTestId('overlay-x');
    fireEvent.click(xInput);
    // Both column pickers list the same options; take the one in the x picker's list.
    await waitFor(() => expect(xInput.getAttribute('aria-controls')).toBeTruthy());
    const list = await waitFor(() => document.getElementById(xInput.getAttribute('aria-controls')!)!);
    fireEvent.click(within(list).getByText('r (m)'));
    const warning = await screen.findByTestId('overlay-warning');
    expect(warning.textContent).toContain("The dataset's x (r) is in m, the plot's x (Te_eV) is in eV");
    expect(warning.textContent).toContain('pick an x column in eV and a dimensionless y column');
    await waitFor(() => expect(seen.at(-1)).toBeNull());
    expect(screen.queryByTestId('overlay-summary')).toBeNull();
  });
});
