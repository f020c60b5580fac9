/**
 * Quick one-core throughput check of the chunk evaluators (not a test; timings are never
 * asserted). Run: npx tsx domain/bench/kernels.ts
 */
import { allocateChunk, getModel } from '../src/models/index.js';

function bench(id: string, n: number, vary: (name: string, k: number) => number | undefined, reps: number): void {
  const model = getModel(id);
  const inputs: Record<string, Float64Array> = {};
  for (const spec of model.inputs) {
    const col = new Float64Array(n);
    for (let k = 0; k < n; k++) col[k] = vary(spec.name, k) ?? spec.default;
    inputs[spec.name] = col;
  }
  const out = allocateChunk(model, n);
  model.evaluateChunk(inputs, n, out); // warm-up
  const t0 = performance.now();
  for (let r = 0; r < reps; r++) model.evaluateChunk(inputs, n, out);
  const dt = (performance.now() - t0) / 1000;
  console.log(`${id.padEnd(18)} ${((n * reps) / dt).toExponential(3)} points/s  (${n} points x ${reps})`);
}

const N = 100_000;
bench(
  'cross-field',
  N,
  (name, k) => (name === 'Te_eV' ? 1 + (k % 1000) : name === 'B_T' ? 0.1 + (k % 50) * 0.1 : undefined),
  30,
);
bench(
  'parallel-balance',
  N,
  (name, k) => (name === 'phi_V' ? -20 + (k % 400) * 0.1 : name === 'gamma_e' ? 1 + (k % 3) * 0.3 : undefined),
  30,
);
bench(
  'column-profile',
  20_000,
  (name, k) => (name === 'Te0_eV' ? 1 + (k % 100) : name === 'gamma_e' ? 1 + (k % 3) * 0.3 : undefined),
  3,
);
