import { Module } from '@nestjs/common';
import { AuditModule } from '../admin/audit.module.js';
import { ClockModule } from '../common/clock.js';
import { MailModule } from '../mail/mail.module.js';
import { QueueModule } from '../queue/queue.module.js';
import { QuotasModule } from '../quotas/quotas.module.js';
import { ReadsModule } from '../reads/reads.module.js';
import { UsersModule } from '../users/users.module.js';
import { ChunkDispatcher } from './chunk-dispatcher.js';
import { ChunksRepository } from './chunks.repository.js';
import { QuotasService } from '../quotas/quotas.service.js';
import { MailSweepNotifier } from './mail-sweep-notifier.js';
import { QuotaGate, SweepNotifier } from './ports.js';
import { ResultsProcessor } from './results.processor.js';
import { ResultsReader } from './results-reader.js';
import { ResultsWriter } from './results-writer.repository.js';
import { SweepAccess } from './sweep-access.js';
import { SweepPersistence } from './sweep-persistence.service.js';
import { SweepsController } from './sweeps.controller.js';
import { QueueAdminController } from './queue-admin.controller.js';
import { QueueAdminService } from './queue-admin.service.js';
import { SweepsRepository } from './sweeps.repository.js';
import { SweepsService } from './sweeps.service.js';

@Module({
  // QueueModule brings both queues, the connection (queue controls) and the result transport.
  imports: [QueueModule, AuditModule, MailModule, QuotasModule, UsersModule, ClockModule, ReadsModule],
  controllers: [SweepsController, QueueAdminController],
  providers: [
    SweepsRepository,
    SweepsService,
    SweepAccess,
    SweepPersistence,
    ChunksRepository,
    ResultsWriter,
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
