import { Global, Module } from '@nestjs/common';
import { AuditModule } from '../admin/audit.module.js';
import { QuotaAccountFacts } from './quota-account-facts.js';
import { QuotasController } from './quotas.controller.js';
import { QuotasRepository } from './quotas.repository.js';
import { QuotasService } from './quotas.service.js';

/** Global: the sweeps module injects QuotasService for preview and submit checks. */
@Global()
@Module({
  imports: [AuditModule],
  controllers: [QuotasController],
  providers: [QuotasRepository, QuotasService, QuotaAccountFacts],
  exports: [QuotasService, QuotaAccountFacts],
})
export class QuotasModule {}
