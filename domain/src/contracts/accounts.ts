import { z } from 'zod';
import { emailSchema, passwordSchema, ROLE_NAMES, type LoginResponse, type PublicUser, type RoleName } from './auth.js';
import { safeName } from './text-safety.js';

/* ---------- quotas (SPEC §9) ---------- */

export const QUOTA_KEYS = ['maxPointsPerSweep', 'maxRunningSweeps', 'maxPointsPer30Days', 'maxStoredPoints'] as const;
export type QuotaKey = (typeof QUOTA_KEYS)[number];

/** Each limit as the admin page, the builder and the api's refusals name it. */
export const QUOTA_LABELS: Record<QuotaKey, { label: string; unit: string }> = {
  maxPointsPerSweep: { label: 'Points per sweep', unit: 'points' },
  maxRunningSweeps: { label: 'Sweeps queued or running at once', unit: 'sweeps' },
  maxPointsPer30Days: { label: 'Points per rolling 30 days', unit: 'points' },
  maxStoredPoints: { label: 'Stored points', unit: 'points' },
};

/** Upper bound for any quota value: far above any sweep a server can hold, below 2^53. */
export const QUOTA_MAX = 1_000_000_000_000;

const quotaValue = z
  .number()
  .int('must be a whole number')
  .min(0, 'must be 0 or more')
  .max(QUOTA_MAX, `at most ${QUOTA_MAX}`);

export const quotaSchema = z.object({
  maxPointsPerSweep: quotaValue,
  maxRunningSweeps: quotaValue,
  maxPointsPer30Days: quotaValue,
  maxStoredPoints: quotaValue,
});
export type Quota = z.infer<typeof quotaSchema>;

/** PUT /api/admin/quotas/roles/:role — any subset of the four limits. */
export const roleQuotaPatchSchema = quotaSchema.partial().strict();
export type RoleQuotaPatch = z.infer<typeof roleQuotaPatchSchema>;

/** PUT /api/admin/quotas/users/:id — a subset; null clears that field (falls back to the role default). */
export const userQuotaPatchSchema = z
  .object({
    maxPointsPerSweep: quotaValue.nullable(),
    maxRunningSweeps: quotaValue.nullable(),
    maxPointsPer30Days: quotaValue.nullable(),
    maxStoredPoints: quotaValue.nullable(),
  })
  .partial()
  .strict();
export type UserQuotaPatch = z.infer<typeof userQuotaPatchSchema>;

export interface QuotaUsage {
  /** Sweeps of the user with status queued or running. */
  runningSweeps: number;
  /** Points charged by sweeps submitted in the last 30 days (rolling); deleting or cancelling refunds nothing. */
  pointsLast30Days: number;
  /** Points of non-deleted sweeps that hold or will hold results (not draft, failed or cancelled). */
  storedPoints: number;
}

export interface QuotaViolation {
  limit: QuotaKey;
  /** QUOTA_LABELS[limit].label: "Points per sweep". */
  label: string;
  value: number;
  /** What is already used before this sweep (0 for the per-sweep limit: nothing is used up front). */
  usage: number;
  /** What this sweep would add. */
  requested: number;
  /** Completes the label: "limit 1,000 points; this sweep has 13,950". */
  message: string;
}

export interface QuotaVerdict {
  allowed: boolean;
  violations: QuotaViolation[];
}

export interface UserQuotaOverride {
  userId: number;
  email: string;
  name: string;
  role: RoleName;
  maxPointsPerSweep: number | null;
  maxRunningSweeps: number | null;
  maxPointsPer30Days: number | null;
  maxStoredPoints: number | null;
}

export interface QuotasDocument {
  defaults: Record<RoleName, Quota>;
  overrides: UserQuotaOverride[];
}

/* ---------- paging ---------- */

export const pageQuerySchema = z.object({
  page: z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').default(1),
  pageSize: z.coerce
    .number()
    .int('must be a whole number')
    .min(1, 'must be 1 or more')
    .max(1000, 'at most 1000')
    .default(50),
});
export type PageQuery = z.infer<typeof pageQuerySchema>;

export interface PageOf<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/* ---------- admin: users, audit, mailbox ---------- */

export const adminUsersQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(200, 'at most 200 characters').optional(),
  role: z.enum(ROLE_NAMES).optional(),
});
export type AdminUsersQuery = z.infer<typeof adminUsersQuerySchema>;

export const personNameSchema = safeName(z.string().trim().min(1, 'required').max(120, 'at most 120 characters'));

export const adminUserPatchSchema = z
  .object({ role: z.enum(ROLE_NAMES), active: z.boolean(), name: personNameSchema })
  .partial()
  .strict()
  .refine((p) => Object.keys(p).length > 0, { message: 'give at least one of role, active, name' });
export type AdminUserPatch = z.infer<typeof adminUserPatchSchema>;

export interface AdminUser extends PublicUser {
  active: boolean;
  locked: boolean;
  createdAt: number;
  updatedAt: number;
}

export interface AuditEntry {
  id: number;
  actor: { id: number; email: string; name: string } | null;
  /** Machine code (`user.update`, `quota.role`, `queue.pause`). */
  action: string;
  /** The action and what changed, in words ("Changed the researcher quota: Points per sweep from …"). */
  summary: string;
  target: string | null;
  details: Record<string, unknown> | null;
  createdAt: number;
}

export interface MailSummary {
  id: number;
  from: string;
  to: string;
  subject: string;
  receivedAt: number;
}

export interface MailMessage extends MailSummary {
  messageId: string | null;
  text: string;
  html: string | null;
}

/* ---------- invitations, password reset, change password ---------- */

export const invitationRequestSchema = z.object({ email: emailSchema, role: z.enum(ROLE_NAMES) }).strict();
export type InvitationRequest = z.infer<typeof invitationRequestSchema>;

export type InvitationStatus = 'pending' | 'accepted' | 'expired' | 'revoked';

export interface Invitation {
  id: number;
  email: string;
  role: RoleName;
  status: InvitationStatus;
  invitedBy: { id: number; email: string; name: string } | null;
  createdAt: number;
  expiresAt: number;
  acceptedAt: number | null;
  /** Whether the invitation e-mail was handed to the mail relay. */
  mailed?: boolean;
}

/** One-time secrets in links: base64url of 32 random bytes (43 characters). */
export const oneTimeTokenSchema = z.string().trim().min(20, 'the link is incomplete').max(200, 'the link is malformed');

export const acceptInviteSchema = z
  .object({ token: oneTimeTokenSchema, name: personNameSchema, password: passwordSchema })
  .strict();
export type AcceptInviteRequest = z.infer<typeof acceptInviteSchema>;

export const passwordResetRequestSchema = z.object({ email: emailSchema }).strict();
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

export const passwordResetConfirmSchema = z.object({ token: oneTimeTokenSchema, password: passwordSchema }).strict();
export type PasswordResetConfirm = z.infer<typeof passwordResetConfirmSchema>;

export const changePasswordSchema = z
  .object({
    current: z.string().min(1, 'required').max(200, 'at most 200 characters'),
    next: passwordSchema,
    /** Also revoke every personal API token of the account (a reset always does). */
    revokeTokens: z.boolean({ error: 'must be true or false' }).default(false),
  })
  .strict()
  .refine((p) => p.current !== p.next, { path: ['next'], message: 'must differ from the current password' });
export type ChangePasswordRequest = z.infer<typeof changePasswordSchema>;

/** How many personal API tokens a change or reset revoked (a reset revokes them all). */
export interface TokensRevoked {
  tokensRevoked: number;
}

/** POST /api/auth/password: the caller's fresh session (every other one is signed out). */
export type PasswordChangedView = { message: string } & TokensRevoked & LoginResponse;

/** A route that takes no query parameters (any given is refused by name). */
export const noQuerySchema = z.object({});

/** GET /api/tokens/active: unrevoked, unexpired personal API tokens of the caller. */
export interface ActiveTokenCount {
  count: number;
}

/** The same answer whether or not the address is registered. */
export const PASSWORD_RESET_ACCEPTED =
  'If an account exists for that address, a reset link is on its way. It is valid for one hour.';

/* ---------- personal API tokens ---------- */

export const TOKEN_SCOPES = ['read', 'read-write'] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];

/** Longest lifetime a personal token may be given, in days. */
export const TOKEN_MAX_DAYS = 366;

export const createTokenSchema = z
  .object({
    name: safeName(z.string().trim().min(1, 'required').max(80, 'at most 80 characters')),
    scope: z.enum(TOKEN_SCOPES),
    /** Epoch milliseconds or an ISO 8601 date/time; omitted or null = never expires. */
    expiresAt: z
      .union([
        z.number().int('must be whole milliseconds'),
        z
          .string()
          .trim()
          .refine((s) => !Number.isNaN(Date.parse(s)), 'must be an ISO 8601 date or date-time'),
      ])
      .nullable()
      .optional()
      .transform((v) => (v === undefined || v === null ? null : typeof v === 'number' ? v : Date.parse(v))),
  })
  .strict();
export type CreateTokenRequest = z.input<typeof createTokenSchema>;
export type CreateTokenParsed = z.output<typeof createTokenSchema>;

export interface ApiTokenSummary {
  id: number;
  name: string;
  scope: TokenScope;
  /** The first characters of the secret, to recognise it. */
  prefix: string;
  createdAt: number;
  expiresAt: number | null;
  lastUsedAt: number | null;
  revokedAt: number | null;
}

export interface CreatedApiToken {
  id: number;
  /** The secret: shown in this response only. */
  token: string;
  name: string;
  scope: TokenScope;
  prefix: string;
  createdAt: number;
  expiresAt: number | null;
}

/** GET /api/auth/me: the user with quota and usage. */
export interface MeResponse {
  user: PublicUser;
  via: 'session' | 'token';
  scope: TokenScope;
  quota: Quota;
  usage: QuotaUsage;
}
