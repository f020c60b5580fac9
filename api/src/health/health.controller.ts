import { Controller, Get, Optional } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/access.decorators.js';
import { HealthRepository } from './health.repository.js';

/** Anything that can report the queue's state for /api/health (the queue module provides one). */
export abstract class QueueProbe {
  abstract probe(): Promise<{ status: 'ok' | 'down'; mode: string }>;
}

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(
    private readonly database: HealthRepository,
    @Optional() private readonly queue?: QueueProbe,
  ) {}

  @Get()
  @Public()
  @ApiOperation({ summary: 'Liveness of the api, the database and the queue' })
  async health() {
    let db: 'ok' | 'down' = 'ok';
    try {
      this.database.answer();
    } catch {
      db = 'down';
    }
    const queue = this.queue
      ? await this.queue.probe().catch(() => ({ status: 'down' as const, mode: 'unknown' }))
      : { status: 'ok' as const, mode: 'none' };
    return { status: db === 'ok' && queue.status === 'ok' ? 'ok' : 'degraded', db, queue };
  }
}
