import { PassThrough } from 'node:stream';
import { ZipArchive } from 'archiver';
import { hashedCsvStream, type CsvPieces, type StreamDigest } from './hashed-stream.js';

/**
 * Deflate level for exports. Level 1 keeps the zip within ~10-15 % of level 6 on numeric CSV while
 * compressing several times faster, which is what lets a million-row export stream at tens of MB/s.
 */
export const ZIP_LEVEL = 1;

export interface ZipPlan {
  /** Modification time stamped on every entry (the sweep's finish time), so rebuilds differ only in content. */
  date: Date;
  csvName: string;
  /** The CSV body, header line first. */
  csv: CsvPieces;
  /** Small text entries written after the CSV and before the manifest. */
  texts: { name: string; content: string }[];
  /** Builds manifest.json once the CSV has been streamed and hashed. */
  manifest: (csv: StreamDigest) => unknown;
}

/**
 * A streamed zip: the CSV entry first (hashed as it is compressed), then the text entries, then
 * manifest.json holding the CSV's SHA-256. archiver writes entries strictly in order, so the
 * manifest's stream is only read after the CSV has ended and its digest is known.
 */
export function buildZip(plan: ZipPlan): { zip: ZipArchive; csv: Promise<StreamDigest> } {
  const zip = new ZipArchive({ zlib: { level: ZIP_LEVEL } });
  const { stream, digest } = hashedCsvStream(plan.csv);
  const manifest = new PassThrough();
  digest.then(
    (d) => {
      try {
        manifest.end(JSON.stringify(plan.manifest(d), null, 2) + '\n');
      } catch (err) {
        fail(err as Error);
      }
    },
    (err: Error) => fail(err),
  );
  // The manifest is piped inside archiver, which does not forward its errors: fail the zip instead.
  function fail(err: Error) {
    manifest.destroy();
    if (!zip.destroyed) zip.destroy(err);
  }
  // A download that is abandoned destroys the zip; stop reading rows too.
  zip.once('close', () => stream.destroy());
  zip.append(stream, { name: plan.csvName, date: plan.date });
  for (const t of plan.texts) zip.append(t.content, { name: t.name, date: plan.date });
  zip.append(manifest, { name: 'manifest.json', date: plan.date });
  void zip.finalize().catch(() => undefined);
  return { zip, csv: digest };
}
