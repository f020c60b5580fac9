import { Inject, Injectable } from '@nestjs/common';
import { asc, count, eq, like, or, and, type SQL } from 'drizzle-orm';
import { DB } from '../db/db.module.js';
import type { Db } from '../db/database.js';
import { users, type Role } from '../db/schema.js';

export type UserRow = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;

@Injectable()
export class UsersRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  findById(id: number): UserRow | undefined {
    return this.db.select().from(users).where(eq(users.id, id)).get();
  }

  findByEmail(email: string): UserRow | undefined {
    return this.db.select().from(users).where(eq(users.email, email.toLowerCase())).get();
  }

  insert(user: NewUser): UserRow {
    return this.db
      .insert(users)
      .values({ ...user, email: user.email.toLowerCase() })
      .returning()
      .get();
  }

  update(id: number, patch: Partial<NewUser>): UserRow | undefined {
    return this.db.update(users).set(patch).where(eq(users.id, id)).returning().get();
  }

  count(): number {
    return this.db.select({ n: count() }).from(users).get()?.n ?? 0;
  }

  countActiveAdmins(): number {
    return (
      this.db
        .select({ n: count() })
        .from(users)
        .where(and(eq(users.role, 'admin'), eq(users.active, true)))
        .get()?.n ?? 0
    );
  }

  list(opts: { q?: string; role?: Role; offset: number; limit: number }): { items: UserRow[]; total: number } {
    const where: SQL[] = [];
    if (opts.q) {
      const pattern = `%${opts.q.replace(/[%_\\]/g, (c) => '\\' + c)}%`;
      where.push(or(like(users.email, pattern), like(users.name, pattern))!);
    }
    if (opts.role) where.push(eq(users.role, opts.role));
    const cond = where.length ? and(...where) : undefined;
    const items = this.db
      .select()
      .from(users)
      .where(cond)
      .orderBy(asc(users.id))
      .limit(opts.limit)
      .offset(opts.offset)
      .all();
    const total = this.db.select({ n: count() }).from(users).where(cond).get()?.n ?? 0;
    return { items, total };
  }
}
