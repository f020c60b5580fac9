/** Scenario 7: SQLite bytes per stored point (driftgrid.db + -wal after a checkpoint). */
import { checkpointedBytes } from '../lib/api.js';
import type { Report } from '../lib/report.js';
import type { KeptSweep } from './sweep-embedded.js';

export function benchStorage(kept: KeptSweep, columns: number | undefined, report: Report): void {
  console.log('\n[7] SQLite bytes per stored point');
  const after = checkpointedBytes(kept.api.dbFile);
  const perPoint = (after.total - kept.bytesBefore) / kept.points;
  report.add({
    scenario: '7 storage',
    metric: 'bytes per stored point (growth by the sweep / points)',
    value: perPoint,
    unit: 'B',
    note: `${(after.total / 1024 / 1024).toFixed(1)} MB file after checkpoint (wal ${after.walBytes} B), ${kept.points.toLocaleString('en-US')} points${columns ? `, ${columns} columns` : ''}`,
  });
  report.detail('storage', {
    ...after,
    bytesBefore: kept.bytesBefore,
    points: kept.points,
    bytesPerPoint: perPoint,
    columns,
  });
}
