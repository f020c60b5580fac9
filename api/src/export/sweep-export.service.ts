import { Inject, Injectable } from '@nestjs/common';
import { getModel, type ModelDefinition } from '@driftgrid/domain';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { layoutOf } from '../sweeps/results-reader.js';
import type { StoredColumn } from '../sweeps/sweep-layout.js';
import type { SweepRow } from '../sweeps/sweeps.repository.js';
import { SweepsRepository } from '../sweeps/sweeps.repository.js';
import { csvLine, formatBatch, slugify, textLine } from './csv-format.js';
import { sweepReadme } from './export-texts.js';
import { ExportRepository } from './export.repository.js';
import type { CsvPieces, StreamDigest } from './hashed-stream.js';
import { buildZip } from './zip-builder.js';

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
  ) {}

  fileName(s: SweepRow): string {
    return `${slugify(s.name, 'sweep')}-${s.id}.zip`;
  }

  /**
   * The zip as a stream. `archivedAt` is set when building the frozen archive (the sweep row still
   * says completed at that moment); `exportedAt` is when the bytes are produced.
   */
  build(s: SweepRow, opts: { exportedAt: number; archivedAt?: number }) {
    const layout = layoutOf(s);
    const model = modelOf(s.model);
    const columns = layout.map(({ slot: _slot, ...c }) => c);
    const booleans = layout.flatMap((c, j) => (c.type === 'boolean' ? [j] : []));
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
      csv: this.csvPieces(s, layout, booleans),
      texts: [
        { name: 'columns.csv', content: columnsCsv },
        { name: 'README.txt', content: readme },
      ],
      manifest,
    });
  }

  private *csvPieces(s: SweepRow, layout: StoredColumn[], booleans: number[]): CsvPieces {
    yield { text: textLine(layout.map((c) => c.name)), rows: 0 };
    for (const batch of this.rows.sweepRows(s)) yield { text: formatBatch(batch, booleans), rows: batch.length };
  }
}
