import { Module } from '@nestjs/common';
import { AdminModule } from '../admin/admin.module.js';
import { AuditModule } from '../admin/audit.module.js';
import { MailModule } from '../mail/mail.module.js';
import { QuotasModule } from '../quotas/quotas.module.js';
import { TokensModule } from '../tokens/tokens.module.js';
import { AccountsModule } from './accounts.module.js';

/**
 * People management in one registration: mail, audit log, quotas, personal API tokens,
 * invitations and password reset, and the admin console routes (their controllers). Each module that
 * injects one of these services imports its module itself.
 */
@Module({ imports: [MailModule, AuditModule, QuotasModule, TokensModule, AccountsModule, AdminModule] })
export class PeopleModule {}
