/**
 * Scenario 8: the embedded sweep at growing sizes (each size on a fresh api and DATA_DIR; short
 * sizes repeated, medians): time, points/s and peak api RSS. Goal: linear time, flat memory.
 */
import { startApi } from '../lib/api.js';
import type { BenchConfig } from '../lib/config.js';
import { crossFieldGrid } from '../lib/definitions.js';
import { measuredSweep, type MeasuredSweep } from '../lib/measured-sweep.js';
import type { Report } from '../lib/report.js';
import { median } from '../lib/stats.js';

export async function benchScaling(cfg: BenchConfig, report: Report, reuse: { points: number; m: MeasuredSweep } | undefined): Promise<void> {
  console.log(`\n[8] scaling: ${cfg.scaling.map((s) => s.points.toLocaleString('en-US')).join(', ')} points`);
  const scenario = '8 scaling';
  const rows: Record<string, unknown>[] = [];
  for (const { points, runs } of cfg.scaling) {
    let ms: MeasuredSweep[];
    let from = '';
    if (reuse && reuse.points === points) {
      ms = [reuse.m];
      from = ' (run of scenario 2)';
    } else {
      const api = await startApi(`scaling-${points}`, { EMBEDDED_WORKERS: '1' });
      try {
        ms = [];
        for (let i = 0; i < runs; i++) ms.push(await measuredSweep(api, crossFieldGrid(points)));
      } finally {
        await api.stop();
      }
    }
    const seconds = median(ms.map((m) => m.run.wallMs / 1000));
    const rate = points / seconds;
    const peak = Math.max(...ms.map((m) => m.rss.peakMB));
    const growth = Math.max(...ms.map((m) => m.rss.growthMB));
    const label = `${points.toLocaleString('en-US')} pts`;
    const runsNote = `${ms.length} run${ms.length > 1 ? 's, median' : ''}${from}`;
    report.add({ scenario, metric: `${label}: submit → completed`, value: seconds, unit: 's', note: runsNote });
    report.add({ scenario, metric: `${label}: throughput`, value: rate, unit: 'points/s' });
    report.add({ scenario, metric: `${label}: peak api RSS`, value: peak, unit: 'MB', note: `growth ${growth.toFixed(0)} MB` });
    rows.push({ points, runs: ms.length, seconds, pointsPerSec: rate, peakRssMB: peak, rssGrowthMB: growth, reused: !!from });
  }
  report.detail('scaling', rows);
}
