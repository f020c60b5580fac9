import { NavLink, Stack } from '@mantine/core';
import { Link, useLocation } from 'react-router-dom';
import { hasRole, useMe } from '../../api/auth.js';
import { navRoutes, type PageRoute } from '../../routes.js';

export function isActive(route: PageRoute, pathname: string): boolean {
  if (route.path === '/') return pathname === '/';
  if (pathname === route.path || pathname.startsWith(`${route.path}/`)) return true;
  // A more specific nav item (New sweep at /sweeps/new) wins over a prefix (Catalogue's /sweeps/).
  if (navRoutes.some((r) => r !== route && pathname === r.path)) return false;
  return (route.nav?.alsoActiveFor ?? []).some((prefix) => pathname.startsWith(prefix));
}

export function NavRail({ onNavigate }: { onNavigate?: () => void }) {
  const { pathname } = useLocation();
  const { data: me } = useMe();
  return (
    <Stack gap={2} component="nav" aria-label="Main">
      {navRoutes
        .filter((r) => hasRole(me, r.roles))
        .map((r) => {
          const Glyph = r.nav!.icon;
          const active = isActive(r, pathname);
          return (
            <NavLink
              key={r.path}
              component={Link}
              to={r.path}
              label={r.nav!.label}
              leftSection={<Glyph size={18} stroke={1.7} aria-hidden />}
              active={active}
              aria-current={active ? 'page' : undefined}
              onClick={onNavigate}
              variant="light"
              style={{ borderRadius: 6 }}
            />
          );
        })}
    </Stack>
  );
}
