import { MantineProvider } from '@mantine/core';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import PasswordPage from './Password.page.js';

function mount() {
  const fetchMock = vi.fn(
    async () => new Response('{}', { status: 200, headers: { 'content-type': 'application/json' } }),
  );
  vi.stubGlobal('fetch', fetchMock);
  render(
    <MantineProvider env="test">
      <QueryClientProvider client={new QueryClient()}>
        <MemoryRouter>
          <PasswordPage />
        </MemoryRouter>
      </QueryClientProvider>
    </MantineProvider>,
  );
  return fetchMock;
}

afterEach(() => vi.unstubAllGlobals());

describe('Password form (@mantine/form with the domain schema)', () => {
  it('shows no error before anything is typed, then every error beside its field at once, and sends nothing', async () => {
    const fetchMock = mount();
    expect(screen.queryByText(/required|at least 10/)).toBeNull();
    const [next, repeat] = screen.getAllByLabelText(/^New password/);
    fireEvent.change(next!, { target: { value: 'short' } });
    fireEvent.change(repeat!, { target: { value: 'other' } });
    fireEvent.click(screen.getByRole('button', { name: 'Change password' }));
    await waitFor(() => expect(screen.getByText('at least 10 characters')).toBeTruthy());
    // From changePasswordSchema (domain) and the form's own repeat check, each beside its input.
    expect(screen.getByText('required')).toBeTruthy();
    expect(screen.getByText('does not match the new password')).toBeTruthy();
    // Nothing is sent while the form has problems (other reads, such as the token count, may run).
    const posts = fetchMock.mock.calls.filter(
      (c) => (c as unknown[])[1] && ((c as unknown[])[1] as RequestInit).method === 'POST',
    );
    expect(posts).toEqual([]);
  });
});
