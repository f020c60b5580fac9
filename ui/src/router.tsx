import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { RequireAuth } from './auth/RequireAuth.js';
import { RoleGate } from './auth/RoleGate.js';
import { AppLayout } from './components/Shell/AppLayout.js';
import { PageLoader } from './components/Shell/PageLoader.js';
import { RouteError } from './components/Shell/RouteError.js';
import { pageRoutes, publicRoutes, type PageRoute } from './routes.js';

export interface RouteHandle {
  title: string;
}

function toRoute(page: PageRoute): RouteObject {
  return {
    path: page.path,
    handle: { title: page.title } satisfies RouteHandle,
    lazy: async () => {
      const { default: Page } = await page.load();
      const Component = () => (
        <RoleGate roles={page.roles}>
          <Page />
        </RoleGate>
      );
      return { Component };
    },
  };
}

export function buildRoutes(): RouteObject[] {
  return [
    {
      errorElement: <RouteError />,
      HydrateFallback: PageLoader,
      children: [
        ...publicRoutes.map(toRoute),
        {
          element: (
            <RequireAuth>
              <AppLayout />
            </RequireAuth>
          ),
          errorElement: <RouteError />,
          children: [
            ...pageRoutes.map(toRoute),
            {
              path: '*',
              handle: { title: 'Not found' } satisfies RouteHandle,
              lazy: async () => ({ Component: (await import('./pages/NotFound.page.js')).default }),
            },
          ],
        },
      ],
    },
  ];
}

export function createAppRouter() {
  return createBrowserRouter(buildRoutes());
}
