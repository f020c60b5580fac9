import { Module } from '@nestjs/common';
import { AuditModule } from '../admin/audit.module.js';
import { ClockModule } from '../common/clock.js';
import { UsersModule } from '../users/users.module.js';
import { QuotaAccountFacts } from './quota-account-facts.js';
import { QuotasController } from './quotas.controller.js';
import { QuotasRepository } from './quotas.repository.js';
import { QuotasService } from './quotas.service.js';

/** Quotas; imported by sweeps (QuotasService as the QuotaGate) and auth (QuotaAccountFacts for /me). */
@Module({
  imports: [AuditModule, UsersModule, ClockModule],
  controllers: [QuotasController],
  providers: [QuotasRepository, QuotasService, QuotaAccountFacts],
  exports: [QuotasService, QuotaAccountFacts],
})
export class QuotasModule {}
