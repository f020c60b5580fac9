/**
 * GET /api/sweeps/:id/sensitivity: Sobol indices of a Saltelli-design sweep through the api — the
 * response contract, the indices against the domain estimators run on the stored rows read directly,
 * ρ_i/L_n independent of T_e (NRL Plasma Formulary: ρ_i = sqrt(m_i T_i)/(Z e B)), 409 for other designs,
 * 400 naming `output`, and 404 for callers who may not read the sweep (same rule as results/series).
 */
import bcrypt from 'bcryptjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { estimateSobolIndices, saltelliOutputs, sensitivityReportSchema } from '@driftgrid/domain';
import { HeavyReads } from '../../api/src/reads/heavy-reads.js';
import type { PooledHeavyReads } from '../../api/src/reads/read-pool.js';
import { DEMO_PASSWORD } from '../../api/src/seed/demo-users.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
const tok = { owner: '', other: '', reviewer: '', admin: '' };
let saltelli = 0;
let shared = 0;
let grid = 0;
const SAMPLES = 256;
const INPUTS = ['Te_eV', 'Ti_eV', 'B_T', 'Ln_m'];

const auth = (token: string) => ({ authorization: `Bearer ${token}` });
const get = (id: number, token: string, query: string) =>
  t.http.get(`/api/sweeps/${id}/sensitivity${query}`).set(auth(token));

function design(name: string, visibility: 'private' | 'group') {
  return {
    name,
    model: 'cross-field',
    fixed: { n_m3: 1e18, mu: 40, Z: 1 },
    axes: [
      { param: 'Te_eV', kind: 'log', min: 1, max: 20 },
      { param: 'Ti_eV', kind: 'log', min: 0.05, max: 2 },
      { param: 'B_T', kind: 'linear', min: '500 G', max: '2500 G' },
      { param: 'Ln_m', kind: 'linear', min: 1, max: 5, unit: 'cm' },
    ],
    sampling: { kind: 'saltelli', samples: SAMPLES },
    derived: [{ name: 'rho_i_mm', expr: 'rho_i_m * 1000' }],
    visibility,
  };
}

async function submit(body: Record<string, unknown>): Promise<number> {
  const res = await t.http.post('/api/sweeps').set(auth(tok.owner)).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  await waitForSweep(t, tok.owner, res.body.id, 120_000);
  return res.body.id as number;
}

beforeAll(async () => {
  t = await startTestApp();
  const now = Date.now();
  t.sqlite()
    .prepare(
      `INSERT INTO users (email, name, role, password_hash, active, failed_logins, created_at, updated_at)
    VALUES ('second.researcher@example.com', 'Second Researcher', 'researcher', ?, 1, 0, ?, ?)`,
    )
    .run(bcrypt.hashSync(DEMO_PASSWORD, 4), now, now);
  tok.owner = await t.login(DEMO.researcher);
  tok.other = await t.login('second.researcher@example.com');
  tok.reviewer = await t.login(DEMO.reviewer);
  tok.admin = await t.login(DEMO.admin);
  saltelli = await submit(design('Argon column sensitivity (private)', 'private'));
  shared = await submit(design('Argon column sensitivity (group)', 'group'));
  grid = await submit(smallSweep());
}, 240_000);
afterAll(async () => {
  await t?.close();
});

describe('GET /api/sweeps/:id/sensitivity', () => {
  it('runs N·(d + 2) points and reports the contract shape with indices in axis order', async () => {
    const sweep = await t.http.get(`/api/sweeps/${saltelli}`).set(auth(tok.owner));
    expect(sweep.body.points).toBe(SAMPLES * (INPUTS.length + 2));
    const res = await get(saltelli, tok.owner, '?output=rho_i_over_Ln');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const report = sensitivityReportSchema.parse(res.body);
    expect(report).toMatchObject({ output: 'rho_i_over_Ln', n: SAMPLES, dropped: 0, samples: SAMPLES });
    expect(report.bootstrap).toMatchObject({ method: 'percentile', level: 0.95, resamples: 1000 });
    expect(report.indices.map((i) => i.input)).toEqual(INPUTS);
  });

  it('finds ρ_i/L_n independent of Te and driven by Ti, B and L_n', async () => {
    const { body } = await get(saltelli, tok.owner, '?output=rho_i_over_Ln');
    const [te, ...others] = body.indices as { input: string; total: number; totalCI: [number, number] }[];
    expect(te!.total).toBe(0);
    expect(te!.totalCI).toEqual([0, 0]);
    for (const ix of others) expect(ix.totalCI[0], ix.input).toBeGreaterThan(0.02);
  });

  it('equals the domain estimators run on the stored rows (read path loses nothing)', async () => {
    const { columns } = t.sqlite().prepare('SELECT columns FROM sweeps WHERE id = ?').get(saltelli) as {
      columns: string;
    };
    const slot = (JSON.parse(columns) as { name: string; slot: string }[]).find((c) => c.name === 'rho_i_mm')!.slot;
    const rows = t
      .sqlite()
      .prepare(`SELECT id - ? AS p, ${slot} AS v FROM results WHERE id BETWEEN ? AND ? ORDER BY id`)
      .all(saltelli * 2 ** 32, saltelli * 2 ** 32, (saltelli + 1) * 2 ** 32 - 1) as { p: number; v: number }[];
    const values = new Float64Array(SAMPLES * 6).fill(Number.NaN);
    for (const r of rows) values[r.p] = r.v;
    const expected = estimateSobolIndices(saltelliOutputs(values, 4, SAMPLES));
    const res = await get(saltelli, tok.owner, '?output=rho_i_mm');
    expect(res.status).toBe(200);
    expect(res.body.indices).toEqual(expected.indices.map((ix, i) => ({ input: INPUTS[i], ...ix })));
    // ρ_i does not depend on T_e or L_n.
    expect(res.body.indices[0].total).toBe(0);
    expect(res.body.indices[3].total).toBe(0);
  });

  it('answers 409 for a sweep without the Saltelli design', async () => {
    const res = await get(grid, tok.owner, '?output=rho_i_over_Ln');
    expect(res.status).toBe(409);
    expect(res.body.message).toMatch(/Saltelli design/);
  });

  it('answers 400 naming output for an unknown, missing or non-output column, and for unknown parameters', async () => {
    const unknown = await get(saltelli, tok.owner, '?output=rho_x');
    expect(unknown.status).toBe(400);
    expect(unknown.body.details?.[0]?.path).toBe('output');
    expect(unknown.body.details[0].message).toMatch(/unknown column/);
    const input = await get(saltelli, tok.owner, '?output=Te_eV');
    expect(input.status).toBe(400);
    expect(input.body.details[0]).toMatchObject({ path: 'output' });
    expect(input.body.details[0].message).toMatch(/an input/);
    const missing = await get(saltelli, tok.owner, '');
    expect(missing.status).toBe(400);
    expect(missing.body.details[0].path).toBe('output');
    const extra = await get(saltelli, tok.owner, '?output=rho_i_over_Ln&level=0.9');
    expect(extra.status).toBe(400);
  });

  it('follows the sweep read rules: 404 for others on private work, 200 for admins and group sweeps', async () => {
    expect((await get(saltelli, tok.other, '?output=rho_i_over_Ln')).status).toBe(404);
    expect((await get(saltelli, tok.reviewer, '?output=rho_i_over_Ln')).status).toBe(404);
    expect((await get(saltelli, tok.admin, '?output=rho_i_over_Ln')).status).toBe(200);
    expect((await get(shared, tok.reviewer, '?output=rho_i_over_Ln')).status).toBe(200);
    expect((await get(999999, tok.owner, '?output=rho_i_over_Ln')).status).toBe(404);
    expect((await t.http.get(`/api/sweeps/${saltelli}/sensitivity?output=rho_i_over_Ln`)).status).toBe(401);
  });
});

describe('the sensitivity read runs on the heavy-read pool (issue 14 §1)', () => {
  it('obeys the read budget: 503 with advice while every pool thread is held, then served and kept', async () => {
    const reads = t.app.get(HeavyReads) as PooledHeavyReads;
    expect(reads.mode).toBe('pool');
    const deadline = Date.now() + 60_000;
    while (reads.stats.ready < reads.options.threads && Date.now() < deadline)
      await new Promise((r) => setTimeout(r, 50));
    // Hold every thread past the budget (the pool's test task; its own long budget).
    const hold = reads.options.budgetMs + 2500;
    const busy = Array.from({ length: reads.options.threads }, (_, i) =>
      reads.run(9100 + i, { kind: 'sleep', ms: hold }, { budgetMs: 120_000 }),
    );
    await new Promise((r) => setTimeout(r, 50));
    // An output not asked for before: not in the report cache, so it must wait for a pool thread.
    const late = await get(shared, tok.reviewer, '?output=rho_s_over_Ln');
    expect(late.status).toBe(503);
    expect(late.body.message).toMatch(/narrow the filter|try again/i);
    expect(late.headers['retry-after']).toBeDefined();
    await Promise.all(busy);
    const served = await get(shared, tok.reviewer, '?output=rho_s_over_Ln');
    expect(served.status).toBe(200);
    expect(sensitivityReportSchema.parse(served.body).output).toBe('rho_s_over_Ln');
    // Kept: the same report is answered from the cache even while the pool is held again.
    const again = Array.from({ length: reads.options.threads }, (_, i) =>
      reads.run(9100 + i, { kind: 'sleep', ms: 1500 }, { budgetMs: 120_000 }),
    );
    await new Promise((r) => setTimeout(r, 50));
    const cached = await get(shared, tok.reviewer, '?output=rho_s_over_Ln');
    expect(cached.status).toBe(200);
    expect(cached.body).toEqual(served.body);
    await Promise.all(again);
  }, 60_000);
});
