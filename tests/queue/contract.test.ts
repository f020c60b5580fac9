// BullMQ behaviour contract, run against the embedded Redis and a real redis-server, so
// that an upgrade of bullmq / ioredis-mock / fengari that breaks the embedded layer fails
// here. Expected behaviours are BullMQ's documented semantics (docs.bullmq.io: retries with
// fixed/exponential backoff, delayed and prioritised jobs, pause, drain, obliterate, lock
// renewal), checked identically on both backends.
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { Queue, QueueEvents, Worker, type Job, type Processor, type WorkerOptions } from 'bullmq';
import { embeddedBackend, realBackend, type QueueBackend } from './backends.js';

const backends: QueueBackend[] = [embeddedBackend()];
const real = await realBackend();
if (real) backends.push(real);
else if (process.env.CI === 'true') {
  describe('real Redis backend', () => {
    it('is required under CI=true (set REDIS_TEST_URL or install /usr/bin/redis-server)', () => {
      expect.fail('no real Redis available for the queue contract suite');
    });
  });
} else {
  console.warn(
    '!!! queue contract: no REDIS_TEST_URL and no /usr/bin/redis-server — the real-Redis backend is SKIPPED',
  );
}

afterAll(async () => {
  for (const b of backends) await b.shutdown();
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function waitUntil(check: () => boolean | Promise<boolean>, what: string, timeoutMs = 15000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await check()) return;
    await sleep(20);
  }
  throw new Error(`timed out waiting for ${what}`);
}

describe.each(backends)('BullMQ contract on $name', (backend) => {
  const prefix = `dgc-${backend.name}-${process.pid}`;
  let counter = 0;
  const closers: Array<() => Promise<unknown>> = [];

  afterEach(async () => {
    // Workers first (they hold blocking reads), then event readers, then queues.
    for (const close of closers.splice(0).reverse()) await close();
  });

  function names(): string {
    counter += 1;
    return `q${counter}`;
  }
  function queue(name: string): Queue {
    const q = new Queue(name, { connection: backend.connect(), prefix });
    closers.push(async () => {
      await q.obliterate({ force: true }).catch(() => undefined);
      await q.close();
    });
    return q;
  }
  function worker(name: string, fn: Processor, opts: Partial<WorkerOptions> = {}): Worker {
    const w = new Worker(name, fn, { connection: backend.connect(), prefix, ...opts });
    w.on('error', () => undefined); // surfaced through job outcomes instead
    closers.push(() => w.close());
    return w;
  }
  async function events(name: string): Promise<QueueEvents> {
    // lastEventId '0' reads the stream from its start, so no event is missed while the
    // reader starts up.
    const qe = new QueueEvents(name, { connection: backend.connect(), prefix, lastEventId: '0' });
    closers.push(() => qe.close());
    await qe.waitUntilReady();
    return qe;
  }

  it('adds single and bulk jobs and counts them', async () => {
    const name = names();
    const q = queue(name);
    const one = await q.add('single', { n: 1 });
    const bulk = await q.addBulk([2, 3, 4].map((n) => ({ name: 'bulk', data: { n } })));
    expect(bulk).toHaveLength(3);
    const counts = await q.getJobCounts('waiting', 'active', 'completed');
    expect(counts).toEqual({ waiting: 4, active: 0, completed: 0 });
    const fetched = await q.getJob(one.id as string);
    expect(fetched?.data).toEqual({ n: 1 });
    expect(fetched?.name).toBe('single');
    // Ids are decimal counters; a float formatting bug would show up as "1.0".
    expect([one.id, ...bulk.map((j) => j.id)]).toEqual(['1', '2', '3', '4']);
  });

  it('runs jobs concurrently, stores return values and emits worker and queue events', async () => {
    const name = names();
    const q = queue(name);
    const qe = await events(name);
    let running = 0;
    let maxRunning = 0;
    const w = worker(
      name,
      async (job: Job) => {
        running++;
        maxRunning = Math.max(maxRunning, running);
        await job.updateProgress({ step: 1 });
        await sleep(80);
        running--;
        if (job.data.fail) throw new Error('deliberate failure');
        return { doubled: job.data.n * 2 };
      },
      { concurrency: 3 },
    );
    const workerCompleted: Array<[string, unknown]> = [];
    const workerFailed: string[] = [];
    const progress: unknown[] = [];
    w.on('completed', (job, rv) => workerCompleted.push([job.id as string, rv]));
    w.on('failed', (job, err) => workerFailed.push(`${job?.id}:${err.message}`));
    w.on('progress', (_job, p) => progress.push(p));
    const qeCompleted = new Map<string, unknown>();
    const qeFailed = new Map<string, string>();
    const qeProgress: unknown[] = [];
    qe.on('completed', ({ jobId, returnvalue }) => qeCompleted.set(jobId, returnvalue));
    qe.on('failed', ({ jobId, failedReason }) => qeFailed.set(jobId, failedReason));
    qe.on('progress', ({ data }) => qeProgress.push(data));

    await q.addBulk([1, 2, 3, 4, 5].map((n) => ({ name: 'calc', data: { n } })));
    const bad = await q.add('calc', { n: 0, fail: true });
    await waitUntil(() => qeCompleted.size === 5 && qeFailed.size === 1, 'queue events');

    expect(maxRunning).toBeGreaterThan(1);
    expect(workerCompleted).toHaveLength(5);
    expect(workerFailed).toEqual([`${bad.id}:deliberate failure`]);
    expect(qeFailed.get(bad.id as string)).toBe('deliberate failure');
    expect([...qeCompleted.values()].map((v) => (v as { doubled: number }).doubled).sort((a, b) => a - b)).toEqual([
      2, 4, 6, 8, 10,
    ]);
    expect(progress).toHaveLength(6);
    expect(qeProgress).toContainEqual({ step: 1 });
    const first = await q.getJob('1');
    expect(first?.returnvalue).toEqual({ doubled: 2 });
    expect(await first?.getState()).toBe('completed');
    expect(await q.getJobCounts('completed', 'failed')).toEqual({ completed: 5, failed: 1 });
  });

  it('retries with fixed backoff until the job succeeds', async () => {
    const name = names();
    const q = queue(name);
    const seenAttempts: number[] = [];
    worker(name, async (job: Job) => {
      seenAttempts.push(job.attemptsMade);
      if (job.attemptsMade < 2) throw new Error(`attempt ${job.attemptsMade} fails`);
      return 'third time lucky';
    });
    const job = await q.add('flaky', {}, { attempts: 3, backoff: { type: 'fixed', delay: 60 } });
    await waitUntil(async () => await job.isCompleted(), 'retried job to complete');
    const done = await q.getJob(job.id as string);
    expect(seenAttempts).toEqual([0, 1, 2]);
    expect(done?.returnvalue).toBe('third time lucky');
    expect(done?.attemptsMade).toBe(3);
  });

  it('retries with exponential backoff and fails after the last attempt', async () => {
    const name = names();
    const q = queue(name);
    const starts: number[] = [];
    worker(name, async () => {
      starts.push(Date.now());
      throw new Error('always fails');
    });
    const job = await q.add('doomed', {}, { attempts: 3, backoff: { type: 'exponential', delay: 50 } });
    await waitUntil(async () => await job.isFailed(), 'job to fail for good');
    const failed = await q.getJob(job.id as string);
    expect(failed?.attemptsMade).toBe(3);
    expect(failed?.failedReason).toBe('always fails');
    expect(starts).toHaveLength(3);
    // Exponential backoff waits delay * 2^(attempt-1): at least 50 ms, then 100 ms (BullMQ docs).
    // Lower bounds only, which a slow machine cannot break (5 ms slack for timer granularity).
    expect((starts[1] as number) - (starts[0] as number)).toBeGreaterThanOrEqual(45);
    expect((starts[2] as number) - (starts[1] as number)).toBeGreaterThanOrEqual(95);
  });

  it('holds delayed jobs until their delay has passed', async () => {
    const name = names();
    const q = queue(name);
    const job = await q.add('later', { x: 1 }, { delay: 300 });
    expect(await job.getState()).toBe('delayed');
    expect((await q.getJobCounts('delayed')).delayed).toBe(1);
    worker(name, async () => 'ran');
    await waitUntil(async () => await job.isCompleted(), 'delayed job to run');
    const done = await q.getJob(job.id as string);
    expect((done?.processedOn as number) - done!.timestamp).toBeGreaterThanOrEqual(300);
  });

  it('processes waiting jobs in priority order (lower number first)', async () => {
    const name = names();
    const q = queue(name);
    await q.add('p5', {}, { priority: 5 });
    await q.add('p1', {}, { priority: 1 });
    await q.add('p3', {}, { priority: 3 });
    await q.add('p2097151', {}, { priority: 2097151 }); // BullMQ's maximum priority (2^21 - 1)
    await q.add('p1b', {}, { priority: 1 });
    expect((await q.getJobCounts('prioritized')).prioritized).toBe(5);
    const order: string[] = [];
    worker(
      name,
      async (job: Job) => {
        order.push(job.name);
      },
      { concurrency: 1 },
    );
    await waitUntil(() => order.length === 5, 'all prioritised jobs');
    expect(order).toEqual(['p1', 'p1b', 'p3', 'p5', 'p2097151']);
  });

  it('removes jobs by id and cancels the waiting jobs of one group', async () => {
    const name = names();
    const q = queue(name);
    await q.pause();
    const jobs = await q.addBulk([
      ...['a1', 'a2', 'a3'].map((id) => ({ name: 'chunk', data: { group: 'A' }, opts: { jobId: id } })),
      ...['b1', 'b2'].map((id) => ({ name: 'chunk', data: { group: 'B' }, opts: { jobId: id } })),
    ]);
    expect(jobs.map((j) => j.id)).toEqual(['a1', 'a2', 'a3', 'b1', 'b2']);
    // Cancellation pattern: find the group's waiting jobs and remove them by id.
    const waiting = await q.getJobs(['waiting', 'delayed', 'prioritized']);
    for (const j of waiting.filter((j) => j.data.group === 'A')) await q.remove(j.id as string);
    expect(await q.getJob('a2')).toBeUndefined();
    // BullMQ 6 has no 'paused' state: a paused queue's jobs stay in its wait list.
    expect(await q.getJobCounts('waiting')).toEqual({ waiting: 2 });
    const b1 = await q.getJob('b1');
    await b1?.remove();
    expect(await q.getJob('b1')).toBeUndefined();
    await q.drain();
    const after = await q.getJobCounts('waiting', 'delayed', 'prioritized');
    expect(after).toEqual({ waiting: 0, delayed: 0, prioritized: 0 });
    await q.add('again', {});
    await q.obliterate({ force: true });
    expect(await q.getJobCounts('waiting', 'delayed', 'prioritized')).toEqual({
      waiting: 0,
      delayed: 0,
      prioritized: 0,
    });
  });

  it('renews the lock of a job that runs longer than lockDuration', async () => {
    const name = names();
    const q = queue(name);
    let runs = 0;
    const stalled: string[] = [];
    const w = worker(
      name,
      async () => {
        runs++;
        await sleep(2600);
        return 'long done';
      },
      { lockDuration: 1000, stalledInterval: 1000 },
    );
    w.on('stalled', (id) => stalled.push(id));
    const job = await q.add('long', {});
    await waitUntil(async () => await job.isCompleted(), 'long job', 20000);
    expect(runs).toBe(1);
    expect(stalled).toEqual([]);
    expect((await q.getJob(job.id as string))?.returnvalue).toBe('long done');
  });

  it('carries a large (~1.5 MB) return value through the queue', async () => {
    const name = names();
    const q = queue(name);
    const qe = await events(name);
    const payload = Buffer.from(Buffer.alloc(1_100_000, 0).map((_, i) => (i * 31 + 7) % 251)).toString('base64');
    expect(payload.length).toBeGreaterThan(1_400_000);
    worker(name, async () => ({ chunk: 7, points: payload }));
    let viaEvent: { chunk: number; points: string } | undefined;
    qe.on('completed', ({ returnvalue }) => {
      viaEvent = returnvalue as unknown as { chunk: number; points: string };
    });
    const job = await q.add('big', {});
    await waitUntil(() => viaEvent !== undefined, 'completed event with the big value');
    expect(viaEvent?.points).toBe(payload);
    const stored = await q.getJob(job.id as string);
    expect(stored?.returnvalue.points.length).toBe(payload.length);
    expect(stored?.returnvalue.points === payload).toBe(true);
  });

  it('pauses and resumes the queue', async () => {
    const name = names();
    const q = queue(name);
    const done: string[] = [];
    worker(name, async (job: Job) => {
      done.push(job.name);
    });
    await q.pause();
    expect(await q.isPaused()).toBe(true);
    await q.add('while-paused', {});
    await sleep(400);
    expect(done).toEqual([]);
    // BullMQ 5+ keeps jobs of a paused queue in its wait list (counted as waiting, not run).
    expect(await q.getJobCounts('waiting', 'active')).toEqual({ waiting: 1, active: 0 });
    await q.resume();
    await waitUntil(() => done.length === 1, 'job after resume');
    expect(done).toEqual(['while-paused']);
  });
});
