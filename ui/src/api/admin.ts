/**
 * The admin console's data (SPEC §6): users, invitations, quotas, the built-in mailbox, the audit log
 * and the queue summary. Keys come from queryKeys.ts; reads have queryOptions() factories.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  AdminUser,
  AdminUserPatch,
  AuditEntry,
  Invitation,
  InvitationRequest,
  MailMessage,
  MailSummary,
  QueueSummary,
  QuotasDocument,
  RoleQuotaPatch,
  UserQuotaPatch,
} from '@driftgrid/domain';
import type { Role } from '../auth/session.js';
import { api, type Page } from './client.js';
import { afterSuccess, type MutationHandlers } from './mutations.js';
import { queryKeys } from './queryKeys.js';

export type { AdminUser, AuditEntry, Invitation, MailMessage, MailSummary, QuotasDocument };

export type UserListQuery = { page?: number; pageSize?: number; q?: string; role?: Role | '' };

/** GET /api/admin/queue: chunks and sweeps in Driftgrid's words (domain/src/contracts/queue.ts). */
export type QueueStatus = QueueSummary;

export const adminQueries = {
  users: (q: UserListQuery) =>
    queryOptions({
      queryKey: queryKeys.admin.users(q),
      queryFn: ({ signal }) => api.get<Page<AdminUser>>('/admin/users', q, signal),
    }),
  invitations: (page: number) =>
    queryOptions({
      queryKey: queryKeys.admin.invitations({ page }),
      queryFn: ({ signal }) => api.get<Page<Invitation>>('/admin/invitations', { page }, signal),
    }),
  quotas: () =>
    queryOptions({
      queryKey: queryKeys.admin.quotas(),
      queryFn: ({ signal }) => api.get<QuotasDocument>('/admin/quotas', undefined, signal),
    }),
  mailbox: (page: number) =>
    queryOptions({
      queryKey: queryKeys.admin.mailbox({ page }),
      queryFn: ({ signal }) => api.get<Page<MailSummary> & { builtIn?: boolean }>('/admin/mailbox', { page }, signal),
    }),
  mail: (id: number) =>
    queryOptions({
      queryKey: queryKeys.admin.mail(id),
      queryFn: ({ signal }) => api.get<MailMessage>(`/admin/mailbox/${id}`, undefined, signal),
    }),
  audit: (page: number) =>
    queryOptions({
      queryKey: queryKeys.admin.audit({ page }),
      queryFn: ({ signal }) => api.get<Page<AuditEntry>>('/admin/audit', { page }, signal),
    }),
  queue: () =>
    queryOptions({
      queryKey: queryKeys.admin.queue(),
      queryFn: ({ signal }) => api.get<QueueStatus>('/admin/queue', undefined, signal),
    }),
};

export const useAdminUsers = (q: UserListQuery) => useQuery(adminQueries.users(q));
export const useInvitations = (page: number) => useQuery(adminQueries.invitations(page));
export const useQuotas = () => useQuery(adminQueries.quotas());
export const useMailbox = (page: number) => useQuery({ ...adminQueries.mailbox(page), refetchInterval: 10_000 });
export const useMail = (id: number) => useQuery(adminQueries.mail(id));
export const useAuditLog = (page: number) => useQuery(adminQueries.audit(page));

/** The queue summary, refreshed every 5 s; `retry` false where a missing route should show at once. */
export function useQueueStatus({ retry = true }: { retry?: boolean } = {}) {
  return useQuery({ ...adminQueries.queue(), retry: retry ? undefined : false, refetchInterval: 5000 });
}

/** Pause or resume handing out chunks; the answer is the new summary, written straight to the cache. */
export function useQueueControl() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (action: 'pause' | 'resume') => api.post<QueueSummary>(`/admin/queue/${action}`, {}),
    onSuccess: (summary) => {
      qc.setQueryData(queryKeys.admin.queue(), summary);
      void qc.invalidateQueries({ queryKey: ['admin', 'audit'] });
    },
  });
}

type UserPatch = AdminUserPatch;

export function usePatchUser(handlers?: MutationHandlers<AdminUser, { id: number; patch: UserPatch }>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { id: number; patch: UserPatch }) => api.patch<AdminUser>(`/admin/users/${v.id}`, v.patch),
    ...afterSuccess(() => {
      void qc.invalidateQueries({ queryKey: ['admin', 'users'] });
      void qc.invalidateQueries({ queryKey: ['admin', 'audit'] });
    }, handlers),
  });
}

/** After an invitation changes: its list, the mailbox (the mail it sent) and the audit log. */
function useRefreshInvitations() {
  const qc = useQueryClient();
  return () => {
    void qc.invalidateQueries({ queryKey: ['admin', 'invitations'] });
    void qc.invalidateQueries({ queryKey: ['admin', 'mailbox'] });
    void qc.invalidateQueries({ queryKey: ['admin', 'audit'] });
  };
}

export function useInvite(handlers?: MutationHandlers<Invitation, InvitationRequest>) {
  const refresh = useRefreshInvitations();
  return useMutation({
    mutationFn: (body: InvitationRequest) => api.post<Invitation>('/admin/invitations', body),
    ...afterSuccess(refresh, handlers),
  });
}

export function useRevokeInvitation() {
  const refresh = useRefreshInvitations();
  return useMutation({
    mutationFn: (id: number) => api.delete<Invitation>(`/admin/invitations/${id}`),
    onSuccess: refresh,
  });
}

export function usePutRoleQuota(role: Role, handlers?: MutationHandlers<QuotasDocument, RoleQuotaPatch>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (patch: RoleQuotaPatch) => api.put<QuotasDocument>(`/admin/quotas/roles/${role}`, patch),
    ...afterSuccess((doc) => qc.setQueryData(queryKeys.admin.quotas(), doc), handlers),
  });
}

export function usePutUserQuota(
  handlers?: MutationHandlers<QuotasDocument, { userId: number; patch: UserQuotaPatch }>,
) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { userId: number; patch: UserQuotaPatch }) =>
      api.put<QuotasDocument>(`/admin/quotas/users/${v.userId}`, v.patch),
    ...afterSuccess((doc) => qc.setQueryData(queryKeys.admin.quotas(), doc), handlers),
  });
}
