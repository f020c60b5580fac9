import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable } from '../support/browser.js';

const run = chromiumAvailable();

describe.runIf(run)('sign-in through the form', () => {
  const suite = browserSuite();

  it('signs in the demo researcher and shows the landing page with name and role', async () => {
    const server = suite.server();
    const page = await suite.browser().newPage();
    const external: string[] = [];
    page.on('request', (r) => {
      if (!r.url().startsWith(server.baseUrl) && !r.url().startsWith('data:') && !r.url().startsWith('blob:'))
        external.push(r.url());
    });
    await page.goto(server.baseUrl + '/');
    await page.getByLabel('Email').fill('researcher@example.com');
    await page.getByLabel('Password').fill('driftgrid-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const who = page.getByTestId('whoami');
    await who.waitFor({ timeout: 30000 });
    expect(await who.textContent()).toContain('researcher');
    expect(external).toEqual([]);
    await page.close();
  });

  it('shows the error for a wrong password and stays on the sign-in page', async () => {
    const server = suite.server();
    const page = await suite.browser().newPage();
    await page.goto(server.baseUrl + '/sign-in');
    await page.getByLabel('Email').fill('researcher@example.com');
    await page.getByLabel('Password').fill('wrong-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const alert = page.getByTestId('signin-error');
    await alert.waitFor({ timeout: 30000 });
    expect(await alert.textContent()).toMatch(/wrong e-mail or password/i);
    expect(page.url()).toContain('/sign-in');
    await page.close();
  });
});
