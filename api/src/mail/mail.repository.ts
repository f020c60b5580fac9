import { Inject, Injectable } from '@nestjs/common';
import { count, desc, eq } from 'drizzle-orm';
import type { MailMessage, MailSummary } from '@driftgrid/domain';
import { DB } from '../db/db.module.js';
import type { Db } from '../db/database.js';
import { mailMessages } from '../db/schema.js';

export type NewMail = typeof mailMessages.$inferInsert;

/** SQL for the fake mailbox (messages the in-process SMTP server received). */
@Injectable()
export class MailRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  insert(mail: NewMail): number {
    return this.db.insert(mailMessages).values(mail).returning({ id: mailMessages.id }).get().id;
  }

  list(offset: number, limit: number): { items: MailSummary[]; total: number } {
    const items = this.db
      .select({
        id: mailMessages.id,
        from: mailMessages.from,
        to: mailMessages.to,
        subject: mailMessages.subject,
        receivedAt: mailMessages.receivedAt,
      })
      .from(mailMessages)
      .orderBy(desc(mailMessages.id))
      .limit(limit)
      .offset(offset)
      .all();
    const total = this.db.select({ n: count() }).from(mailMessages).get()?.n ?? 0;
    return { items, total };
  }

  get(id: number): MailMessage | undefined {
    return this.db.select().from(mailMessages).where(eq(mailMessages.id, id)).get();
  }
}
