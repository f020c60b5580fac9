/**
 * Scenario 8: the embedded sweep at growing sizes on one fresh api (after a warm-up sweep), short
 * sizes repeated with medians: time, points/s and api RSS. Goal: linear time, flat memory.
 */
import { startApi, warmUp } from '../lib/api.js';
import type { BenchConfig } from '../lib/config.js';
import { crossFieldGrid } from '../lib/definitions.js';
import { measuredSweep, type MeasuredSweep } from '../lib/measured-sweep.js';
import type { Report } from '../lib/report.js';
import { median } from '../lib/stats.js';
import { WARM_UP_POINTS } from './sweep-embedded.js';

export async function benchScaling(cfg: BenchConfig, report: Report): Promise<void> {
  console.log(`\n[8] scaling: ${cfg.scaling.map((s) => s.points.toLocaleString('en-US')).join(', ')} points`);
  const scenario = '8 scaling';
  const rows: Record<string, unknown>[] = [];
  const api = await startApi('scaling', { EMBEDDED_WORKERS: '1' });
  try {
    await warmUp(api, crossFieldGrid(WARM_UP_POINTS));
    for (const { points, runs } of cfg.scaling) {
      const ms: MeasuredSweep[] = [];
      for (let i = 0; i < runs; i++) ms.push(await measuredSweep(api, crossFieldGrid(points)));
      const seconds = median(ms.map((m) => m.run.wallMs / 1000));
      const rate = points / seconds;
      const peak = Math.max(...ms.map((m) => m.rss.peakMB));
      const growth = Math.max(...ms.map((m) => m.rss.growthMB));
      const label = `${points.toLocaleString('en-US')} pts`;
      report.add({
        scenario,
        metric: `${label}: submit → completed`,
        value: seconds,
        unit: 's',
        note: `${ms.length} run${ms.length > 1 ? 's, median' : ''}`,
      });
      report.add({ scenario, metric: `${label}: throughput`, value: rate, unit: 'points/s' });
      report.add({
        scenario,
        metric: `${label}: peak api RSS`,
        value: peak,
        unit: 'MB',
        note: `largest growth in a run ${growth.toFixed(0)} MB`,
      });
      rows.push({
        points,
        runs: ms.length,
        seconds,
        pointsPerSec: rate,
        peakRssMB: peak,
        rssGrowthMB: growth,
        runsDetail: ms,
      });
    }
  } finally {
    await api.stop();
  }
  report.detail('scaling', rows);
}
