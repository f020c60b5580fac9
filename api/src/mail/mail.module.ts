import { Global, Module } from '@nestjs/common';
import { MailRepository } from './mail.repository.js';
import { Mailer } from './mailer.js';
import { MailService } from './mail.service.js';

/** Global: any module may inject MailService (or the Mailer port) to send a notice. */
@Global()
@Module({
  providers: [MailRepository, MailService, { provide: Mailer, useExisting: MailService }],
  exports: [MailService, Mailer, MailRepository],
})
export class MailModule {}
