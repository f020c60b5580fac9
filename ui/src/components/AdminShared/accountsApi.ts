import type {
  AdminUser,
  ApiTokenSummary,
  AuditEntry,
  CreatedApiToken,
  Invitation,
  MailMessage,
  MailSummary,
  Quota,
  QuotasDocument,
  RoleQuotaPatch,
  UserQuotaPatch,
} from '@driftgrid/domain';
import { api, type Page } from '../../api/client.js';
import type { Role } from '../../auth/session.js';

export type {
  AdminUser,
  ApiTokenSummary,
  AuditEntry,
  CreatedApiToken,
  Invitation,
  MailMessage,
  MailSummary,
  Quota,
  QuotasDocument,
};

/** Typed calls for the account and admin routes (SPEC §6). */
export const accountsApi = {
  users: (q: { page?: number; pageSize?: number; q?: string; role?: Role | '' }) =>
    api.get<Page<AdminUser>>('/admin/users', q),
  patchUser: (id: number, patch: { role?: Role; active?: boolean; name?: string }) =>
    api.patch<AdminUser>(`/admin/users/${id}`, patch),
  invitations: (page = 1) => api.get<Page<Invitation>>('/admin/invitations', { page }),
  invite: (body: { email: string; role: Role }) => api.post<Invitation>('/admin/invitations', body),
  revokeInvitation: (id: number) => api.delete<Invitation>(`/admin/invitations/${id}`),
  quotas: () => api.get<QuotasDocument>('/admin/quotas'),
  putRoleQuota: (role: Role, patch: RoleQuotaPatch) => api.put<QuotasDocument>(`/admin/quotas/roles/${role}`, patch),
  putUserQuota: (id: number, patch: UserQuotaPatch) => api.put<QuotasDocument>(`/admin/quotas/users/${id}`, patch),
  mailbox: (page = 1) => api.get<Page<MailSummary> & { builtIn?: boolean }>('/admin/mailbox', { page }),
  mail: (id: number) => api.get<MailMessage>(`/admin/mailbox/${id}`),
  audit: (page = 1) => api.get<Page<AuditEntry>>('/admin/audit', { page }),
  tokens: () => api.get<Page<ApiTokenSummary>>('/tokens', { pageSize: 200 }),
  createToken: (body: { name: string; scope: 'read' | 'read-write'; expiresAt?: string | null }) =>
    api.post<CreatedApiToken>('/tokens', body),
  revokeToken: (id: number) => api.delete<ApiTokenSummary>(`/tokens/${id}`),
  changePassword: (body: { current: string; next: string }) =>
    api.post<{
      message: string;
      accessToken: string;
      user: { id: number; email: string; name: string; role: 'admin' | 'researcher' | 'reviewer' };
    }>('/auth/password', body),
};

export const QUOTA_LABELS: Record<keyof Quota, { label: string; unit: string }> = {
  maxPointsPerSweep: { label: 'Points per sweep', unit: 'points' },
  maxRunningSweeps: { label: 'Sweeps queued or running at once', unit: 'sweeps' },
  maxPointsPer30Days: { label: 'Points per rolling 30 days', unit: 'points' },
  maxStoredPoints: { label: 'Stored points', unit: 'points' },
};

export const ROLES: readonly Role[] = ['admin', 'researcher', 'reviewer'];

/** Dates as the admin tables show them: local date and time to the minute. */
export function formatWhen(ms: number | null | undefined): string {
  if (ms === null || ms === undefined) return '—';
  return new Date(ms).toLocaleString(undefined, {
    year: 'numeric',
    month: 'short',
    day: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
  });
}
