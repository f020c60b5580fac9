/**
 * Scenario 5: the zipped CSV export of the big sweep, streamed to a temp file: MB/s of zip bytes
 * and of uncompressed results.csv (sizes read from the zip's central directory) and api RSS growth.
 */
import fs from 'node:fs';
import path from 'node:path';
import { unzipSync, strFromU8 } from 'fflate';
import type { Report } from '../lib/report.js';
import { removeDir, tempDir } from '../lib/resources.js';
import { sampleRss } from '../lib/samplers.js';
import type { KeptSweep } from './sweep-embedded.js';

const MB = 1024 * 1024;

export async function benchExport(kept: KeptSweep, report: Report): Promise<void> {
  const { api, sweepId, points } = kept;
  const scenario = '5 export';
  console.log(`\n[5] export of the ${points.toLocaleString('en-US')}-point sweep`);
  const dir = tempDir('export');
  try {
    const file = path.join(dir, 'export.zip');
    const rss = sampleRss(api.pid, 100);
    const t0 = performance.now();
    const outcome = await download(`${api.baseUrl}/api/sweeps/${sweepId}/export`, api.token, file, t0).then(
      (d) => ({ d }),
      (error: unknown) => ({ error }),
    );
    const mem = rss.stop();
    if ('error' in outcome) throw outcome.error;
    const { res, zipBytes, firstByteMs } = outcome.d;
    const seconds = (performance.now() - t0) / 1000;
    if (res.status === 404 || res.status === 405) {
      report.add({
        scenario,
        metric: 'GET /api/sweeps/:id/export',
        value: 'not available',
        unit: '',
        note: `HTTP ${res.status}`,
      });
      report.detail('export', { available: false, status: res.status });
      return;
    }
    if (!res.ok) {
      report.add({ scenario, metric: 'GET /api/sweeps/:id/export', value: `error ${res.status}`, unit: '' });
      report.detail('export', { available: true, status: res.status });
      return;
    }
    const info = zipContents(file);
    const csv = info.files.find((f) => f.name.endsWith('results.csv'));
    report.add({
      scenario,
      metric: 'zip bytes streamed',
      value: zipBytes / MB / seconds,
      unit: 'MB/s',
      note: `${(zipBytes / MB).toFixed(1)} MB in ${seconds.toFixed(2)} s; first byte ${firstByteMs.toFixed(0)} ms`,
    });
    if (csv) {
      report.target(
        {
          scenario,
          metric: 'uncompressed results.csv',
          value: csv.originalSize / MB / seconds,
          unit: 'MB/s',
          note: `${(csv.originalSize / MB).toFixed(1)} MB CSV${info.rows !== undefined ? `, manifest rows ${info.rows}` : ''}`,
        },
        '≥',
        20,
        '20 MB/s',
      );
    } else {
      report.add({
        scenario,
        metric: 'uncompressed results.csv',
        value: 'not in zip',
        unit: '',
        note: info.files.map((f) => f.name).join(', '),
      });
    }
    report.target(
      {
        scenario,
        metric: 'api RSS growth during export',
        value: mem.growthMB,
        unit: 'MB',
        note: `${mem.baselineMB.toFixed(0)} → peak ${mem.peakMB.toFixed(0)} MB`,
      },
      '<',
      100,
      '100 MB',
    );
    report.detail('export', {
      available: true,
      seconds,
      zipBytes,
      firstByteMs,
      files: info.files,
      manifestRows: info.rows,
      rss: mem,
    });
  } finally {
    removeDir(dir);
  }
}

/** Streams the response body to `file`; a non-2xx body is read and dropped. */
async function download(
  url: string,
  token: string,
  file: string,
  t0: number,
): Promise<{ res: Response; zipBytes: number; firstByteMs: number }> {
  const res = await fetch(url, { headers: { authorization: `Bearer ${token}` } });
  let zipBytes = 0;
  let firstByteMs = NaN;
  if (!res.ok || !res.body) {
    await res.text();
    return { res, zipBytes, firstByteMs };
  }
  const out = fs.createWriteStream(file);
  try {
    for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
      if (!zipBytes) firstByteMs = performance.now() - t0;
      zipBytes += chunk.length;
      if (!out.write(chunk)) await new Promise<void>((r) => out.once('drain', () => r()));
    }
  } finally {
    await new Promise<void>((r, j) => out.end((e?: Error | null) => (e ? j(e) : r())));
  }
  return { res, zipBytes, firstByteMs };
}

/** Entry names and sizes from the central directory; manifest.json is the only entry inflated. */
function zipContents(file: string): { files: { name: string; size: number; originalSize: number }[]; rows?: number } {
  const files: { name: string; size: number; originalSize: number }[] = [];
  const data = fs.readFileSync(file);
  const got = unzipSync(data, {
    filter: (f) => {
      files.push({ name: f.name, size: f.size, originalSize: f.originalSize });
      return f.name.endsWith('manifest.json');
    },
  });
  let rows: number | undefined;
  const manifest = Object.values(got)[0];
  if (manifest) {
    try {
      const m = JSON.parse(strFromU8(manifest)) as Record<string, unknown>;
      const r = m.rows ?? m.rowCount ?? (m.results as Record<string, unknown> | undefined)?.rows;
      if (typeof r === 'number') rows = r;
    } catch {
      /* manifest not JSON: rows unknown */
    }
  }
  return { files, rows };
}
