import { Global, Module } from '@nestjs/common';
import { AuditRepository } from './audit.repository.js';
import { AuditService } from './audit.service.js';

/** Global so every module with admin actions (accounts, quotas, queue) can record them. */
@Global()
@Module({ providers: [AuditRepository, AuditService], exports: [AuditService] })
export class AuditModule {}
