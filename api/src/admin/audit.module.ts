import { Module } from '@nestjs/common';
import { ClockModule } from '../common/clock.js';
import { AuditRepository } from './audit.repository.js';
import { AuditService } from './audit.service.js';

/** The audit log; modules with admin actions (accounts, admin, quotas, sweeps' queue controls) import it. */
@Module({ imports: [ClockModule], providers: [AuditRepository, AuditService], exports: [AuditService] })
export class AuditModule {}
