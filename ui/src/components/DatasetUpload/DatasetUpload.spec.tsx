import { MantineProvider } from '@mantine/core';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { DatasetUpload } from './DatasetUpload.js';

const CSV = 'r_cm,phi_V,n,probe\n0,0,1e12,tip-A\n0.5,-0.075,9.7531e11,tip-A\n1,-0.3,oops,tip-B\n';

function mount(response: { status: number; body: unknown }) {
  const sent: FormData[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (_url: string, init?: RequestInit) => {
      sent.push(init?.body as FormData);
      return new Response(JSON.stringify(response.body), {
        status: response.status,
        headers: { 'content-type': 'application/json' },
      });
    }),
  );
  const onUploaded = vi.fn();
  const qc = new QueryClient({ defaultOptions: { mutations: { retry: false } } });
  const view = render(
    <MantineProvider env="test">
      <QueryClientProvider client={qc}>
        <DatasetUpload onUploaded={onUploaded} />
      </QueryClientProvider>
    </MantineProvider>,
  );
  return { sent, onUploaded, view };
}

async function drop(view: ReturnType<typeof render>) {
  const input = view.container.querySelector('input[type="file"]') as HTMLInputElement;
  const file = new File([CSV], 'argon-probe.csv', { type: 'text/csv' });
  fireEvent.change(input, { target: { files: [file] } });
  await screen.findByTestId('dataset-preview');
}

afterEach(() => vi.unstubAllGlobals());

describe('DatasetUpload', () => {
  it('previews the first rows, guesses units from names, and sends the unit map', async () => {
    const { sent, onUploaded, view } = mount({
      status: 201,
      body: { id: 4, name: 'argon-probe', rows: 3, columns: [] },
    });
    await drop(view);
    expect(screen.getByTestId('dataset-preview').textContent).toContain('tip-A');
    expect((screen.getByLabelText('Unit of phi_V') as HTMLInputElement).value).toBe('V');
    fireEvent.change(screen.getByLabelText('Unit of n'), { target: { value: 'cm^-3' } });
    fireEvent.change(screen.getByLabelText('Unit of r_cm'), { target: { value: 'cm' } });
    fireEvent.click(screen.getByRole('button', { name: /Upload dataset/ }));
    await waitFor(() => expect(onUploaded).toHaveBeenCalled());
    const form = sent[0];
    expect(JSON.parse(form.get('units') as string)).toEqual({ r_cm: 'cm', phi_V: 'V', n: 'cm^-3' });
    expect(form.get('name')).toBe('argon-probe');
    expect((form.get('file') as File).name).toBe('argon-probe.csv');
  });

  it('shows the server problems per line and column, and unit errors beside the field', async () => {
    const { view } = mount({
      status: 400,
      body: {
        statusCode: 400,
        error: 'Bad Request',
        message: 'The file has 1 problem; first at line 4, column n',
        details: [
          { path: 'file', line: 4, column: 'n', message: '"oops" is not a number' },
          { path: 'units.probe', column: 'probe', message: 'unknown unit "tip"' },
        ],
      },
    });
    await drop(view);
    fireEvent.click(screen.getByRole('button', { name: /Upload dataset/ }));
    const rows = await screen.findByTestId('upload-error-rows');
    expect(rows.textContent).toContain('4');
    expect(rows.textContent).toContain('"oops" is not a number');
    expect(screen.getByText('unknown unit "tip"')).toBeTruthy();
  });

  it('refuses characters no unit has before sending anything', async () => {
    const { sent, view } = mount({ status: 201, body: {} });
    await drop(view);
    fireEvent.change(screen.getByLabelText('Unit of n'), { target: { value: 'cm^-3; drop' } });
    expect(screen.getByText(/a unit uses letters, digits/)).toBeTruthy();
    expect((screen.getByRole('button', { name: /Upload dataset/ }) as HTMLButtonElement).disabled).toBe(true);
    expect(sent).toHaveLength(0);
  });
});
