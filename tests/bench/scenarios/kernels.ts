/**
 * Scenario 1: kernel points/s. (a) allocateChunk + model.evaluateChunk on one chunk of columns per
 * model, (b) the sweep chunk evaluator compileSweep(def).evaluateChunk over a whole grid in chunks of
 * the default chunk size (axis decoding, expressions and flags included). One warm-up, then a median.
 */
import { allocateChunk, compileSweep, DEFAULT_CHUNK_SIZE, getModel, type ModelDefinition } from '@driftgrid/domain';
import type { BenchConfig } from '../lib/config.js';
import { columnProfileGrid, crossFieldGrid, parallelBalanceGrid } from '../lib/definitions.js';
import type { Report } from '../lib/report.js';
import { median } from '../lib/stats.js';

const TARGETS: Record<string, { limit: number; text: string }> = {
  'cross-field': { limit: 3e6, text: '3 M/s' },
  'column-profile': { limit: 30e3, text: '30 k/s' },
};

/** Input columns near each default (±25 %, deterministic), kept inside the declared ranges. */
function inputColumns(model: ModelDefinition, n: number): Record<string, Float64Array> {
  const cols: Record<string, Float64Array> = {};
  for (const spec of model.inputs) {
    const c = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let v = spec.default;
      if (!spec.integer && spec.name !== 'mu' && spec.name !== 'Z')
        v = spec.default * (0.75 + 0.5 * ((i * 0.6180339887) % 1));
      if (v > spec.max || v < spec.min || (spec.minExclusive && v <= spec.min)) v = spec.default;
      c[i] = v;
    }
    cols[spec.name] = c;
  }
  if (cols.nr) cols.nr.fill(256);
  return cols;
}

function kernelRate(modelId: string, n: number, runs: number): { pointsPerSec: number; runsMs: number[] } {
  const model = getModel(modelId);
  const inputs = inputColumns(model, n);
  const ms: number[] = [];
  for (let r = 0; r <= runs; r++) {
    const t0 = performance.now();
    const out = allocateChunk(model, n);
    model.evaluateChunk(inputs, n, out);
    const dt = performance.now() - t0;
    if (r > 0) ms.push(dt); // run 0 warms the JIT
  }
  return { pointsPerSec: n / (median(ms) / 1000), runsMs: ms };
}

function compiledRate(def: unknown, runs: number): { points: number; pointsPerSec: number; runsMs: number[] } {
  const compiled = compileSweep(def);
  const total = compiled.totalPoints;
  const ms: number[] = [];
  for (let r = 0; r <= runs; r++) {
    const t0 = performance.now();
    // Warm-up pass over a tenth of the grid only; measured passes cover every point.
    const end = r === 0 ? Math.max(1, Math.floor(total / 10)) : total;
    for (let i0 = 0; i0 < end; i0 += DEFAULT_CHUNK_SIZE)
      compiled.evaluateChunk(i0, Math.min(end, i0 + DEFAULT_CHUNK_SIZE));
    if (r > 0) ms.push(performance.now() - t0);
  }
  return { points: total, pointsPerSec: total / (median(ms) / 1000), runsMs: ms };
}

export function benchKernels(cfg: BenchConfig, report: Report): void {
  console.log('\n[1] kernels (this process, one core)');
  const scenario = '1 kernel';
  const detail: Record<string, unknown> = {};
  for (const id of ['cross-field', 'parallel-balance', 'column-profile'] as const) {
    const n = cfg.kernelChunk[id];
    const r = kernelRate(id, n, cfg.kernelRuns);
    detail[`${id}.evaluateChunk`] = { n, ...r };
    const row = {
      scenario,
      metric: `${id} evaluateChunk (${n.toLocaleString('en-US')}-pt chunk${id === 'column-profile' ? ', nr 256' : ''})`,
      value: r.pointsPerSec,
      unit: 'points/s',
    };
    const t = TARGETS[id];
    if (t) report.target(row, '≥', t.limit, t.text);
    else report.add(row);
  }
  const sweeps: [string, unknown][] = [
    ['cross-field', crossFieldGrid(cfg.compiledGrid)],
    ['parallel-balance', parallelBalanceGrid(cfg.compiledGrid)],
    ['column-profile', columnProfileGrid(cfg.compiledGridProfile)],
  ];
  // Whole-grid passes are long: three runs at most.
  const runs = Math.min(cfg.kernelRuns, 3);
  for (const [id, def] of sweeps) {
    const r = compiledRate(def, runs);
    detail[`${id}.compiledSweep`] = { chunk: DEFAULT_CHUNK_SIZE, ...r };
    report.add({
      scenario,
      metric: `${id} compileSweep().evaluateChunk, ${r.points.toLocaleString('en-US')}-pt grid`,
      value: r.pointsPerSec,
      unit: 'points/s',
      note: `chunks of ${DEFAULT_CHUNK_SIZE}`,
    });
  }
  report.detail('kernels', detail);
}
