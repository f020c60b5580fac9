/** One sweep, submit → completed, with /api/health latency and api RSS sampled while it runs. */
import { runSweep, type ApiHandle, type SweepRun } from './api.js';
import { sampleHealth, sampleRss, type LatencySummary, type RssSummary } from './samplers.js';

export interface MeasuredSweep {
  run: SweepRun;
  pointsPerSec: number;
  health: LatencySummary;
  rss: RssSummary;
}

export async function measuredSweep(api: ApiHandle, definition: unknown): Promise<MeasuredSweep> {
  const rssSampler = sampleRss(api.pid, 100);
  const healthSampler = sampleHealth(api.baseUrl, 50);
  const outcome = await runSweep(api, definition).then(
    (run) => ({ run }),
    (error: unknown) => ({ error }),
  );
  // Samplers stop on failure too (their timers would keep the process alive).
  const health = await healthSampler.stop();
  const rss = rssSampler.stop();
  if ('error' in outcome) throw outcome.error;
  const run = outcome.run;
  return { run, pointsPerSec: run.points / (run.wallMs / 1000), health, rss };
}
