/** Background samplers: api RSS from /proc and GET /api/health latency, while a scenario runs. */
import fs from 'node:fs';
import { Worker } from 'node:worker_threads';
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

/**
 * The probe loop, run on a thread of its own: the bench's clients share the main thread, and a probe
 * there would time their JSON parsing and callbacks too, not only the api's answer.
 */
const HEALTH_PROBE = `
const { parentPort, workerData } = require('node:worker_threads');
const { baseUrl, everyMs } = workerData;
let running = true;
const lat = [];
let errors = 0;
parentPort.on('message', () => { running = false; });
(async () => {
  while (running) {
    const t0 = performance.now();
    try {
      const r = await fetch(baseUrl + '/api/health');
      await r.arrayBuffer();
      if (r.ok) lat.push(performance.now() - t0);
      else errors++;
    } catch {
      errors++;
    }
    const wait = everyMs - (performance.now() - t0);
    if (wait > 0 && running) await new Promise((r) => setTimeout(r, wait));
  }
  parentPort.postMessage({ lat, errors });
})();
`;

/**
 * Sends GET /api/health one at a time, one every ~everyMs (back to back when a reply is late), from a
 * worker thread so that the latency is the api's, not the bench process's own event-loop delay.
 */
export function sampleHealth(baseUrl: string, everyMs = 50): { stop(): Promise<LatencySummary> } {
  const probe = new Worker(HEALTH_PROBE, { eval: true, workerData: { baseUrl, everyMs } });
  const result = new Promise<{ lat: number[]; errors: number }>((resolve, reject) => {
    probe.once('message', resolve);
    probe.once('error', reject);
  });
  return {
    async stop() {
      probe.postMessage('stop');
      const { lat, errors } = await result;
      await probe.terminate();
      return { n: lat.length, p50: percentile(lat, 50), p95: percentile(lat, 95), max: max(lat), errors };
    },
  };
}
