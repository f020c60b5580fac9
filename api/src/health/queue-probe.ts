/** Anything that can report the queue's state for /api/health (QueueModule provides one). */
export abstract class QueueProbe {
  abstract probe(): Promise<{ status: 'ok' | 'down'; mode: string }>;
}
