import { describe, expect, it } from 'vitest';
import { chunkCounts, queueSummary } from './queue-summary.js';

describe('queue summary in our words', () => {
  it('maps the library states onto waiting, computing, retrying and takes finished chunks from SQLite', () => {
    expect(
      chunkCounts(
        { waiting: 3, prioritized: 2, active: 1, delayed: 4, failed: 9, completed: 0 },
        { done: 120, failed: 2, queued: 5 },
      ),
    ).toEqual({ waiting: 5, computing: 1, retrying: 4, failed: 2, completed: 120 });
    // Missing or odd values count as 0 rather than NaN.
    expect(chunkCounts({}, {})).toEqual({ waiting: 0, computing: 0, retrying: 0, failed: 0, completed: 0 });
  });

  it('counts queued and running sweeps and lists them oldest first, with no library word in the shape', () => {
    const s = queueSummary({
      mode: 'embedded',
      paused: true,
      library: { waiting: 1, active: 2 },
      stored: { done: 7 },
      sweeps: [
        {
          id: 2,
          name: 'b',
          status: 'running',
          owner: 'R',
          progress: { done: 1, total: 9 },
          createdAt: '2026-01-02T00:00:00.000Z',
        },
        {
          id: 1,
          name: 'a',
          status: 'queued',
          owner: 'R',
          progress: { done: 0, total: 9 },
          createdAt: '2026-01-01T00:00:00.000Z',
        },
      ],
    });
    expect(s.sweeps.map((x) => x.id)).toEqual([1, 2]);
    expect([s.sweepsQueued, s.sweepsRunning]).toEqual([1, 1]);
    expect(JSON.stringify(s)).not.toMatch(/"(active|delayed|prioritized|wait)"/);
  });
});
