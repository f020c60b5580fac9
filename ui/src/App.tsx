import { localStorageColorSchemeManager, MantineProvider } from '@mantine/core';
import { Notifications } from '@mantine/notifications';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { RouterProvider } from 'react-router-dom';
import { setUnauthorizedHandler } from './api/client.js';
import { createQueryClient } from './api/queryClient.js';
import { clearSession, markSessionExpired } from './auth/session.js';
import { createAppRouter } from './router.js';
import { cssVariablesResolver, theme } from './theme/theme.js';

export const colorSchemeManager = localStorageColorSchemeManager({ key: 'driftgrid.color-scheme' });

/**
 * A 401 on a signed-in call: forget the token but not the page or the drafts. The sign-in guard
 * then sends the user to /sign-in?next=<this page>, and back here afterwards.
 */
export function installUnauthorizedHandler(queryClient: QueryClient): () => void {
  setUnauthorizedHandler(() => {
    markSessionExpired();
    clearSession();
    void queryClient.cancelQueries();
  });
  return () => setUnauthorizedHandler(null);
}

export function App() {
  const [queryClient] = useState(createQueryClient);
  const [router] = useState(createAppRouter);
  useEffect(() => installUnauthorizedHandler(queryClient), [queryClient]);
  return (
    <MantineProvider
      theme={theme}
      cssVariablesResolver={cssVariablesResolver}
      colorSchemeManager={colorSchemeManager}
      defaultColorScheme="auto"
    >
      <Notifications position="top-right" limit={4} />
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </MantineProvider>
  );
}
