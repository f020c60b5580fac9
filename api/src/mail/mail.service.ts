import { Inject, Injectable, Logger, type OnApplicationShutdown, type OnModuleInit } from '@nestjs/common';
import { Clock } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { FakeSmtpServer } from './fake-smtp.server.js';
import { MailRepository } from './mail.repository.js';
import { Mailer, type OutgoingMail, type SentMail } from './mailer.js';
import { NodemailerMailer } from './nodemailer.mailer.js';
import { renderNotice, type Notice } from './templates.js';

/**
 * The one place that sends mail. With SMTP_URL it talks to that relay; without, it starts the
 * in-process fake SMTP server at module init (loopback, ephemeral port) and sends to it for real.
 */
@Injectable()
export class MailService extends Mailer implements OnModuleInit, OnApplicationShutdown {
  private readonly logger = new Logger('Mail');
  private mailer: NodemailerMailer | null = null;
  private fake: FakeSmtpServer | null = null;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly repo: MailRepository,
    private readonly clock: Clock,
  ) {
    super();
  }

  async onModuleInit(): Promise<void> {
    if (this.config.smtpUrl) {
      this.mailer = NodemailerMailer.forUrl(this.config.smtpUrl, this.config.mailFrom);
      return;
    }
    this.fake = new FakeSmtpServer(this.repo, this.clock);
    const port = await this.fake.start();
    this.mailer = NodemailerMailer.forLoopback(port, this.config.mailFrom);
    this.logger.log(`No SMTP_URL: mail goes to the built-in mailbox (loopback port ${port}; admins read it at /admin)`);
  }

  async onApplicationShutdown(): Promise<void> {
    this.mailer?.close();
    this.mailer = null;
    await this.fake?.stop();
    this.fake = null;
  }

  /** True when messages land in the built-in mailbox rather than a real relay. */
  get usesBuiltInMailbox(): boolean {
    return this.fake !== null;
  }

  /** Sends one message (text and, optionally, HTML). Rejects when the relay refuses it. */
  async send(mail: OutgoingMail): Promise<SentMail> {
    if (!this.mailer) throw new Error('Mail is not started yet');
    return this.mailer.send(mail);
  }

  /** Renders a notice with the standard template and sends it. */
  notify(to: string, subject: string, notice: Notice): Promise<SentMail> {
    return this.send({ to, subject, ...renderNotice(notice) });
  }

  /** Like send, but never rejects: failures are logged. For mails nobody waits for. */
  sendInBackground(mail: OutgoingMail): Promise<boolean> {
    return this.send(mail).then(
      () => true,
      (err: Error) => {
        this.logger.error(`Could not send "${mail.subject}": ${err.message}`);
        return false;
      },
    );
  }
}
