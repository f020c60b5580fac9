import { Module } from '@nestjs/common';
import { QueueModule } from '../queue/queue.module.js';
import { ReadsModule } from '../reads/reads.module.js';
import { HealthController } from './health.controller.js';
import { HealthRepository } from './health.repository.js';

@Module({ imports: [QueueModule, ReadsModule], controllers: [HealthController], providers: [HealthRepository] })
export class HealthModule {}
