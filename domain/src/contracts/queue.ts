/**
 * GET /api/admin/queue in Driftgrid's words: chunks and sweeps, never the queue library's own job
 * states. Transient chunk states come from the queue; completed and failed chunks are counted in
 * SQLite, which keeps them (the queue trims its finished jobs, so its own counts would be wrong).
 */
import type { ActiveState } from './sweeps.js';

export interface QueueChunkCounts {
  /** Chunks handed to the queue and not yet picked up by a worker. */
  waiting: number;
  /** Chunks a worker is computing now. */
  computing: number;
  /** Chunks that failed an attempt and wait to be tried again. */
  retrying: number;
  /** Chunks that failed every attempt (their sweep failed). */
  failed: number;
  /** Chunks computed and stored, over all sweeps ever run on this server. */
  completed: number;
}

export interface QueueSweep {
  id: number;
  name: string;
  status: ActiveState;
  owner: string;
  progress: { done: number; total: number };
  createdAt: string;
}

export interface QueueSummary {
  /** `embedded`: chunks are computed inside this server; `redis`: by workers sharing a Redis server. */
  mode: 'embedded' | 'redis';
  /** Paused: no new chunk is handed out; chunks being computed finish. */
  paused: boolean;
  chunks: QueueChunkCounts;
  sweepsQueued: number;
  sweepsRunning: number;
  /** The sweeps with work outstanding, oldest first. */
  sweeps: QueueSweep[];
}
