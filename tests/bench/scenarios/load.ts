/**
 * Scenario 9: a crowd on one api. On a fresh api a big completed sweep (shared with the group) is
 * the table to browse and re-sort. Idle first: a page sorted by an output not asked for before
 * ("cold"), then the next page of the same sort. Then, for a fixed time, while a second sweep of the
 * same size computes: browsing clients (catalogue, sweep page, results pages in index order, with a
 * short pause between requests) and three re-sorting clients (each another user, each cycling
 * through the outputs and both directions), plus GET /api/health every ~50 ms. Figures are printed
 * beside the targets of issue 14, never asserted.
 */
import { apiLogin } from '../../support/processes.js';
import { runSweep, startApi, type ApiHandle } from '../lib/api.js';
import type { BenchConfig } from '../lib/config.js';
import { crossFieldGrid } from '../lib/definitions.js';
import type { Report } from '../lib/report.js';
import { sampleHealth } from '../lib/samplers.js';
import { median, percentile } from '../lib/stats.js';
import type { KeptSweep } from './sweep-embedded.js';

const CLIENT_TIMEOUT_MS = 30_000;

interface Tally {
  lat: number[];
  timeouts: number;
  http5xx: number;
  refused: number;
  other: number;
  /** Answers by HTTP status (and `error` for failures without one). */
  statuses: Record<string, number>;
}

const tally = (): Tally => ({ lat: [], timeouts: 0, http5xx: 0, refused: 0, other: 0, statuses: {} });

/** One GET with the client timeout; latency of every answer, failures counted by kind. */
async function get(baseUrl: string, token: string, route: string, t: Tally): Promise<unknown> {
  const t0 = performance.now();
  try {
    const r = await fetch(`${baseUrl}${route}`, {
      headers: { authorization: `Bearer ${token}` },
      signal: AbortSignal.timeout(CLIENT_TIMEOUT_MS),
    });
    const text = await r.text();
    t.lat.push(performance.now() - t0);
    t.statuses[r.status] = (t.statuses[r.status] ?? 0) + 1;
    if (r.status >= 500) t.http5xx++;
    else if (r.status === 429) t.refused++;
    else if (r.status !== 200) t.other++;
    return r.status === 200 ? JSON.parse(text) : null;
  } catch (e) {
    if ((e as Error).name === 'TimeoutError') t.timeouts++;
    else t.other++;
    t.statuses.error = (t.statuses.error ?? 0) + 1;
    return null;
  }
}

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * `kept`: the api and big sweep of the embedded scenario (the full chain); without it (BENCH_ONLY=load)
 * a fresh api is started and the table computed first.
 */
export async function benchLoad(cfg: BenchConfig, report: Report, kept?: KeptSweep): Promise<void> {
  const points = kept?.points ?? cfg.sweepPoints;
  const clients = cfg.quick ? 10 : 50;
  const seconds = cfg.quick ? 8 : 30;
  console.log(
    `\n[9] load: ${clients} browsing + 3 re-sorting clients for ${seconds} s on a ${points.toLocaleString('en-US')}-row table while a sweep of the same size runs`,
  );
  const api: ApiHandle = kept?.api ?? (await startApi('load'));
  try {
    const scenario = 'load';
    const table = kept ? { id: kept.sweepId } : await runSweep(api, crossFieldGrid(points));
    const share = await fetch(`${api.baseUrl}/api/sweeps/${table.id}/sharing`, {
      method: 'PUT',
      headers: { authorization: `Bearer ${api.token}`, 'content-type': 'application/json' },
      body: JSON.stringify({ visibility: 'group', userIds: [] }),
    });
    // 409: the sweep is archived (the export scenario may archive it), and archived sweeps are readable by all.
    if (share.status !== 200 && share.status !== 409)
      throw new Error(`sharing the bench sweep answered ${share.status}`);
    const tokens = [
      api.token,
      await apiLogin(api.baseUrl, 'reviewer@example.com'),
      await apiLogin(api.baseUrl, 'admin@example.com'),
    ];
    const info = (await get(api.baseUrl, api.token, `/api/sweeps/${table.id}`, tally())) as {
      columns: { name: string; kind: string }[];
    };
    const outputs = info.columns.filter((c) => c.kind === 'output').map((c) => c.name);
    const results = `/api/sweeps/${table.id}/results?pageSize=50`;

    // Idle: a sort nobody asked for yet, then its second page (three outputs, medians).
    const cold: number[] = [];
    const second: number[] = [];
    for (const col of outputs.slice(0, 3)) {
      const t = tally();
      await get(api.baseUrl, api.token, `${results}&page=1&sort=${col}:desc`, t);
      await get(api.baseUrl, api.token, `${results}&page=2&sort=${col}:desc`, t);
      if (t.statuses['200'] !== 2) report.note(`load: idle sort by ${col} answered ${JSON.stringify(t.statuses)}`);
      else {
        cold.push(t.lat[0]!);
        second.push(t.lat[1]!);
      }
    }
    report.target(
      {
        scenario,
        metric: 'sorted page, idle server, first request of that sort',
        value: median(cold),
        unit: 'ms',
        note: `median of ${cold.length} outputs: ${cold.map((v) => v.toFixed(0)).join(', ')}`,
      },
      '≤',
      500,
      '500 ms',
    );
    report.target(
      {
        scenario,
        metric: 'second page of the same sort, idle',
        value: median(second),
        unit: 'ms',
        note: second.map((v) => v.toFixed(0)).join(', '),
      },
      '≤',
      50,
      '50 ms',
    );

    // Under load, while a second sweep of the same size computes.
    const submitted = await fetch(`${api.baseUrl}/api/sweeps`, {
      method: 'POST',
      headers: { authorization: `Bearer ${api.token}`, 'content-type': 'application/json' },
      body: JSON.stringify({ ...crossFieldGrid(points), name: 'Bench load sweep' }),
    });
    if (submitted.status !== 201) throw new Error(`POST /api/sweeps answered ${submitted.status}`);
    const running = ((await submitted.json()) as { id: number }).id;
    const health = sampleHealth(api.baseUrl, 50);
    const catalogue = tally();
    const browsing = tally();
    const sorting = tally();
    const until = Date.now() + seconds * 1000;
    const pages = Math.max(1, Math.floor(points / 50));
    const browser = async (i: number) => {
      const token = tokens[i % tokens.length]!;
      for (let k = 0; Date.now() < until; k++) {
        const pick = (i + k) % 3;
        if (pick === 0) await get(api.baseUrl, token, `/api/sweeps?page=1&pageSize=20`, catalogue);
        // The running sweep is private to its owner (the first token); the table is shared with the group.
        else if (pick === 1)
          await get(api.baseUrl, k % 2 ? tokens[0]! : token, `/api/sweeps/${k % 2 ? running : table.id}`, browsing);
        else await get(api.baseUrl, token, `${results}&page=${1 + ((i * 7919 + k * 104729) % pages)}`, browsing);
        await pause(100 + ((i * 37 + k * 53) % 300));
      }
    };
    const sorter = async (i: number) => {
      for (let k = 0; Date.now() < until; k++) {
        const col = outputs[(i + k) % outputs.length]!;
        const dir = (k >> 1) % 2 ? 'asc' : 'desc';
        await get(api.baseUrl, tokens[i]!, `${results}&page=${1 + (k % 5)}&sort=${col}:${dir}`, sorting);
      }
    };
    await Promise.all([...Array.from({ length: clients }, (_, i) => browser(i)), ...[0, 1, 2].map((i) => sorter(i))]);
    const h = await health.stop();
    const progress = (await get(api.baseUrl, api.token, `/api/sweeps/${running}`, tally())) as {
      progress?: { done: number; total: number };
    } | null;
    report.target(
      {
        scenario,
        metric: 'GET /api/health p95 under load',
        value: h.p95,
        unit: 'ms',
        note: `n=${h.n}, p50 ${h.p50.toFixed(1)}, max ${h.max.toFixed(1)}${h.errors ? `, ${h.errors} errors` : ''}`,
      },
      '<',
      50,
      '50 ms',
    );
    report.target(
      {
        scenario,
        metric: 'catalogue page p95 under load',
        value: percentile(catalogue.lat, 95),
        unit: 'ms',
        note: `n=${catalogue.lat.length}, p50 ${percentile(catalogue.lat, 50).toFixed(0)}`,
      },
      '<',
      150,
      '150 ms',
    );
    report.add({
      scenario,
      metric: 'sweep page / results page p95 under load',
      value: percentile(browsing.lat, 95),
      unit: 'ms',
      note: `n=${browsing.lat.length}, p50 ${percentile(browsing.lat, 50).toFixed(0)}`,
    });
    report.add({
      scenario,
      metric: 're-sorted page p50 / p95 under load',
      value: percentile(sorting.lat, 50),
      unit: 'ms',
      note: `p95 ${percentile(sorting.lat, 95).toFixed(0)}, n=${sorting.lat.length}, ${sorting.refused} refused (429)`,
    });
    const all = [catalogue, browsing, sorting];
    const timeouts = all.reduce((a, t) => a + t.timeouts, 0);
    const fivexx = all.reduce((a, t) => a + t.http5xx, 0) + h.errors;
    const requests = all.reduce((a, t) => a + t.lat.length + t.timeouts, 0);
    report.target(
      {
        scenario,
        metric: `client timeouts (${CLIENT_TIMEOUT_MS / 1000} s)`,
        value: timeouts,
        unit: '',
        note: `of ${requests} requests`,
      },
      '≤',
      0,
      '0',
    );
    report.target(
      { scenario, metric: '5xx answers', value: fivexx, unit: '', note: `of ${requests + h.n} requests` },
      '≤',
      0,
      '0',
    );
    report.note(
      `load: answers by status — catalogue ${JSON.stringify(catalogue.statuses)}, browsing ${JSON.stringify(browsing.statuses)}, re-sorting ${JSON.stringify(sorting.statuses)}`,
    );
    report.note(
      `load: the concurrent sweep was at ${progress?.progress ? `${progress.progress.done}/${progress.progress.total}` : '?'} points when the clients stopped; other non-200 answers: ${all.reduce((a, t) => a + t.other, 0)}`,
    );
  } finally {
    if (!kept) await api.stop();
  }
}
