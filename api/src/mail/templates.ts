/**
 * Mail templates: every message in plain text and in simple inline-styled HTML, with the product
 * name and no external images or stylesheets (many mail clients block them).
 */
export const PRODUCT = 'Driftgrid';

export interface Notice {
  /** First line of the message body, e.g. "Your sweep finished". */
  heading: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  /** Small print under the action (expiry, why the reader got this). */
  footnote?: string;
}

export interface RenderedMail {
  text: string;
  html: string;
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export function renderNotice(n: Notice): RenderedMail {
  const text = [
    n.heading,
    '',
    ...n.paragraphs.flatMap((p) => [p, '']),
    ...(n.action ? [`${n.action.label}:`, n.action.url, ''] : []),
    ...(n.footnote ? [n.footnote, ''] : []),
    `— ${PRODUCT}`,
  ].join('\n');
  const para = (p: string) => `<p style="margin:0 0 12px 0;line-height:1.5">${escapeHtml(p)}</p>`;
  const button = n.action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(n.action.url)}" style="background:#1f5f8b;color:#ffffff;padding:10px 18px;border-radius:4px;text-decoration:none;display:inline-block">${escapeHtml(n.action.label)}</a></p>` +
      `<p style="margin:0 0 12px 0;font-size:13px;color:#555555">Or paste this address into your browser:<br><span style="word-break:break-all">${escapeHtml(n.action.url)}</span></p>`
    : '';
  const foot = n.footnote
    ? `<p style="margin:16px 0 0 0;font-size:13px;color:#555555">${escapeHtml(n.footnote)}</p>`
    : '';
  const html = `<!doctype html><html><body style="margin:0;padding:24px;background:#f4f6f8;font-family:Arial,Helvetica,sans-serif;color:#1b1f23">
<div style="max-width:560px;margin:0 auto;background:#ffffff;border:1px solid #d8dee4;border-radius:6px;padding:24px">
<div style="font-size:18px;font-weight:bold;letter-spacing:0.5px;color:#1f5f8b;margin-bottom:16px">${PRODUCT}</div>
<h1 style="font-size:20px;margin:0 0 16px 0">${escapeHtml(n.heading)}</h1>
${n.paragraphs.map(para).join('\n')}
${button}
${foot}
</div></body></html>`;
  return { text, html };
}

export function invitationMail(opts: {
  inviter: string;
  role: string;
  url: string;
  expiresInDays: number;
}): RenderedMail & { subject: string } {
  return {
    subject: `You are invited to ${PRODUCT}`,
    ...renderNotice({
      heading: `You are invited to ${PRODUCT}`,
      paragraphs: [
        `${opts.inviter} has invited you to join ${PRODUCT}, the group's server for plasma parameter sweeps, results and fits, with the role ${opts.role}.`,
        'Open the link to choose your name and password; you will be signed in straight away.',
      ],
      action: { label: 'Accept the invitation', url: opts.url },
      footnote: `The link works once and expires in ${opts.expiresInDays} days. If you did not expect this invitation, ignore this message.`,
    }),
  };
}

export function passwordResetMail(opts: {
  name: string;
  url: string;
  expiresInMinutes: number;
}): RenderedMail & { subject: string } {
  return {
    subject: `Reset your ${PRODUCT} password`,
    ...renderNotice({
      heading: 'Reset your password',
      paragraphs: [
        `Hello ${opts.name},`,
        `someone (hopefully you) asked to reset the password of your ${PRODUCT} account.`,
      ],
      action: { label: 'Choose a new password', url: opts.url },
      footnote: `The link works once and expires in ${opts.expiresInMinutes} minutes. Choosing a new password with it also revokes all your personal API tokens (scripts using them must get new ones), in case someone else had them. If you did not ask for this, ignore this message: your password and tokens stay as they are.`,
    }),
  };
}
