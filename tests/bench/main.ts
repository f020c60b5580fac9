/**
 * The Driftgrid bench (`npm run bench`, `BENCH_QUICK=1` for the small CI run). Each api scenario
 * runs on its own fresh DATA_DIR; every child process and temp dir is removed at the end, also on
 * failure. Figures are printed beside their targets and written to bench/results.json, never
 * asserted: the exit code is non-zero only when the harness itself breaks (e.g. a sweep fails).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { apiJson, REPO } from '../support/processes.js';
import { benchConfig } from './lib/config.js';
import { printTable, Report } from './lib/report.js';
import { cleanupAll } from './lib/resources.js';
import { benchQueries } from './scenarios/catalogue-queries.js';
import { benchExport } from './scenarios/export.js';
import { benchFitApi, benchFitDomain } from './scenarios/fit.js';
import { benchKernels } from './scenarios/kernels.js';
import { benchLoad } from './scenarios/load.js';
import { benchScaling } from './scenarios/scaling.js';
import { benchStorage } from './scenarios/storage.js';
import { benchEmbeddedSweep } from './scenarios/sweep-embedded.js';
import { benchRedisSweep } from './scenarios/sweep-redis.js';

const RESULTS = path.join(REPO, 'bench', 'results.json');

/** Thrown to skip the remaining scenarios when BENCH_ONLY names one. */
class OnlyDone extends Error {}

/** Runs one scenario and prints how long it took (the quick run must stay under a minute). */
async function step<T>(name: string, fn: () => Promise<T> | T): Promise<T> {
  const t0 = performance.now();
  try {
    return await fn();
  } finally {
    console.log(`  (${name}: ${((performance.now() - t0) / 1000).toFixed(1)} s)`);
  }
}

export async function main(): Promise<number> {
  const cfg = benchConfig();
  const report = new Report();
  const started = Date.now();
  const onSignal = (sig: NodeJS.Signals) => {
    console.error(`\n${sig}: stopping children and removing temp dirs`);
    void cleanupAll().finally(() => process.exit(130));
  };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  console.log(
    `Driftgrid bench (${cfg.quick ? 'quick' : 'full'}) — node ${process.version}, ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'cpu'}`,
  );
  const loadStart = os.loadavg();
  if (loadStart[0]! > os.cpus().length * 0.5) {
    report.note(
      `load average ${loadStart.map((l) => l.toFixed(1)).join(' / ')} at start on ${os.cpus().length} cores: other work is running, figures will read low`,
    );
  }
  let failure: unknown;
  // BENCH_ONLY=load, =embedded or =redis runs one scenario alone (each starts its own api and sweeps).
  const only = process.env.BENCH_ONLY;
  try {
    if (only === 'load') {
      await step('load', () => benchLoad(cfg, report));
      throw new OnlyDone();
    }
    if (only === 'embedded') {
      const kept = await step('embedded sweeps', () => benchEmbeddedSweep(cfg, report));
      await kept.api.stop();
      throw new OnlyDone();
    }
    if (only === 'redis') {
      await step('redis', () => benchRedisSweep(cfg, report));
      throw new OnlyDone();
    }
    await step('kernels', () => benchKernels(cfg, report));
    await step('fit (domain)', () => benchFitDomain(cfg, report));
    const kept = await step('embedded sweeps', () => benchEmbeddedSweep(cfg, report));
    try {
      await step('queries', () => benchQueries(cfg, kept, report));
      await step('export', () => benchExport(kept, report));
      const sweep = await apiJson(kept.api.baseUrl, kept.api.token, 'GET', `/api/sweeps/${kept.sweepId}`);
      await step('storage', () => benchStorage(kept, sweep.body?.columns?.length, report));
      await step('fit (api)', () => benchFitApi(cfg, kept, report));
      await step('load', () => benchLoad(cfg, report, kept));
    } finally {
      await kept.api.stop();
    }
    await step('scaling', () => benchScaling(cfg, report));
    await step('redis', () => benchRedisSweep(cfg, report));
  } catch (e) {
    if (!(e instanceof OnlyDone)) failure = e;
  } finally {
    await cleanupAll();
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
  }
  const seconds = (Date.now() - started) / 1000;
  const loadEnd = os.loadavg();
  report.note(
    `load average (1/5/15 min) at start ${loadStart.map((l) => l.toFixed(1)).join(' / ')}, at end ${loadEnd.map((l) => l.toFixed(1)).join(' / ')}`,
  );
  printTable(report);
  console.log(`\nbench ${cfg.quick ? 'quick' : 'full'} run: ${seconds.toFixed(1)} s`);
  fs.mkdirSync(path.dirname(RESULTS), { recursive: true });
  const out = {
    at: new Date().toISOString(),
    mode: cfg.quick ? 'quick' : 'full',
    seconds,
    node: process.version,
    cpus: os.cpus().length,
    cpuModel: os.cpus()[0]?.model,
    loadStart,
    loadEnd,
    config: cfg,
    failure: failure ? (failure instanceof Error ? failure.message : JSON.stringify(failure)) : null,
    rows: report.rows,
    notes: report.notes,
    details: report.details,
  };
  fs.writeFileSync(RESULTS, `${JSON.stringify(out, null, 2)}\n`);
  console.log(`results written to ${path.relative(process.cwd(), RESULTS) || RESULTS}`);
  if (failure) {
    console.error(
      `\nBENCH FAILED (harness error, figures above are partial):\n${failure instanceof Error ? (failure.stack ?? failure.message) : JSON.stringify(failure)}`,
    );
    return 1;
  }
  return 0;
}
