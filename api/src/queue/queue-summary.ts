import type { QueueChunkCounts, QueueSummary, QueueSweep } from '@driftgrid/domain';

/** Job counts as the queue library reports them, by its own state names. */
export type LibraryJobCounts = Partial<Record<string, number>>;

/** Chunk rows in SQLite by their state (`done`, `failed`, …). */
export type StoredChunkCounts = Partial<Record<string, number>>;

/**
 * The queue in our words. Waiting includes the library's prioritised jobs (a priority is still a
 * wait); retrying is the library's delayed state, which this app only uses for retry back-off.
 * Completed and failed chunks come from SQLite: the library's completed count is trimmed as jobs
 * are removed and would read 0 after nine sweeps.
 */
export function chunkCounts(library: LibraryJobCounts, stored: StoredChunkCounts): QueueChunkCounts {
  const n = (v: number | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : 0);
  return {
    waiting: n(library.waiting) + n(library.prioritized) + n(library['waiting-children']),
    computing: n(library.active),
    retrying: n(library.delayed),
    failed: n(stored.failed),
    completed: n(stored.done),
  };
}

export function queueSummary(input: {
  mode: QueueSummary['mode'];
  paused: boolean;
  library: LibraryJobCounts;
  stored: StoredChunkCounts;
  sweeps: QueueSweep[];
}): QueueSummary {
  const sweeps = [...input.sweeps].sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id - b.id);
  return {
    mode: input.mode,
    paused: input.paused,
    chunks: chunkCounts(input.library, input.stored),
    sweepsQueued: sweeps.filter((s) => s.status === 'queued').length,
    sweepsRunning: sweeps.filter((s) => s.status === 'running').length,
    sweeps,
  };
}
