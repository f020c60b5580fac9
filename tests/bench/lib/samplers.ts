/** Background samplers: api RSS from /proc and GET /api/health latency, while a scenario runs. */
import fs from 'node:fs';
import { max, percentile } from './stats.js';

/** Resident set size of a process in bytes (Linux /proc), or NaN when unreadable. */
export function rssBytes(pid: number): number {
  try {
    const m = /VmRSS:\s+(\d+)\s+kB/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) * 1024 : NaN;
  } catch {
    return NaN;
  }
}

export interface RssSummary {
  baselineMB: number;
  peakMB: number;
  growthMB: number;
  samples: number;
}

/** Reads VmRSS every `everyMs` until stopped; baseline is the reading at start. */
export function sampleRss(pid: number, everyMs = 100): { stop(): RssSummary } {
  const baseline = rssBytes(pid);
  let peak = baseline;
  let samples = 1;
  const timer = setInterval(() => {
    const v = rssBytes(pid);
    if (Number.isFinite(v)) {
      samples++;
      if (!(v <= peak)) peak = v;
    }
  }, everyMs);
  return {
    stop() {
      clearInterval(timer);
      const v = rssBytes(pid);
      if (Number.isFinite(v) && !(v <= peak)) peak = v;
      const MB = 1024 * 1024;
      return { baselineMB: baseline / MB, peakMB: peak / MB, growthMB: (peak - baseline) / MB, samples };
    },
  };
}

export interface LatencySummary {
  n: number;
  p50: number;
  p95: number;
  max: number;
  errors: number;
}

/** Sends GET /api/health one at a time, one every ~everyMs (back to back when a reply is late). */
export function sampleHealth(baseUrl: string, everyMs = 50): { stop(): Promise<LatencySummary> } {
  const lat: number[] = [];
  let errors = 0;
  let running = true;
  const loop = (async () => {
    while (running) {
      const t0 = performance.now();
      try {
        const r = await fetch(`${baseUrl}/api/health`);
        await r.arrayBuffer();
        if (r.ok) lat.push(performance.now() - t0);
        else errors++;
      } catch {
        errors++;
      }
      const wait = everyMs - (performance.now() - t0);
      if (wait > 0 && running) await new Promise((r) => setTimeout(r, wait));
    }
  })();
  return {
    async stop() {
      running = false;
      await loop;
      return { n: lat.length, p50: percentile(lat, 50), p95: percentile(lat, 95), max: max(lat), errors };
    },
  };
}
