import { Inject, Injectable } from '@nestjs/common';
import { count, desc, eq } from 'drizzle-orm';
import type { AuditEntry } from '@driftgrid/domain';
import { DB } from '../db/db.module.js';
import type { Db } from '../db/database.js';
import { auditLog, users } from '../db/schema.js';
import { auditSummary } from './audit-words.js';

@Injectable()
export class AuditRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  insert(row: typeof auditLog.$inferInsert): void {
    this.db.insert(auditLog).values(row).run();
  }

  list(offset: number, limit: number): { items: AuditEntry[]; total: number } {
    const rows = this.db
      .select({ a: auditLog, u: { id: users.id, email: users.email, name: users.name } })
      .from(auditLog)
      .leftJoin(users, eq(users.id, auditLog.actorId))
      .orderBy(desc(auditLog.id))
      .limit(limit)
      .offset(offset)
      .all();
    const total = this.db.select({ n: count() }).from(auditLog).get()?.n ?? 0;
    const items = rows.map(({ a, u }) => {
      const details = a.details ? (JSON.parse(a.details) as Record<string, unknown>) : null;
      return {
        id: a.id,
        actor: u && u.id !== null ? { id: u.id, email: u.email, name: u.name } : null,
        action: a.action,
        summary: auditSummary(a.action, a.target, details),
        target: a.target,
        details,
        createdAt: a.createdAt,
      };
    });
    return { items, total };
  }
}
