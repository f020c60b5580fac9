/** Sizes and repetitions for the full and the quick (BENCH_QUICK=1, CI) bench. */

export interface BenchConfig {
  quick: boolean;
  /** Points per chunk handed to model.evaluateChunk, per model. */
  kernelChunk: { 'cross-field': number; 'parallel-balance': number; 'column-profile': number };
  /** Grid size for the compiled-sweep chunk evaluator (cross-field and parallel-balance). */
  compiledGrid: number;
  /** Grid size for the compiled-sweep evaluator of column-profile (nr = 256 is ~100× slower). */
  compiledGridProfile: number;
  kernelRuns: number;
  /** Points of the end-to-end sweep (embedded and Redis). */
  sweepPoints: number;
  /** CHUNK_SIZE values tried for the embedded sweep. */
  chunkSizes: number[];
  /** Scaling table sizes and runs per size (short sizes are repeated, medians reported). */
  scaling: { points: number; runs: number }[];
  queryRuns: number;
  fitPoints: number;
  fitRuns: number;
  /** Redis scenario: worker processes and their concurrency. */
  workers: number;
  workerConcurrency: number;
}

export function benchConfig(env: NodeJS.ProcessEnv = process.env): BenchConfig {
  const quick = env.BENCH_QUICK === '1' || env.BENCH_QUICK === 'true';
  const workers = Number(env.BENCH_WORKERS ?? 2);
  const workerConcurrency = Number(env.BENCH_WORKER_CONCURRENCY ?? 1);
  if (quick) {
    return {
      quick,
      kernelChunk: { 'cross-field': 20_000, 'parallel-balance': 20_000, 'column-profile': 2_000 },
      compiledGrid: 100_000,
      compiledGridProfile: 1_000,
      kernelRuns: 3,
      sweepPoints: 20_000,
      chunkSizes: [5000],
      scaling: [
        { points: 2_000, runs: 1 },
        { points: 8_000, runs: 1 },
        { points: 20_000, runs: 1 },
      ],
      queryRuns: 3,
      fitPoints: 10_000,
      fitRuns: 1,
      workers,
      workerConcurrency,
    };
  }
  return {
    quick,
    kernelChunk: { 'cross-field': 100_000, 'parallel-balance': 100_000, 'column-profile': 5_000 },
    compiledGrid: 1_000_000,
    compiledGridProfile: 20_000,
    kernelRuns: 5,
    sweepPoints: 1_000_000,
    chunkSizes: [2000, 5000, 10000, 20000],
    scaling: [
      { points: 10_000, runs: 3 },
      { points: 100_000, runs: 3 },
      { points: 1_000_000, runs: 1 },
    ],
    queryRuns: 7,
    fitPoints: 100_000,
    fitRuns: 5,
    workers,
    workerConcurrency,
  };
}
