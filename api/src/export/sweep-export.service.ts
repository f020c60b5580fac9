import { Inject, Injectable } from '@nestjs/common';
import { getModel, type ModelDefinition } from '@driftgrid/domain';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { layoutOf } from '../sweeps/results-reader.js';
import type { StoredColumn } from '../sweeps/sweep-layout.js';
import type { SweepRow } from '../sweeps/sweeps.repository.js';
import { SweepsRepository } from '../sweeps/sweeps.repository.js';
import { HeavyReads } from '../reads/heavy-reads.js';
import type { ExportBatchTask, ReadResultOf } from '../reads/read-tasks.js';
import { ReadBudgetError, ReadBusyError, ReadLimitError } from '../reads/read-errors.js';
import { csvLine, slugify, textLine } from './csv-format.js';
import { sweepReadme } from './export-texts.js';
import { ExportRepository } from './export.repository.js';
import type { CsvPiece, StreamDigest } from './hashed-stream.js';
import { buildZip } from './zip-builder.js';

/**
 * Rows per export batch. A batch is read and formatted on a read thread; the api thread only hashes,
 * compresses and sends its text (about 0.25 MB for 1,000 rows of 40 columns).
 */
export const EXPORT_BATCH = 1000;
/**
 * How long an export waits, in all, for room on the read pool (its user's other large reads, or a busy
 * pool) before the download fails: a batch is never refused mid-file the way a page would be.
 */
const EXPORT_PATIENCE_MS = 120_000;
const RETRY_MS = 250;
/**
 * Time allowed per batch, the wait for a thread included. A batch is a few ms of work, so running out
 * means it queued behind long sorts: it is asked again (within EXPORT_PATIENCE_MS) rather than failing.
 */
const BATCH_BUDGET_MS = 30_000;

/** Format marker in manifest.json, bumped when its shape changes. */
export const MANIFEST_FORMAT = { name: 'driftgrid-sweep-export', version: 1 } as const;

const iso = (ms: number | null | undefined) => (ms ? new Date(ms).toISOString() : null);

function modelOf(id: string): ModelDefinition | null {
  try {
    return getModel(id);
  } catch {
    return null;
  }
}

/** Builds the zipped-CSV export of a sweep (SPEC §7): results.csv, columns.csv, README.txt, manifest.json. */
@Injectable()
export class SweepExportBuilder {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly rows: ExportRepository,
    private readonly sweeps: SweepsRepository,
    private readonly reads: HeavyReads,
  ) {}

  fileName(s: SweepRow): string {
    return `${slugify(s.name, 'sweep')}-${s.id}.zip`;
  }

  /**
   * The zip as a stream. `archivedAt` is set when building the frozen archive (the sweep row still
   * says completed at that moment); `exportedAt` is when the bytes are produced; `userId` is whose
   * read-pool share the rows are read on.
   */
  build(s: SweepRow, opts: { exportedAt: number; archivedAt?: number; userId: number }) {
    const layout = layoutOf(s);
    const model = modelOf(s.model);
    const columns = layout.map(({ slot: _slot, ...c }) => c);
    const owner = this.rows.userName(s.ownerId);
    const fits = this.rows.fitsOf('sweep', s.id);
    const archivedAt = opts.archivedAt ?? s.archivedAt ?? null;
    const modelInfo = { id: s.model, title: model?.title ?? s.model, version: s.modelVersion };

    const manifest = (csv: StreamDigest) => ({
      format: MANIFEST_FORMAT,
      sweep: {
        id: s.id,
        name: s.name,
        status: archivedAt ? 'archived' : s.status,
        visibility: s.visibility,
        tags: this.sweeps.tags(s.id),
        points: s.points,
        invalidPoints: s.invalidPoints,
        flagCounts: JSON.parse(s.flagCounts) as unknown,
      },
      owner: { id: s.ownerId, name: owner },
      model: modelInfo,
      appVersion: s.appVersion,
      exportedWith: { appVersion: this.config.appVersion },
      times: {
        createdAt: iso(s.createdAt),
        startedAt: iso(s.startedAt),
        finishedAt: iso(s.finishedAt),
        archivedAt: iso(archivedAt),
        exportedAt: iso(opts.exportedAt),
      },
      provenance: { computeMs: Math.round(s.computeMs), workers: this.sweeps.workerSummary(s.id) },
      definition: JSON.parse(s.definition) as unknown,
      results: { file: 'results.csv', rows: csv.rows, columns: columns.length, bytes: csv.bytes, sha256: csv.sha256 },
      columns,
      flags: model?.flags ?? [],
      fits,
    });

    const readme = sweepReadme({
      name: s.name,
      id: s.id,
      model: modelInfo,
      appVersion: s.appVersion,
      rows: s.pointsDone,
      columns,
      flags: model?.flags ?? [],
      archived: archivedAt !== null,
    });
    const columnsCsv =
      csvLine(['name', 'unit', 'meaning']) + columns.map((c) => textLine([c.name, c.unit, c.meaning])).join('');

    return buildZip({
      date: new Date(s.finishedAt ?? s.createdAt),
      csvName: 'results.csv',
      csv: this.csvPieces(s, layout, opts.userId),
      texts: [
        { name: 'columns.csv', content: columnsCsv },
        { name: 'README.txt', content: readme },
      ],
      manifest,
    });
  }

  /**
   * The CSV: the header, then batches read and formatted on the read pool, one batch requested ahead
   * so formatting overlaps compression. Stopped early (a download that went away), nothing more is read.
   */
  private async *csvPieces(s: SweepRow, layout: StoredColumn[], userId: number): AsyncGenerator<CsvPiece> {
    yield { text: textLine(layout.map((c) => c.name)), rows: 0 };
    let ahead: Promise<ExportBatch> | null = this.batch(userId, s, -1);
    try {
      while (ahead) {
        const b: ExportBatch = await ahead;
        ahead = b.next === null ? null : this.batch(userId, s, b.next);
        if (b.rows) yield { bytes: b.bytes, rows: b.rows };
      }
    } finally {
      // Abandoned: the batch asked ahead is dropped (its failure, if any, matters to nobody).
      void ahead?.catch(() => undefined);
    }
  }

  /** One batch, waiting (up to EXPORT_PATIENCE_MS in all) while the pool or the user's share is full or slow. */
  private async batch(userId: number, s: SweepRow, after: number): Promise<ExportBatch> {
    const deadline = Date.now() + EXPORT_PATIENCE_MS;
    for (;;) {
      try {
        return await this.reads.run(
          userId,
          { kind: 'exportBatch', sweep: s, after, limit: EXPORT_BATCH },
          { budgetMs: BATCH_BUDGET_MS },
        );
      } catch (e) {
        // A batch is an idempotent read: asked again when the pool had no room for it in time.
        const busy = e instanceof ReadLimitError || e instanceof ReadBusyError || e instanceof ReadBudgetError;
        if (!busy || Date.now() > deadline) throw e;
        await new Promise((r) => setTimeout(r, RETRY_MS));
      }
    }
  }
}

type ExportBatch = ReadResultOf<ExportBatchTask>;
