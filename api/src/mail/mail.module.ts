import { Module } from '@nestjs/common';
import { ClockModule } from '../common/clock.js';
import { MailRepository } from './mail.repository.js';
import { Mailer } from './mailer.js';
import { MailService } from './mail.service.js';

/** Outgoing mail and the stored mailbox; modules that send a notice or show the mailbox import it. */
@Module({
  imports: [ClockModule],
  providers: [MailRepository, MailService, { provide: Mailer, useExisting: MailService }],
  exports: [MailService, Mailer, MailRepository],
})
export class MailModule {}
