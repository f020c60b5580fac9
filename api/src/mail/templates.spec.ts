import { describe, expect, it } from 'vitest';
import { escapeHtml, invitationMail, passwordResetMail, renderNotice } from './templates.js';

describe('mail templates', () => {
  it('render text and HTML with the product name and no external images', () => {
    const m = invitationMail({
      inviter: 'Ada <Admin>',
      role: 'researcher',
      url: 'http://localhost:3000/accept-invite?token=abc&x=1',
      expiresInDays: 7,
    });
    expect(m.subject).toContain('Driftgrid');
    expect(m.text).toContain('http://localhost:3000/accept-invite?token=abc&x=1');
    expect(m.text).toContain('7 days');
    expect(m.html).toContain('Driftgrid');
    expect(m.html).toContain('href="http://localhost:3000/accept-invite?token=abc&amp;x=1"');
    expect(m.html).toContain('Ada &lt;Admin&gt;'); // user-supplied text is escaped
    expect(m.html).not.toMatch(/<img|<link|url\(/i);
  });

  it('reset mail states the one-hour lifetime', () => {
    const m = passwordResetMail({ name: 'Rosa', url: 'http://x/reset-password?token=t', expiresInMinutes: 60 });
    expect(m.text).toMatch(/expires in 60 minutes/);
  });

  it('a notice without an action has no button', () => {
    const m = renderNotice({ heading: 'Sweep finished', paragraphs: ['argon column scan completed: 1,550 points'] });
    expect(m.html).not.toContain('<a ');
    expect(m.text).toContain('argon column scan completed');
    expect(escapeHtml(`"'&`)).toBe('&quot;&#39;&amp;');
  });
});
