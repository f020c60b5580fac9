// Throughput of BullMQ on the embedded Redis and on a real redis-server (figures printed,
// nothing asserted). Run: npx tsx tests/queue/bench.ts [jobs] [concurrency]
import { Queue, Worker } from 'bullmq';
import { embeddedBackend, realBackend, type QueueBackend } from './backends.js';

const JOBS = Number(process.argv[2] ?? 1000);
const CONCURRENCY = Number(process.argv[3] ?? 8);

async function measure(backend: QueueBackend): Promise<void> {
  const prefix = `dgbench-${process.pid}`;
  const name = `bench-${backend.name}`;
  const q = new Queue(name, { connection: backend.connect(), prefix });
  await q.obliterate({ force: true });
  const t0 = performance.now();
  await q.addBulk(Array.from({ length: JOBS }, (_, i) => ({ name: 'j', data: { i } })));
  const tAdded = performance.now();
  let done = 0;
  let resolveAll: () => void = () => undefined;
  const all = new Promise<void>((r) => (resolveAll = r));
  const w = new Worker(name, async (job) => ({ i: job.data.i }), {
    connection: backend.connect(),
    prefix,
    concurrency: CONCURRENCY,
  });
  w.on('completed', () => {
    if (++done === JOBS) resolveAll();
  });
  await all;
  const tDone = performance.now();
  const addRate = JOBS / ((tAdded - t0) / 1000);
  const procRate = JOBS / ((tDone - tAdded) / 1000);
  console.log(
    `${backend.name.padEnd(13)} addBulk ${addRate.toFixed(0).padStart(6)} jobs/s   process ${procRate.toFixed(0).padStart(6)} jobs/s   (${JOBS} jobs, concurrency ${CONCURRENCY})`,
  );
  await w.close();
  await q.obliterate({ force: true });
  await q.close();
  await backend.shutdown();
}

await measure(embeddedBackend());
const real = await realBackend();
if (real) await measure(real);
else console.log('redis-server    not available, skipped');
