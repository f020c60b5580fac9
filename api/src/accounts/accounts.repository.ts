import { Inject, Injectable } from '@nestjs/common';
import { and, count, desc, eq, isNull } from 'drizzle-orm';
import { DB } from '../db/db.module.js';
import type { Db } from '../db/database.js';
import { invitations, passwordResets, users } from '../db/schema.js';

export type InvitationRow = typeof invitations.$inferSelect;
export type PasswordResetRow = typeof passwordResets.$inferSelect;

/** SQL for invitations and password resets. */
@Injectable()
export class AccountsRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  insertInvitation(row: typeof invitations.$inferInsert): InvitationRow {
    return this.db.insert(invitations).values(row).returning().get();
  }

  invitationByHash(hash: string): InvitationRow | undefined {
    return this.db.select().from(invitations).where(eq(invitations.tokenHash, hash)).get();
  }

  invitationById(id: number): InvitationRow | undefined {
    return this.db.select().from(invitations).where(eq(invitations.id, id)).get();
  }

  listInvitations(offset: number, limit: number) {
    const items = this.db
      .select({ inv: invitations, by: { id: users.id, email: users.email, name: users.name } })
      .from(invitations)
      .leftJoin(users, eq(users.id, invitations.invitedBy))
      .orderBy(desc(invitations.id))
      .limit(limit)
      .offset(offset)
      .all();
    const total = this.db.select({ n: count() }).from(invitations).get()?.n ?? 0;
    return { items, total };
  }

  /** Revokes the open invitations of an address (a new invitation replaces them). */
  revokeOpenInvitations(email: string, now: number): void {
    this.db
      .update(invitations)
      .set({ revokedAt: now })
      .where(and(eq(invitations.email, email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      .run();
  }

  markInvitation(id: number, patch: Partial<Pick<InvitationRow, 'acceptedAt' | 'revokedAt'>>): void {
    this.db.update(invitations).set(patch).where(eq(invitations.id, id)).run();
  }

  insertReset(row: typeof passwordResets.$inferInsert): PasswordResetRow {
    return this.db.insert(passwordResets).values(row).returning().get();
  }

  resetByHash(hash: string): PasswordResetRow | undefined {
    return this.db.select().from(passwordResets).where(eq(passwordResets.tokenHash, hash)).get();
  }

  /** Marks every unused reset of a user used: a successful reset voids the other links. */
  useResets(userId: number, now: number): void {
    this.db
      .update(passwordResets)
      .set({ usedAt: now })
      .where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt)))
      .run();
  }
}
