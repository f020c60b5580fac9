import { Controller, Get } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/access.decorators.js';
import { HeavyReads } from '../reads/heavy-reads.js';
import { HealthRepository } from './health.repository.js';
import { QueueProbe } from './queue-probe.js';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(
    private readonly database: HealthRepository,
    // Required: HealthModule imports QueueModule, so a lost import fails at boot, not as a silent 'ok'.
    private readonly queue: QueueProbe,
    private readonly reads: HeavyReads,
  ) {}

  @Get()
  @Public()
  @ApiOperation({
    summary: 'Liveness of the api, the database and the queue; how many read-pool threads have loaded',
  })
  async health() {
    let db: 'ok' | 'down' = 'ok';
    try {
      this.database.answer();
    } catch {
      db = 'down';
    }
    const queue = await this.queue.probe().catch(() => ({ status: 'down' as const, mode: 'unknown' }));
    // Read threads still loading after a start are not a fault: heavy reads wait for them meanwhile.
    const reads = this.reads.readiness;
    return { status: db === 'ok' && queue.status === 'ok' ? 'ok' : 'degraded', db, queue, reads };
  }
}
