import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback } from 'react';
import { useNavigate } from 'react-router-dom';
import {
  clearSession,
  getToken,
  setSession,
  updateSessionUser,
  useSession,
  type Role,
  type SessionUser,
} from '../auth/session.js';
import type { LoginRequest, LoginResponse, MeResponse, Quota as QuotaLimits, QuotaUsage } from '@driftgrid/domain';
import { api } from './client.js';
import { queryKeys } from './queryKeys.js';

export type { Role, SessionUser };

export type { LoginRequest, LoginResponse };

/** SPEC §9 quota limits and usage (the domain's shapes); every field optional because the api may send only some. */
export type Quota = Partial<QuotaLimits>;
export type Usage = Partial<QuotaUsage>;
export interface Me extends SessionUser {
  quota?: Quota;
  usage?: Usage;
}

export function login(body: LoginRequest): Promise<LoginResponse> {
  return api.post<LoginResponse>('/auth/login', body, { auth: false });
}

/** The ui's flat view of GET /api/auth/me (the domain's MeResponse): the user with quota and usage. */
export function meView(r: MeResponse): Me {
  const { id, email, name, role } = r.user;
  return { id, email, name, role, quota: r.quota, usage: r.usage };
}

export async function fetchMe(signal?: AbortSignal): Promise<Me> {
  return meView(await api.get<MeResponse>('/auth/me', undefined, signal));
}

/** The signed-in user, fresh from the server; `undefined` while signed out. */
export function useMe() {
  const session = useSession();
  return useQuery({
    queryKey: queryKeys.me(),
    queryFn: async ({ signal }) => {
      const me = await fetchMe(signal);
      updateSessionUser({ id: me.id, email: me.email, name: me.name, role: me.role });
      return me;
    },
    enabled: !!session,
    // Until the server answers, show what sign-in returned.
    placeholderData: session ? { ...session.user } : undefined,
  });
}

/** Sign in: store the session, start from an empty cache, seed `me`. */
export function useLogin() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (res) => {
      qc.clear();
      setSession({ accessToken: res.accessToken, user: res.user });
      qc.setQueryData(queryKeys.me(), { ...res.user } satisfies Me);
      // Login returns the bare user; fetch quota and usage straight away.
      void qc.invalidateQueries({ queryKey: queryKeys.me() });
    },
  });
}

/** Sign out on purpose: forget the token and every cached answer. Drafts stay (per user). */
export function useSignOut() {
  const qc = useQueryClient();
  const navigate = useNavigate();
  return useCallback(() => {
    clearSession();
    qc.clear();
    void navigate('/sign-in', { replace: true });
  }, [qc, navigate]);
}

export function isSignedIn(): boolean {
  return getToken() !== null;
}

export function hasRole(
  user: Pick<SessionUser, 'role'> | null | undefined,
  roles: readonly Role[] | undefined,
): boolean {
  if (!roles || roles.length === 0) return true;
  return !!user && roles.includes(user.role);
}
