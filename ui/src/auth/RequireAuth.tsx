import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { useSession } from './session.js';

/** Sends signed-out visitors to sign-in, remembering where they were going (path, query, hash). */
export function RequireAuth({ children }: { children: ReactNode }) {
  const session = useSession();
  const location = useLocation();
  if (!session) {
    const next = `${location.pathname}${location.search}${location.hash}`;
    const to = next === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(next)}`;
    return <Navigate to={to} replace />;
  }
  return <>{children}</>;
}

/** Only same-site paths are followed after sign-in (no open redirect, no loop back to sign-in). */
export function safeNext(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  if (next === '/sign-in' || next.startsWith('/sign-in?') || next.startsWith('/sign-in/')) return '/';
  return next;
}
