import { Inject, Injectable } from '@nestjs/common';
import { AuditService } from '../admin/audit.service.js';
import { QUEUE_CONNECTION } from '../queue/queue.module.js';
import type { QueueConnection } from '../queue/queue-connection.js';
import { UsersRepository } from '../users/users.repository.js';
import type { ActiveState, QueueSummary } from '@driftgrid/domain';
import { queueSummary } from '../queue/queue-summary.js';
import { ChunkDispatcher } from './chunk-dispatcher.js';
import { SweepsRepository } from './sweeps.repository.js';

/** The admin's view of the queue; cancelling any sweep goes through POST /api/sweeps/:id/cancel. */
@Injectable()
export class QueueAdminService {
  constructor(
    private readonly dispatcher: ChunkDispatcher,
    private readonly sweeps: SweepsRepository,
    private readonly users: UsersRepository,
    @Inject(QUEUE_CONNECTION) private readonly conn: QueueConnection,
    private readonly audit: AuditService,
  ) {}

  async status(): Promise<QueueSummary> {
    const [library, paused] = await Promise.all([this.dispatcher.counts(), this.dispatcher.isPaused()]);
    const sweeps = this.sweeps.unfinished().map((s) => ({
      id: s.id,
      name: s.name,
      status: s.status as ActiveState,
      owner: this.users.findById(s.ownerId)?.name ?? 'unknown',
      progress: { done: s.pointsDone, total: s.points },
      createdAt: new Date(s.createdAt).toISOString(),
    }));
    return queueSummary({ mode: this.conn.mode, paused, library, stored: this.sweeps.chunkStateCounts(), sweeps });
  }

  async pause(actorId: number) {
    await this.dispatcher.pause();
    this.audit.record(actorId, 'queue.pause');
    return this.status();
  }

  async resume(actorId: number) {
    await this.dispatcher.resume();
    this.audit.record(actorId, 'queue.resume');
    return this.status();
  }
}
