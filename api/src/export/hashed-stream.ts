import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';

export interface StreamDigest {
  sha256: string;
  bytes: number;
  /** Data lines written (rows, not counting a header). */
  rows: number;
}

/** Text pieces of a CSV file: each piece carries how many data rows it holds. */
export type CsvPieces = Iterator<{ text: string; rows: number }>;

/**
 * A Readable over CSV pieces that hashes (SHA-256) exactly the bytes it emits. Pieces are pulled
 * only when the consumer asks (read()), so memory holds one piece at a time whatever the file size.
 * `digest` resolves once the last byte has been read.
 */
export function hashedCsvStream(pieces: CsvPieces): { stream: Readable; digest: Promise<StreamDigest> } {
  const hash = createHash('sha256');
  let bytes = 0;
  let rows = 0;
  let settle!: (d: StreamDigest) => void;
  let fail!: (e: Error) => void;
  const digest = new Promise<StreamDigest>((resolve, reject) => {
    settle = resolve;
    fail = reject;
  });
  digest.catch(() => undefined); // a consumer that aborts need not await it
  const stream = new Readable({
    highWaterMark: 256 * 1024,
    read() {
      try {
        for (;;) {
          const next = pieces.next();
          if (next.done) {
            settle({ sha256: hash.digest('hex'), bytes, rows });
            this.push(null);
            return;
          }
          if (!next.value.text) continue;
          const buf = Buffer.from(next.value.text, 'utf8');
          hash.update(buf);
          bytes += buf.length;
          rows += next.value.rows;
          if (!this.push(buf)) return;
        }
      } catch (err) {
        fail(err as Error);
        this.destroy(err as Error);
      }
    },
    destroy(err, cb) {
      pieces.return?.();
      if (err) fail(err);
      else fail(new Error('stream closed before the end'));
      cb(err);
    },
  });
  return { stream, digest };
}
