/**
 * The password form offers to revoke the personal API tokens, showing how many are active
 * (issue 14 §2.3), and the answer says how many were revoked.
 */
import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';

const run = chromiumAvailable();
const SHOTS = process.env.SCREENSHOT_DIR;

describe.runIf(run)('password change with the revoke-tokens option', () => {
  const suite = browserSuite();

  it('shows the active count, revokes on request and reports it', async () => {
    const server = suite.server();
    const session = await server.login('reviewer@example.com');
    for (const name of ['probe logger', 'nightly export'])
      expect(
        (await server.http.post('/api/tokens').set('authorization', `Bearer ${session}`).send({ name, scope: 'read' }))
          .status,
      ).toBe(201);

    for (const [width, scheme] of [
      [1024, 'light'],
      [1440, 'dark'],
    ] as const) {
      if (!SHOTS) break;
      const ctx = await suite.browser().newContext({ viewport: { width, height: 800 }, colorScheme: scheme });
      const p = await ctx.newPage();
      await signInThroughForm(p, server.baseUrl, 'reviewer@example.com');
      await p.goto(server.baseUrl + '/account/password');
      await p.getByLabel('Also revoke my 2 active API tokens').waitFor({ timeout: 30000 });
      await p.screenshot({ path: `${SHOTS}/password-${width}-${scheme}.png` });
      await ctx.close();
    }

    const page = await suite.browser().newPage();
    await signInThroughForm(page, server.baseUrl, 'reviewer@example.com');
    await page.goto(server.baseUrl + '/account/password');
    const box = page.getByLabel('Also revoke my 2 active API tokens');
    await box.waitFor({ timeout: 30000 });
    await page.getByLabel('Current password').fill('driftgrid-demo');
    await page.getByLabel(/^New password\W*$/).fill('reviewer-fresh-pass');
    await page.getByLabel('New password again').fill('reviewer-fresh-pass');
    await box.check();
    await page.getByRole('button', { name: 'Change password' }).click();
    await page.getByText(/2 personal API tokens were revoked/).waitFor({ timeout: 30000 });
    await page.getByTestId('revoke-tokens-none').waitFor({ timeout: 30000 });
    await page.close();
  });
});
