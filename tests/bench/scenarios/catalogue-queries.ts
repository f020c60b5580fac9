/**
 * Scenario 4: results pages and plot series on the big sweep, medians of several requests each.
 * A route that answers 404/405 is reported "not available" (it may not be built yet).
 */
import { timedGet, type ApiHandle } from '../lib/api.js';
import type { BenchConfig } from '../lib/config.js';
import type { Report } from '../lib/report.js';
import { median } from '../lib/stats.js';
import type { KeptSweep } from './sweep-embedded.js';

interface Query {
  metric: string;
  route: string;
  limit?: number;
  limitText?: string;
  /** What the answer held, for the note (rows, total, points). */
  describe(body: Body): string;
}

/** An answer body as the harness reads it: JSON of any shape (supertest types bodies as any too). */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- bodies are printed, never trusted
type Body = any;

export async function benchQueries(cfg: BenchConfig, kept: KeptSweep, report: Report): Promise<void> {
  const { api, sweepId: id, points } = kept;
  console.log(
    `\n[4] results and series on the ${points.toLocaleString('en-US')}-point sweep (median of ${cfg.queryRuns})`,
  );
  const filter = encodeURIComponent(JSON.stringify({ Te_eV: { gte: 5, lte: 50 } }));
  const deepPage = Math.max(1, Math.floor(points / 50 / 2));
  const rows = (b: Body) => `${b?.rows?.length ?? '?'} rows of ${b?.total ?? '?'}`;
  const series = (b: Body) => `${b?.returned ?? '?'} points in ${b?.groups?.length ?? '?'} groups, ${b?.method ?? '?'}`;
  const queries: Query[] = [
    {
      metric: 'results page 1, default order (50 rows)',
      route: `/api/sweeps/${id}/results?page=1&pageSize=50`,
      limit: 50,
      limitText: '50 ms',
      describe: rows,
    },
    {
      metric: `results page ${deepPage.toLocaleString('en-US')}, default order`,
      route: `/api/sweeps/${id}/results?page=${deepPage}&pageSize=50`,
      describe: rows,
    },
    {
      metric: 'results sorted by rho_i_over_Ln desc, 5 ≤ Te_eV ≤ 50',
      route: `/api/sweeps/${id}/results?page=1&pageSize=50&sort=rho_i_over_Ln:desc&filter=${filter}`,
      limit: 500,
      limitText: '500 ms',
      describe: rows,
    },
    {
      metric: 'series x=Te_eV y=vDi_ms groupBy=B_T, 2,000 pts',
      route: `/api/sweeps/${id}/series?x=Te_eV&y=vDi_ms&groupBy=B_T&maxPoints=2000`,
      limit: 300,
      limitText: '300 ms',
      describe: series,
    },
    {
      metric: 'series x=beta y=vDi_ms (x not swept), 2,000 pts',
      route: `/api/sweeps/${id}/series?x=beta&y=vDi_ms&maxPoints=2000`,
      limit: 300,
      limitText: '300 ms',
      describe: series,
    },
  ];
  const detail: Record<string, unknown> = {};
  for (const q of queries) detail[q.metric] = await one(api, q, cfg.queryRuns, report);
  report.detail('queries', detail);
}

async function one(api: ApiHandle, q: Query, runs: number, report: Report): Promise<unknown> {
  const scenario = '4 queries';
  const first = await timedGet(api, q.route); // also warms caches; not counted
  if (first.status === 404 || first.status === 405) {
    report.add({ scenario, metric: q.metric, value: 'not available', unit: '', note: `HTTP ${first.status}` });
    return { available: false, status: first.status };
  }
  if (first.status !== 200) {
    const msg = (first.body as Body)?.message ?? JSON.stringify(first.body).slice(0, 120);
    report.add({
      scenario,
      metric: q.metric,
      value: `error ${first.status}`,
      unit: '',
      note: String(msg).slice(0, 160),
    });
    return { available: true, status: first.status, body: first.body };
  }
  const ms: number[] = [];
  for (let i = 0; i < runs; i++) {
    const r = await timedGet(api, q.route);
    if (r.status !== 200) throw new Error(`${q.route} answered ${r.status} after a 200`);
    ms.push(r.ms);
  }
  const row = {
    scenario,
    metric: q.metric,
    value: median(ms),
    unit: 'ms',
    note: `${q.describe(first.body)}; first ${first.ms.toFixed(0)} ms`,
  };
  if (q.limit !== undefined) report.target(row, '≤', q.limit, q.limitText!);
  else report.add(row);
  return { available: true, ms, firstMs: first.ms, bytes: first.bytes };
}
