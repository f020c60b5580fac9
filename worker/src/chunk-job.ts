/** What a chunk job carries: enough to compute its points with no database access. */
export interface ChunkJobData {
  sweepId: number;
  chunkIndex: number;
  i0: number;
  i1: number;
  /** The sweep definition as stored (JSON object); compiled once per worker thread and cached. */
  definition: unknown;
  /** Cheap cache key for the compiled definition. */
  definitionHash: string;
  /**
   * The model version the sweep was created with. A worker whose registry has moved on refuses the
   * chunk rather than fill the sweep's stored column layout with another version's outputs.
   * Optional only so that jobs queued by an older api are still read.
   */
  modelVersion?: string;
}

/** A computed chunk on the wire: typed arrays as base64 so JSON-only Redis values carry them compactly. */
export interface ChunkResultPayload {
  sweepId: number;
  chunkIndex: number;
  i0: number;
  n: number;
  /** Column name → base64 of a little-endian Float64Array of length n (the array itself in-process). */
  columns: Record<string, string | Float64Array>;
  /** base64 of a Uint32Array of flag bit masks (the array itself in-process). */
  flags: string | Uint32Array;
  workerId: string;
  computeMs: number;
  attempt: number;
}

export function chunkJobId(sweepId: number, chunkIndex: number): string {
  return `s${sweepId}-c${chunkIndex}`;
}
