import { MailModule } from '../mail/mail.module.js';
import { Module } from '@nestjs/common';
import { ClockModule } from '../common/clock.js';
import { UsersModule } from '../users/users.module.js';
import { AdminUsersController } from './admin-users.controller.js';
import { AdminUsersService } from './admin-users.service.js';
import { AuditController } from './audit.controller.js';
import { AuditModule } from './audit.module.js';
import { MailboxController } from './mailbox.controller.js';

/** Admin console routes: users, audit log, mailbox (quotas live in quotas/, the queue in sweeps). */
@Module({
  imports: [AuditModule, MailModule, UsersModule, ClockModule],
  controllers: [AdminUsersController, AuditController, MailboxController],
  providers: [AdminUsersService],
})
export class AdminModule {}
