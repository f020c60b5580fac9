import { Inject, Injectable } from '@nestjs/common';
import { QUEUE_CONNECTION } from '../queue/queue.module.js';
import type { QueueConnection } from '../queue/queue-connection.js';
import { UsersRepository } from '../users/users.repository.js';
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
  ) {}

  async status() {
    const [counts, paused] = await Promise.all([this.dispatcher.counts(), this.dispatcher.isPaused()]);
    const active = this.sweeps.unfinished().map((s) => ({
      id: s.id,
      name: s.name,
      status: s.status,
      owner: this.users.findById(s.ownerId)?.name ?? 'unknown',
      progress: { done: s.pointsDone, total: s.points },
      createdAt: new Date(s.createdAt).toISOString(),
    }));
    return { mode: this.conn.mode, paused, counts, sweeps: active };
  }

  async pause() {
    await this.dispatcher.pause();
    return this.status();
  }

  async resume() {
    await this.dispatcher.resume();
    return this.status();
  }
}
