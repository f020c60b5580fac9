/**
 * The whole SQLite schema (Drizzle). Times are integer milliseconds since the epoch (UTC).
 * Migrations are generated from this file with `npm run db:generate` and committed in drizzle/.
 */
import {
  ACTIVE_STATES,
  FIT_STATUSES,
  ROLE_NAMES,
  SWEEP_STATUSES,
  type RoleName,
  type SweepStatus,
} from '@driftgrid/domain';
import { sql } from 'drizzle-orm';
import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

// Roles, sweep and fit statuses are declared once, in the domain's contracts (shared with the ui).
export const ROLES = ROLE_NAMES;
export type Role = RoleName;

export const users = sqliteTable(
  'users',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: text('role', { enum: ROLES }).notNull(),
    passwordHash: text('password_hash').notNull(),
    active: integer('active', { mode: 'boolean' }).notNull().default(true),
    failedLogins: integer('failed_logins').notNull().default(0),
    lockedUntil: integer('locked_until'),
    /**
     * Time of the last password change or reset (ms). Sessions issued before the session version
     * existed carry no version; those older than this are refused.
     */
    sessionsValidAfter: integer('sessions_valid_after'),
    /** Carried in every session token (`sv`); a password change or reset raises it, ending older sessions. */
    sessionVersion: integer('session_version').notNull().default(0),
    createdAt: integer('created_at').notNull(),
    updatedAt: integer('updated_at').notNull(),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email)],
);

export { SWEEP_STATUSES, type SweepStatus };

export const sweeps = sqliteTable(
  'sweeps',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    ownerId: integer('owner_id')
      .notNull()
      .references(() => users.id),
    name: text('name').notNull(),
    model: text('model').notNull(),
    modelVersion: text('model_version').notNull(),
    appVersion: text('app_version').notNull(),
    status: text('status', { enum: SWEEP_STATUSES }).notNull(),
    /** The definition exactly as submitted (JSON), with its schema version inside. */
    definition: text('definition').notNull(),
    /** Result column layout (JSON): name → slot in the results table, unit, kind, meaning. */
    columns: text('columns').notNull(),
    visibility: text('visibility', { enum: ['private', 'group'] })
      .notNull()
      .default('private'),
    points: integer('points').notNull(),
    pointsDone: integer('points_done').notNull().default(0),
    chunkCount: integer('chunk_count').notNull(),
    invalidPoints: integer('invalid_points').notNull().default(0),
    /** Count of points per flag code (JSON object). */
    flagCounts: text('flag_counts').notNull().default('{}'),
    computeMs: real('compute_ms').notNull().default(0),
    error: text('error'),
    createdAt: integer('created_at').notNull(),
    startedAt: integer('started_at'),
    finishedAt: integer('finished_at'),
    archivedAt: integer('archived_at'),
    archiveSha256: text('archive_sha256'),
    archiveBytes: integer('archive_bytes'),
    archiveFile: text('archive_file'),
    deletedAt: integer('deleted_at'),
  },
  (t) => [
    index('sweeps_owner_idx').on(t.ownerId),
    index('sweeps_status_idx').on(t.status),
    index('sweeps_created_idx').on(t.createdAt),
  ],
);

export const sweepTags = sqliteTable(
  'sweep_tags',
  {
    sweepId: integer('sweep_id')
      .notNull()
      .references(() => sweeps.id, { onDelete: 'cascade' }),
    tag: text('tag').notNull(),
  },
  (t) => [primaryKey({ columns: [t.sweepId, t.tag] }), index('sweep_tags_tag_idx').on(t.tag)],
);

export const sweepShares = sqliteTable(
  'sweep_shares',
  {
    sweepId: integer('sweep_id')
      .notNull()
      .references(() => sweeps.id, { onDelete: 'cascade' }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
  },
  (t) => [primaryKey({ columns: [t.sweepId, t.userId] }), index('sweep_shares_user_idx').on(t.userId)],
);

/** A chunk is active (queued, running) as a sweep is, then settles; these states never leave the api. */
export const CHUNK_STATES = [...ACTIVE_STATES, 'done', 'failed', 'cancelled'] as const;

export const sweepChunks = sqliteTable(
  'sweep_chunks',
  {
    sweepId: integer('sweep_id')
      .notNull()
      .references(() => sweeps.id, { onDelete: 'cascade' }),
    chunkIndex: integer('chunk_index').notNull(),
    i0: integer('i0').notNull(),
    i1: integer('i1').notNull(),
    state: text('state', { enum: CHUNK_STATES }).notNull(),
    attempts: integer('attempts').notNull().default(0),
    workerId: text('worker_id'),
    computeMs: real('compute_ms'),
    error: text('error'),
    updatedAt: integer('updated_at').notNull(),
  },
  (t) => [primaryKey({ columns: [t.sweepId, t.chunkIndex] }), index('sweep_chunks_state_idx').on(t.state)],
);

/** Number of generic REAL slots a results row offers (model inputs + outputs + derived columns). */
export const RESULT_SLOTS = 64;

/**
 * One row per sweep point. The rowid is `sweepId · 2^32 + idx`: rows of a sweep are contiguous
 * (range scans in index order), and re-persisting a chunk is idempotent without a second index.
 * Columns are generic slots c0…c63 mapped per sweep (sweeps.columns), so every model shares one table.
 */
const slotColumns = Object.fromEntries(
  Array.from({ length: RESULT_SLOTS }, (_, i) => [`c${i}`, real(`c${i}`)]),
) as Record<`c${number}`, ReturnType<typeof real>>;

export const results = sqliteTable('results', {
  id: integer('id').primaryKey(),
  flags: integer('flags').notNull(),
  ...slotColumns,
});

export const datasets = sqliteTable(
  'datasets',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    ownerId: integer('owner_id')
      .notNull()
      .references(() => users.id),
    name: text('name').notNull(),
    fileName: text('file_name'),
    /** Column metadata (JSON): [{ name, unit, canonicalUnit, quantity, kind: 'number' | 'text' }]. */
    columns: text('columns').notNull(),
    rows: integer('rows').notNull(),
    visibility: text('visibility', { enum: ['private', 'group'] })
      .notNull()
      .default('private'),
    sha256: text('sha256').notNull(),
    createdAt: integer('created_at').notNull(),
    deletedAt: integer('deleted_at'),
  },
  (t) => [index('datasets_owner_idx').on(t.ownerId)],
);

export const datasetShares = sqliteTable(
  'dataset_shares',
  {
    datasetId: integer('dataset_id')
      .notNull()
      .references(() => datasets.id, { onDelete: 'cascade' }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
  },
  (t) => [primaryKey({ columns: [t.datasetId, t.userId] })],
);

/** Dataset rows; rowid = datasetId · 2^32 + row index; cells as a JSON array in column order. */
export const datasetRows = sqliteTable('dataset_rows', {
  id: integer('id').primaryKey(),
  cells: text('cells').notNull(),
});

export const fits = sqliteTable(
  'fits',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    ownerId: integer('owner_id')
      .notNull()
      .references(() => users.id),
    sourceKind: text('source_kind', { enum: ['sweep', 'dataset'] }).notNull(),
    sourceId: integer('source_id').notNull(),
    model: text('model').notNull(),
    request: text('request').notNull(),
    result: text('result'),
    status: text('status', { enum: FIT_STATUSES }).notNull(),
    progress: real('progress').notNull().default(0),
    error: text('error'),
    appVersion: text('app_version').notNull(),
    sourceModelVersion: text('source_model_version'),
    createdAt: integer('created_at').notNull(),
    finishedAt: integer('finished_at'),
  },
  (t) => [index('fits_source_idx').on(t.sourceKind, t.sourceId), index('fits_owner_idx').on(t.ownerId)],
);

export const roleQuotas = sqliteTable('role_quotas', {
  role: text('role', { enum: ROLES }).primaryKey(),
  maxPointsPerSweep: integer('max_points_per_sweep').notNull(),
  maxRunningSweeps: integer('max_running_sweeps').notNull(),
  maxPointsPer30Days: integer('max_points_per_30_days').notNull(),
  maxStoredPoints: integer('max_stored_points').notNull(),
  updatedAt: integer('updated_at').notNull(),
});

/**
 * Points charged against the rolling 30-day quota, one row per submitted sweep. Deleting or
 * cancelling a sweep leaves its row alone (no foreign key to sweeps), so no refund is possible.
 */
export const quotaLedger = sqliteTable(
  'quota_ledger',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    /** The sweep charged for; it may since have been deleted. */
    sweepId: integer('sweep_id'),
    points: integer('points').notNull(),
    chargedAt: integer('charged_at').notNull(),
  },
  (t) => [index('quota_ledger_user_time_idx').on(t.userId, t.chargedAt)],
);

/** Per-user overrides; a NULL field falls back to the role default. */
export const userQuotas = sqliteTable('user_quotas', {
  userId: integer('user_id')
    .primaryKey()
    .references(() => users.id),
  maxPointsPerSweep: integer('max_points_per_sweep'),
  maxRunningSweeps: integer('max_running_sweeps'),
  maxPointsPer30Days: integer('max_points_per_30_days'),
  maxStoredPoints: integer('max_stored_points'),
  updatedAt: integer('updated_at').notNull(),
});

export const apiTokens = sqliteTable(
  'api_tokens',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    name: text('name').notNull(),
    scope: text('scope', { enum: ['read', 'read-write'] }).notNull(),
    /** SHA-256 of the secret; the secret itself is shown once and never stored. */
    tokenHash: text('token_hash').notNull(),
    prefix: text('prefix').notNull(),
    createdAt: integer('created_at').notNull(),
    expiresAt: integer('expires_at'),
    lastUsedAt: integer('last_used_at'),
    revokedAt: integer('revoked_at'),
  },
  (t) => [uniqueIndex('api_tokens_hash_unique').on(t.tokenHash), index('api_tokens_user_idx').on(t.userId)],
);

export const invitations = sqliteTable(
  'invitations',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    email: text('email').notNull(),
    role: text('role', { enum: ROLES }).notNull(),
    tokenHash: text('token_hash').notNull(),
    invitedBy: integer('invited_by')
      .notNull()
      .references(() => users.id),
    createdAt: integer('created_at').notNull(),
    expiresAt: integer('expires_at').notNull(),
    acceptedAt: integer('accepted_at'),
    revokedAt: integer('revoked_at'),
  },
  (t) => [uniqueIndex('invitations_hash_unique').on(t.tokenHash)],
);

export const passwordResets = sqliteTable(
  'password_resets',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id),
    tokenHash: text('token_hash').notNull(),
    createdAt: integer('created_at').notNull(),
    expiresAt: integer('expires_at').notNull(),
    usedAt: integer('used_at'),
  },
  (t) => [uniqueIndex('password_resets_hash_unique').on(t.tokenHash)],
);

export const mailMessages = sqliteTable('mail_messages', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  messageId: text('message_id'),
  from: text('from').notNull(),
  to: text('to').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  html: text('html'),
  receivedAt: integer('received_at').notNull(),
});

export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    actorId: integer('actor_id').references(() => users.id),
    action: text('action').notNull(),
    target: text('target'),
    details: text('details'),
    createdAt: integer('created_at')
      .notNull()
      .default(sql`(unixepoch() * 1000)`),
  },
  (t) => [index('audit_created_idx').on(t.createdAt)],
);
