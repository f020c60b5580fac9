/**
 * The account forms on @mantine/form with the domain's zod schemas (issue 16 §5): each error sits beside its
 * field (linked through aria-describedby), none shows before anything is typed, and a form with problems sends
 * nothing. Covers the invitation, token, reset-password and accept-invitation forms in a real browser; sign-in
 * and the password change have their own files.
 */
import type { Locator, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';

const run = chromiumAvailable();

/** The text of the error Mantine links to this input. */
async function errorOf(page: Page, input: Locator): Promise<string> {
  const ids = ((await input.getAttribute('aria-describedby')) ?? '').split(/\s+/).filter(Boolean);
  const texts = await Promise.all(ids.map((id) => page.locator(`[id="${id}"]`).textContent()));
  return texts.filter((t) => t && !/characters\.$|At least/.test(t)).join(' ');
}

describe.runIf(run)('account forms check input with the domain schemas', () => {
  const { server, browser } = browserSuite();

  it('invitation and token forms: errors beside the field after it is left, nothing posted, then success', async () => {
    const ctx = await browser().newContext({ viewport: { width: 1024, height: 900 } });
    const page = await ctx.newPage();
    const posts: string[] = [];
    page.on('request', (r) => {
      if (r.method() === 'POST') posts.push(new URL(r.url()).pathname);
    });
    await signInThroughForm(page, server().baseUrl, 'admin@example.com');
    await page.goto(server().baseUrl + '/admin?tab=invitations');
    const form = page.getByRole('form', { name: 'Invite someone' });
    const email = form.getByLabel('E-mail address');
    await email.waitFor({ timeout: 30000 });
    expect(await errorOf(page, email)).toBe('');
    await email.fill('colleague-at-university');
    await email.blur();
    // emailSchema in domain/src/contracts/auth.ts
    await expect.poll(() => errorOf(page, email)).toContain('must be an e-mail address');
    const before = posts.length;
    await form.getByRole('button', { name: 'Send invitation' }).click();
    expect(posts.slice(before).filter((p) => p.includes('invitations'))).toEqual([]);
    await email.fill('new.colleague@university.example');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await page
      .getByText(/new\.colleague@university\.example/)
      .first()
      .waitFor({ timeout: 30000 });
    expect(await errorOf(page, email)).toBe('');

    await page.goto(server().baseUrl + '/account/tokens');
    const tokens = page.getByRole('form', { name: 'Create a token' });
    const name = tokens.getByLabel('Name');
    await name.waitFor({ timeout: 30000 });
    const n = posts.length;
    await tokens.getByRole('button', { name: 'Create token' }).click();
    await expect.poll(() => errorOf(page, name)).toContain('Give the token a name');
    expect(posts.slice(n).filter((p) => p.includes('tokens'))).toEqual([]);
    await name.fill('analysis notebook');
    await tokens.getByRole('button', { name: 'Create token' }).click();
    await page.getByTestId('token-secret').waitFor({ timeout: 30000 });
    await ctx.close();
  }, 120000);

  it('reset and accept-invitation forms: password rules and the repeat check beside the fields, link problems in the alert', async () => {
    const ctx = await browser().newContext({ viewport: { width: 1024, height: 900 }, colorScheme: 'dark' });
    const page = await ctx.newPage();
    const posts: string[] = [];
    page.on('request', (r) => {
      if (r.method() === 'POST') posts.push(new URL(r.url()).pathname);
    });
    await page.goto(server().baseUrl + '/reset-password');
    const email = page.getByLabel('E-mail address');
    await email.fill('not an address');
    await page.getByRole('button', { name: 'Send the reset link' }).click();
    await expect.poll(() => errorOf(page, email)).toContain('must be an e-mail address');
    expect(posts).toEqual([]);
    await email.fill('researcher@example.com');
    await page.getByRole('button', { name: 'Send the reset link' }).click();
    await page.getByText(/If an account exists for that address/).waitFor({ timeout: 30000 });

    // A truncated link: the token is refused by oneTimeTokenSchema, said in the alert, not beside a field.
    await page.goto(server().baseUrl + '/reset-password?token=short');
    const next = page.getByLabel(/^New password\W*$/);
    await next.fill('short');
    await page.getByLabel('New password again').fill('other');
    const sent = posts.length;
    await page.getByRole('button', { name: 'Set the new password' }).click();
    await expect.poll(() => errorOf(page, next)).toContain('at least 10 characters');
    expect(await errorOf(page, page.getByLabel('New password again'))).toContain('does not match the new password');
    await page.getByRole('alert').filter({ hasText: 'This reset link is incomplete' }).waitFor({ timeout: 10000 });
    expect(posts.length).toBe(sent);
    await page.screenshot({ path: process.env.SHOT_DIR ? `${process.env.SHOT_DIR}/reset-dark.png` : undefined });

    await page.goto(server().baseUrl + '/accept-invite?token=short');
    const who = page.getByLabel('Your name');
    await who.waitFor({ timeout: 30000 });
    expect(await errorOf(page, who)).toBe('');
    await page.getByLabel(/^Password\W*$/).fill('long-enough-password');
    await page.getByLabel('Password again').fill('long-enough-passwort');
    await page.getByRole('button', { name: 'Create my account' }).click();
    expect(await errorOf(page, page.getByLabel('Password again'))).toContain('does not match the password');
    await page.getByRole('alert').filter({ hasText: 'This invitation link is incomplete' }).waitFor({ timeout: 10000 });
    expect(posts.length).toBe(sent);
    await page.screenshot({ path: process.env.SHOT_DIR ? `${process.env.SHOT_DIR}/accept-dark.png` : undefined });
    await ctx.close();
  }, 120000);
});
