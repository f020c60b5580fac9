import { Module } from '@nestjs/common';
import { MailRepository } from './mail.repository.js';
import { Mailer } from './mailer.js';
import { MailService } from './mail.service.js';

/** Outgoing mail and the stored mailbox; modules that send a notice or show the mailbox import it. */
@Module({
  providers: [MailRepository, MailService, { provide: Mailer, useExisting: MailService }],
  exports: [MailService, Mailer, MailRepository],
})
export class MailModule {}
