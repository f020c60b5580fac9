import { MailModule } from '../mail/mail.module.js';
import { TokensModule } from '../tokens/tokens.module.js';
import { Module } from '@nestjs/common';
import { AuditModule } from '../admin/audit.module.js';
import { AuthModule } from '../auth/auth.module.js';
import { ClockModule } from '../common/clock.js';
import { UsersModule } from '../users/users.module.js';
import { AccountsAuthController } from './accounts-auth.controller.js';
import { AccountsRepository } from './accounts.repository.js';
import { InvitationsController } from './invitations.controller.js';
import { InvitationsService } from './invitations.service.js';
import { LoginThrottleGuard, LoginThrottlerModule } from './login-throttle.js';
import { PasswordChangeService } from './password-change.service.js';

/** Invitations, password reset and change of password. */
@Module({
  imports: [AuthModule, AuditModule, LoginThrottlerModule, TokensModule, MailModule, UsersModule, ClockModule],
  controllers: [AccountsAuthController, InvitationsController],
  providers: [AccountsRepository, InvitationsService, PasswordChangeService, LoginThrottleGuard],
  exports: [PasswordChangeService],
})
export class AccountsModule {}
