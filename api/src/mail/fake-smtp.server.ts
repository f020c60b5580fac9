import { Logger } from '@nestjs/common';
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { Clock } from '../common/clock.js';
import type { MailRepository } from './mail.repository.js';

/** Largest message the fake accepts; our templates are a few kB. */
const MAX_BYTES = 2 * 1024 * 1024;

function addresses(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

/**
 * An in-process SMTP server on a loopback ephemeral port, used when no SMTP_URL is configured.
 * Every message is really sent over SMTP, parsed with mailparser and stored for the admin mailbox.
 * The DATA reply is sent only after the row is stored, so a resolved send means a readable message.
 */
export class FakeSmtpServer {
  private readonly logger = new Logger('FakeSmtp');
  private server: SMTPServer | null = null;
  private port = 0;

  constructor(
    private readonly repo: MailRepository,
    private readonly clock: Clock,
  ) {}

  async start(): Promise<number> {
    const server = new SMTPServer({
      secure: false,
      authOptional: true,
      disabledCommands: ['AUTH', 'STARTTLS'],
      size: MAX_BYTES,
      logger: false,
      banner: 'Driftgrid local mailbox',
      onData: (stream, session, callback) => {
        simpleParser(stream)
          .then((parsed) => {
            const envelopeTo = session.envelope.rcptTo.map((r) => r.address).join(', ');
            this.repo.insert({
              messageId: parsed.messageId ?? null,
              from: addresses(parsed.from) || (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
              to: addresses(parsed.to) || envelopeTo,
              subject: parsed.subject ?? '',
              text: parsed.text ?? '',
              html: typeof parsed.html === 'string' ? parsed.html : null,
              receivedAt: this.clock.now(),
            });
            callback();
          })
          .catch((err: Error) => {
            this.logger.error(`Could not store a message: ${err.message}`);
            callback(err);
          });
      },
    });
    server.on('error', (err) => this.logger.error(`SMTP server error: ${err.message}`));
    await new Promise<void>((resolve, reject) => {
      const net = server.listen(0, '127.0.0.1', () => resolve());
      net.once('error', reject);
    });
    this.server = server;
    this.port = (server.server.address() as AddressInfo).port;
    return this.port;
  }

  get listeningPort(): number {
    return this.port;
  }

  async stop(): Promise<void> {
    const server = this.server;
    this.server = null;
    if (!server) return;
    await new Promise<void>((resolve) => server.close(() => resolve()));
  }
}
