import { useSyncExternalStore } from 'react';
import type { RoleName } from '@driftgrid/domain';

/** A user's role (the list is declared once, in the domain's contracts). */
export type Role = RoleName;
/** The signed-in user as the api returns it from login and /auth/me. */
export interface SessionUser {
  id: string | number;
  email: string;
  name: string;
  role: Role;
}
export interface Session {
  accessToken: string;
  user: SessionUser;
}

// One localStorage entry so token and user never disagree; other tabs follow via `storage` events.
const KEY = 'driftgrid.session';
const listeners = new Set<() => void>();
let cached: { raw: string | null; value: Session | null } = { raw: null, value: null };

function read(): Session | null {
  let raw: string | null;
  try {
    raw = window.localStorage.getItem(KEY);
  } catch {
    return null; // storage blocked (private mode policies): behave as signed out
  }
  if (raw === cached.raw) return cached.value;
  let value: Session | null = null;
  if (raw) {
    try {
      const parsed = JSON.parse(raw) as Partial<Session>;
      if (typeof parsed.accessToken === 'string' && parsed.user && typeof parsed.user.email === 'string') {
        value = parsed as Session;
      }
    } catch {
      value = null;
    }
  }
  cached = { raw, value };
  return value;
}

function emit(): void {
  for (const l of listeners) l();
}

export function getSession(): Session | null {
  return read();
}

export function getToken(): string | null {
  return read()?.accessToken ?? null;
}

export function setSession(session: Session): void {
  window.localStorage.setItem(KEY, JSON.stringify(session));
  emit();
}

/** Refresh the stored user (name or role changed) without touching the token. */
export function updateSessionUser(user: SessionUser): void {
  const s = read();
  if (s && JSON.stringify(s.user) !== JSON.stringify(user)) setSession({ ...s, user });
}

export function clearSession(): void {
  window.localStorage.removeItem(KEY);
  emit();
}

// Set when the server rejected our token mid-visit, so sign-in can say why the user is there.
let expired = false;
export function markSessionExpired(): void {
  expired = true;
}
export function sessionExpired(): boolean {
  return expired;
}
export function resetSessionExpired(): void {
  expired = false;
}

export function subscribeSession(listener: () => void): () => void {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => {
    if (e.key === KEY || e.key === null) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

/** The current session, re-rendering on sign-in, sign-out and changes made in other tabs. */
export function useSession(): Session | null {
  return useSyncExternalStore(subscribeSession, read, () => null);
}
