import { MantineProvider } from '@mantine/core';
import { QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createQueryClient } from '../api/queryClient.js';
import { getSession } from '../auth/session.js';
import { theme } from '../theme/theme.js';
import SignInPage from './SignIn.page.js';

function jsonResponse(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

function renderAt(url: string) {
  const router = createMemoryRouter(
    [
      { path: '/sign-in', element: <SignInPage /> },
      { path: '/', element: <p>dashboard landing</p> },
      { path: '/sweeps/new', element: <p>sweep builder</p> },
    ],
    { initialEntries: [url] },
  );
  render(
    <MantineProvider theme={theme}>
      <QueryClientProvider client={createQueryClient()}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </MantineProvider>,
  );
  return router;
}

function fill(email: string, password: string) {
  fireEvent.change(screen.getByLabelText('Email'), { target: { value: email } });
  fireEvent.change(screen.getByLabelText('Password'), { target: { value: password } });
}

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
});

describe('SignInPage', () => {
  it('shows the server message in an alert when the password is wrong', async () => {
    fetchMock.mockResolvedValueOnce(
      jsonResponse(401, { statusCode: 401, error: 'Unauthorized', message: 'Email or password is wrong' }),
    );
    renderAt('/sign-in');
    fill('researcher@example.com', 'not-the-password');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    const alert = await screen.findByTestId('signin-error');
    expect(alert.getAttribute('role')).toBe('alert');
    expect(alert.textContent).toContain('Email or password is wrong');
    expect(getSession()).toBeNull();

    const [url, init] = fetchMock.mock.calls[0]!;
    expect(url).toBe('/api/auth/login');
    expect(init?.method).toBe('POST');
    expect(JSON.parse(init?.body as string)).toEqual({ email: 'researcher@example.com', password: 'not-the-password' });
    // Sign-in must not send a stale token.
    expect((init?.headers as Record<string, string>).Authorization).toBeUndefined();
  });

  it('stores the session and returns to the page the user came from', async () => {
    fetchMock.mockResolvedValueOnce(
      jsonResponse(201, {
        accessToken: 'tok-123',
        user: { id: 2, email: 'researcher@example.com', name: 'Rosa Researcher', role: 'researcher' },
      }),
    );
    const router = renderAt(`/sign-in?next=${encodeURIComponent('/sweeps/new')}`);
    fill('  researcher@example.com ', 'driftgrid-demo');
    fireEvent.submit(screen.getByRole('button', { name: 'Sign in' }).closest('form')!);

    await screen.findByText('sweep builder');
    expect(router.state.location.pathname).toBe('/sweeps/new');
    expect(getSession()).toEqual({
      accessToken: 'tok-123',
      user: { id: 2, email: 'researcher@example.com', name: 'Rosa Researcher', role: 'researcher' },
    });
    expect(JSON.parse(fetchMock.mock.calls[0]![1]?.body as string).email).toBe('researcher@example.com');
  });

  it('ignores a next parameter that points off-site', async () => {
    fetchMock.mockResolvedValueOnce(
      jsonResponse(201, { accessToken: 't', user: { id: 1, email: 'a@example.com', name: 'A', role: 'admin' } }),
    );
    const router = renderAt(`/sign-in?next=${encodeURIComponent('//elsewhere.test/x')}`);
    fill('a@example.com', 'pw');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await screen.findByText('dashboard landing');
    expect(router.state.location.pathname).toBe('/');
  });

  it('names empty fields beside them and sends nothing', async () => {
    renderAt('/sign-in');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter the email address your account uses')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("checks the address with the domain's login schema: nothing before typing, the error beside the field once left", async () => {
    renderAt('/sign-in');
    expect(screen.queryByText('must be an e-mail address')).toBeNull();
    const email = screen.getByLabelText('Email');
    fireEvent.change(email, { target: { value: 'researcher-at-example' } });
    expect(screen.queryByText('must be an e-mail address')).toBeNull();
    fireEvent.blur(email);
    const error = await screen.findByText('must be an e-mail address');
    // Mantine links the error to its input (aria-describedby), so it sits beside the field it names.
    expect(error.id).not.toBe('');
    expect(email.getAttribute('aria-describedby') ?? '').toContain(error.id);
    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'driftgrid-demo' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('must be an e-mail address')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("submits with Enter: the button is the form's submit button", () => {
    renderAt('/sign-in');
    const button = screen.getByRole('button', { name: 'Sign in' });
    expect(button.getAttribute('type')).toBe('submit');
    expect(button.closest('form')).toBe(screen.getByLabelText('Email').closest('form'));
  });

  it('explains when the server cannot be reached', async () => {
    fetchMock.mockRejectedValueOnce(new TypeError('fetch failed'));
    renderAt('/sign-in');
    fill('a@example.com', 'pw');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() =>
      expect(screen.getByTestId('signin-error').textContent).toMatch(/Cannot reach the Driftgrid server/),
    );
  });
});
