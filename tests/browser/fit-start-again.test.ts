/**
 * A fit that did not converge, opened on its own page (/fits/:id), offers to start again: the Fits
 * page opens with the same source, model and expression, and the last iterate as start values.
 * Data: NIST StRD BoxBOD (public-domain NIST data, tests/reference/strd), whose certified start 1
 * (b1 = 1, b2 = 1) does not converge with our engine (tests/api/fits-steering.test.ts; NIST rates BoxBOD
 * of higher difficulty — from memory).
 */
import { readFileSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { DEMO } from '../support/app.js';
import { browserSuite, chromiumAvailable, signInThroughForm } from '../support/browser.js';
import type { RunningServer } from '../support/server.js';

const run = chromiumAvailable();
const WAIT = 30_000;

describe.runIf(run)('starting a failed fit again from its saved page', () => {
  const suite = browserSuite();
  let server: RunningServer;
  let browser: Browser;
  beforeEach(() => {
    server = suite.server();
    browser = suite.browser();
  });

  it('fills the Fits page form with the request and the last iterate', async () => {
    const token = await server.login(DEMO.researcher);
    const csv = readFileSync(new URL('../reference/strd/BoxBOD_data.csv', import.meta.url), 'utf8');
    const up = await server.http
      .post('/api/datasets')
      .set('authorization', `Bearer ${token}`)
      .field('name', 'BoxBOD (NIST StRD)')
      .attach('file', Buffer.from(csv), 'boxbod.csv');
    expect(up.status).toBe(201);
    const fit = await server.http
      .post('/api/fits')
      .set('authorization', `Bearer ${token}`)
      .send({
        source: { kind: 'dataset', id: up.body.id },
        model: 'expression',
        expr: 'b1*(1-exp(-b2*x))',
        y: 'y',
        x: 'x',
        params: { b1: 1, b2: 1 },
      });
    expect(fit.body).toMatchObject({ converged: false, advice: { suspect: 'start' } });
    const last = fit.body.advice.lastIterate as Record<string, number>;

    const page = await (await browser.newContext({ viewport: { width: 1024, height: 900 } })).newPage();
    await signInThroughForm(page, server.baseUrl, DEMO.researcher);
    await page.goto(`${server.baseUrl}/fits/${fit.body.id}`);
    if (process.env.SHOT_DIR) {
      for (const width of [1024, 1440])
        for (const colorScheme of ['light', 'dark'] as const) {
          await page.setViewportSize({ width, height: 900 });
          await page.emulateMedia({ colorScheme });
          await page.getByTestId('fit-start-from-last').waitFor({ timeout: WAIT });
          await page.screenshot({ path: `${process.env.SHOT_DIR}/fit-start-again-${width}-${colorScheme}.png` });
        }
    }
    await page.getByTestId('fit-start-from-last').click({ timeout: WAIT });
    await page.waitForURL(/\/fits\?/, { timeout: WAIT });
    expect(new URL(page.url()).searchParams.get('from')).toBe(String(fit.body.id));
    const params = page.getByTestId('fit-params');
    await expect.poll(() => params.inputValue(), { timeout: WAIT }).toMatch(/b1 = /);
    // The start values are the last iterate (as the form writes numbers), for the same expression.
    const written = Object.fromEntries(
      (await params.inputValue()).split(/[,\n]/).map((p) => p.split('=').map((x) => x.trim()) as [string, string]),
    );
    expect(Object.keys(written).sort()).toEqual(['b1', 'b2']);
    for (const [name, value] of Object.entries(last)) expect(Number(written[name])).toBeCloseTo(value, 4);
    expect(await page.getByTestId('fit-expr').inputValue()).toBe('b1*(1-exp(-b2*x))');
    if (process.env.SHOT_DIR) await page.screenshot({ path: `${process.env.SHOT_DIR}/fit-start-again-form.png` });
  }, 120_000);
});
