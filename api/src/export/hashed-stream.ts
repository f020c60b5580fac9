import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';

export interface StreamDigest {
  sha256: string;
  bytes: number;
  /** Data lines written (rows, not counting a header). */
  rows: number;
}

/** One piece of a CSV file, as text or as UTF-8 bytes, and how many data rows it holds. */
export type CsvPiece = { rows: number } & ({ text: string } | { bytes: Uint8Array });
/** Text pieces of a CSV file, made on the spot (sync) or elsewhere, such as on a read thread (async). */
export type CsvPieces = Iterator<CsvPiece> | AsyncIterator<CsvPiece>;

/**
 * A Readable over CSV pieces that hashes (SHA-256) exactly the bytes it emits. Pieces are pulled
 * only when the consumer asks (read()), so memory holds a piece or two whatever the file size.
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
  // One pull loop at a time; a read() that arrives while it awaits a piece sets `wanted`, which the
  // loop honours before it stops, so no call to read() is lost.
  let pulling = false;
  let wanted = false;
  const stream: Readable = new Readable({
    highWaterMark: 256 * 1024,
    read() {
      wanted = true;
      if (!pulling) void pull();
    },
    destroy(err, cb) {
      void Promise.resolve(pieces.return?.()).catch(() => undefined);
      if (err) fail(err);
      else fail(new Error('stream closed before the end'));
      cb(err);
    },
  });
  /** Pushes pieces until the consumer's buffer is full (and not asked for more) or the CSV ends. */
  async function pull(): Promise<void> {
    pulling = true;
    try {
      while (wanted && !stream.destroyed) {
        wanted = false;
        for (;;) {
          const next = await pieces.next();
          if (stream.destroyed) return;
          if (next.done) {
            settle({ sha256: hash.digest('hex'), bytes, rows });
            stream.push(null);
            return;
          }
          const piece = next.value;
          const buf =
            'bytes' in piece
              ? Buffer.from(piece.bytes.buffer, piece.bytes.byteOffset, piece.bytes.byteLength)
              : Buffer.from(piece.text, 'utf8');
          if (buf.length === 0) continue;
          hash.update(buf);
          bytes += buf.length;
          rows += piece.rows;
          if (!stream.push(buf)) break;
        }
      }
    } catch (err) {
      fail(err as Error);
      stream.destroy(err as Error);
    } finally {
      pulling = false;
    }
  }
  return { stream, digest };
}
