import { Injectable } from '@nestjs/common';
import type { PageOf, AuditEntry, PageQuery } from '@driftgrid/domain';
import { Clock } from '../common/clock.js';
import { AuditRepository } from './audit.repository.js';

/**
 * The audit log of admin actions (who, what, when). Other modules call `record` for every admin
 * action: `audit.record(actor.id, 'queue.pause')`, `audit.record(actor.id, 'sweep.cancel', 'sweep:42')`.
 */
@Injectable()
export class AuditService {
  constructor(
    private readonly repo: AuditRepository,
    private readonly clock: Clock,
  ) {}

  /** Synchronous, so it can sit inside the same transaction as the change it records. */
  record(actorId: number | null, action: string, target?: string | null, details?: Record<string, unknown>): void {
    this.repo.insert({
      actorId,
      action,
      target: target ?? null,
      details: details ? JSON.stringify(details) : null,
      createdAt: this.clock.now(),
    });
  }

  list(q: PageQuery): PageOf<AuditEntry> {
    const { items, total } = this.repo.list((q.page - 1) * q.pageSize, q.pageSize);
    return { items, total, page: q.page, pageSize: q.pageSize };
  }
}
