import { Inject, Injectable } from '@nestjs/common';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { MailService } from '../mail/mail.service.js';
import { renderNotice } from '../mail/templates.js';
import { UsersRepository } from '../users/users.repository.js';
import { SweepNotifier } from './ports.js';

/** E-mails the owner when a sweep completes or fails; a mail failure never affects the sweep. */
@Injectable()
export class MailSweepNotifier extends SweepNotifier {
  constructor(
    private readonly mail: MailService,
    private readonly users: UsersRepository,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {
    super();
  }

  async sweepFinished(e: {
    sweepId: number;
    ownerId: number;
    name: string;
    status: 'completed' | 'failed';
    error?: string | null;
  }): Promise<void> {
    const owner = this.users.findById(e.ownerId);
    if (!owner) return;
    const done = e.status === 'completed';
    const { text, html } = renderNotice({
      heading: done ? `Your sweep "${e.name}" completed` : `Your sweep "${e.name}" failed`,
      paragraphs: done
        ? ['Every point is stored. The sweep page has the results, plots, validity flags and export.']
        : [
            `It stopped with: ${e.error ?? 'an unknown error'}.`,
            'The sweep page keeps the points stored so far and the failure reason.',
          ],
      action: { label: 'Open the sweep', url: `${this.config.publicUrl}/sweeps/${e.sweepId}` },
    });
    await this.mail.sendInBackground({
      to: owner.email,
      subject: done ? `Sweep completed: ${e.name}` : `Sweep failed: ${e.name}`,
      text,
      html,
    });
  }
}
