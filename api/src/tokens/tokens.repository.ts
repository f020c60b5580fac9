import { Inject, Injectable } from '@nestjs/common';
import { and, count, desc, eq, gt, isNull, or } from 'drizzle-orm';
import { DB } from '../db/db.module.js';
import type { Db } from '../db/database.js';
import { apiTokens, users } from '../db/schema.js';

export type TokenRow = typeof apiTokens.$inferSelect;
export type UserRowForToken = typeof users.$inferSelect;

@Injectable()
export class TokensRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  insert(row: typeof apiTokens.$inferInsert): TokenRow {
    return this.db.insert(apiTokens).values(row).returning().get();
  }

  listForUser(userId: number, offset: number, limit: number): { items: TokenRow[]; total: number } {
    const where = eq(apiTokens.userId, userId);
    const items = this.db
      .select()
      .from(apiTokens)
      .where(where)
      .orderBy(desc(apiTokens.id))
      .limit(limit)
      .offset(offset)
      .all();
    const total = this.db.select({ n: count() }).from(apiTokens).where(where).get()?.n ?? 0;
    return { items, total };
  }

  countUnrevoked(userId: number): number {
    return (
      this.db
        .select({ n: count() })
        .from(apiTokens)
        .where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
        .get()?.n ?? 0
    );
  }

  findForUser(id: number, userId: number): TokenRow | undefined {
    return this.db
      .select()
      .from(apiTokens)
      .where(and(eq(apiTokens.id, id), eq(apiTokens.userId, userId)))
      .get();
  }

  /** The token and its owner by the secret's hash, in one query (hot path: every token request). */
  findByHash(hash: string): { token: TokenRow; user: UserRowForToken } | undefined {
    return this.db
      .select({ token: apiTokens, user: users })
      .from(apiTokens)
      .innerJoin(users, eq(users.id, apiTokens.userId))
      .where(eq(apiTokens.tokenHash, hash))
      .get();
  }

  /** Tokens that still open the api: not revoked and not expired. */
  countActive(userId: number, now: number): number {
    return (
      this.db
        .select({ n: count() })
        .from(apiTokens)
        .where(
          and(
            eq(apiTokens.userId, userId),
            isNull(apiTokens.revokedAt),
            or(isNull(apiTokens.expiresAt), gt(apiTokens.expiresAt, now)),
          ),
        )
        .get()?.n ?? 0
    );
  }

  /** Revokes every unrevoked token of the user; returns how many were still active (unexpired). */
  revokeAllForUser(userId: number, now: number): number {
    const active = this.countActive(userId, now);
    this.db
      .update(apiTokens)
      .set({ revokedAt: now })
      .where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
      .run();
    return active;
  }

  revoke(id: number, now: number): void {
    this.db.update(apiTokens).set({ revokedAt: now }).where(eq(apiTokens.id, id)).run();
  }

  touch(id: number, now: number): void {
    this.db.update(apiTokens).set({ lastUsedAt: now }).where(eq(apiTokens.id, id)).run();
  }
}
