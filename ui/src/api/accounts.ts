/**
 * One's own account outside sign-in (SPEC §6): change the password, reset a forgotten one, accept an
 * invitation. Reset and invitation calls carry no session.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  AcceptInviteRequest,
  ChangePasswordRequest,
  LoginResponse,
  PasswordChangedView,
  PasswordResetConfirm,
  PasswordResetRequest,
} from '@driftgrid/domain';
import { setSession } from '../auth/session.js';
import { api } from './client.js';
import { afterSuccess, type MutationHandlers } from './mutations.js';
import { queryKeys } from './queryKeys.js';

export type PasswordChanged = PasswordChangedView;
type ChangeBody = ChangePasswordRequest;
type Message = { message: string };

/** Other sessions are signed out by the change; this one continues on the fresh token. */
export function useChangePassword(handlers?: MutationHandlers<PasswordChanged, ChangeBody>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ChangeBody) => api.post<PasswordChanged>('/auth/password', body),
    ...afterSuccess((res) => {
      setSession({ accessToken: res.accessToken, user: res.user });
      if (res.tokensRevoked) void qc.invalidateQueries({ queryKey: queryKeys.tokens.all() });
    }, handlers),
  });
}

export function useRequestPasswordReset(handlers?: MutationHandlers<Message, PasswordResetRequest>) {
  return useMutation({
    mutationFn: (body: PasswordResetRequest) => api.post<Message>('/auth/password-reset', body, { auth: false }),
    ...handlers,
  });
}

export function useConfirmPasswordReset(handlers?: MutationHandlers<Message, PasswordResetConfirm>) {
  return useMutation({
    mutationFn: (body: PasswordResetConfirm) =>
      api.post<Message>('/auth/password-reset/confirm', body, { auth: false }),
    ...handlers,
  });
}

type AcceptBody = AcceptInviteRequest;

/** Accepting signs the new user in: start from an empty cache, store the session, seed `me`. */
export function useAcceptInvite(handlers?: MutationHandlers<LoginResponse, AcceptBody>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: AcceptBody) => api.post<LoginResponse>('/auth/accept-invite', body, { auth: false }),
    ...afterSuccess((res) => {
      qc.clear();
      setSession({ accessToken: res.accessToken, user: res.user });
      qc.setQueryData(queryKeys.me(), { ...res.user });
    }, handlers),
  });
}
