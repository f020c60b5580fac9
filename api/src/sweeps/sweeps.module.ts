import { MailModule } from '../mail/mail.module.js';
import { BullModule } from '@nestjs/bullmq';
import { Module } from '@nestjs/common';
import { CHUNK_QUEUE, RESULT_QUEUE } from '@driftgrid/worker';
import { AuditModule } from '../admin/audit.module.js';
import { ChunkDispatcher } from './chunk-dispatcher.js';
import { QuotasService } from '../quotas/quotas.service.js';
import { MailSweepNotifier } from './mail-sweep-notifier.js';
import { QuotaGate, SweepNotifier } from './ports.js';
import { ResultsProcessor } from './results.processor.js';
import { ResultsReader } from './results-reader.js';
import { SweepAccess } from './sweep-access.js';
import { SweepPersistence } from './sweep-persistence.service.js';
import { SweepsController } from './sweeps.controller.js';
import { QueueAdminController } from './queue-admin.controller.js';
import { QueueAdminService } from './queue-admin.service.js';
import { SweepsRepository } from './sweeps.repository.js';
import { SweepsService } from './sweeps.service.js';

@Module({
  imports: [BullModule.registerQueue({ name: CHUNK_QUEUE }, { name: RESULT_QUEUE }), AuditModule, MailModule],
  controllers: [SweepsController, QueueAdminController],
  providers: [
    SweepsRepository,
    SweepsService,
    SweepAccess,
    SweepPersistence,
    ChunkDispatcher,
    ResultsProcessor,
    ResultsReader,
    QueueAdminService,
    { provide: SweepNotifier, useClass: MailSweepNotifier },
    // QuotasService has exactly the QuotaGate shape (synchronous verdict and assert).
    { provide: QuotaGate, useExisting: QuotasService },
  ],
  exports: [SweepsRepository, SweepsService, SweepAccess, ChunkDispatcher, ResultsReader, SweepPersistence],
})
export class SweepsModule {}
