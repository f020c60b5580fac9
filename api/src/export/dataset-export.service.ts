import { Inject, Injectable } from '@nestjs/common';
import type { DatasetColumn } from '@driftgrid/domain';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { DatasetsRepository, type DatasetRow } from '../datasets/datasets.repository.js';
import { columnsOf } from '../datasets/datasets.service.js';
import { csvLine, slugify, textCell, textLine } from './csv-format.js';
import { datasetReadme } from './export-texts.js';
import { ExportRepository } from './export.repository.js';
import type { CsvPieces, StreamDigest } from './hashed-stream.js';
import { buildZip } from './zip-builder.js';

const ROWS_PER_PIECE = 2000;

/** One dataset row as CSV: numbers at full precision, text neutralised against formulas and quoted. */
function datasetLine(cells: readonly (number | string | null)[], kinds: readonly DatasetColumn['kind'][]): string {
  let s = '';
  for (let j = 0; j < kinds.length; j++) {
    if (j > 0) s += ',';
    const v = cells[j];
    if (v === null || v === undefined) continue;
    s += typeof v === 'number' ? String(v) : textCell(v);
  }
  return s + '\n';
}

/** The zipped-CSV export of an uploaded dataset: data.csv, columns.csv, README.txt, manifest.json. */
@Injectable()
export class DatasetExportBuilder {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly datasets: DatasetsRepository,
    private readonly exportRepo: ExportRepository,
  ) {}

  fileName(d: DatasetRow): string {
    return `${slugify(d.name, 'dataset')}-${d.id}.zip`;
  }

  build(d: DatasetRow, exportedAt: number) {
    const columns = columnsOf(d);
    const kinds = columns.map((c) => c.kind);
    const owner = this.exportRepo.userName(d.ownerId);
    const fits = this.exportRepo.fitsOf('dataset', d.id);
    const manifest = (csv: StreamDigest) => ({
      format: { name: 'driftgrid-dataset-export', version: 1 },
      dataset: {
        id: d.id,
        name: d.name,
        fileName: d.fileName,
        visibility: d.visibility,
        rows: d.rows,
        uploadSha256: d.sha256,
      },
      owner: { id: d.ownerId, name: owner },
      exportedWith: { appVersion: this.config.appVersion },
      times: { createdAt: new Date(d.createdAt).toISOString(), exportedAt: new Date(exportedAt).toISOString() },
      data: { file: 'data.csv', rows: csv.rows, columns: columns.length, bytes: csv.bytes, sha256: csv.sha256 },
      columns,
      fits,
    });
    const columnsCsv =
      csvLine(['name', 'kind', 'unit', 'uploaded_unit', 'quantity']) +
      // Names and units are user text: the same formula guard as the data file's cells and header.
      columns.map((c) => textLine([c.name, c.kind, c.canonicalUnit, c.unit, c.quantity ?? ''])).join('');
    const readme = datasetReadme({
      name: d.name,
      id: d.id,
      rows: d.rows,
      fileName: d.fileName,
      columns: columns.map((c) => ({ name: c.name, unit: c.canonicalUnit, kind: c.kind, meaning: describe(c) })),
    });
    return buildZip({
      date: new Date(d.createdAt),
      csvName: 'data.csv',
      csv: this.pieces(d, columns, kinds),
      texts: [
        { name: 'columns.csv', content: columnsCsv },
        { name: 'README.txt', content: readme },
      ],
      manifest,
    });
  }

  private *pieces(d: DatasetRow, columns: DatasetColumn[], kinds: DatasetColumn['kind'][]): CsvPieces {
    // Header names are user text too: they get the same formula guard as cells.
    yield { text: columns.map((c) => textCell(c.name)).join(',') + '\n', rows: 0 };
    let text = '';
    let n = 0;
    for (const cells of this.datasets.iterateRows(d.id)) {
      text += datasetLine(cells, kinds);
      if (++n === ROWS_PER_PIECE) {
        yield { text, rows: n };
        text = '';
        n = 0;
      }
    }
    if (n) yield { text, rows: n };
  }
}

function describe(c: DatasetColumn): string {
  if (c.kind === 'text') return 'Text, as uploaded.';
  const q = c.quantity ? `${c.quantity[0].toUpperCase()}${c.quantity.slice(1)}` : 'Number';
  return c.unit && c.unit !== c.canonicalUnit
    ? `${q}; uploaded in ${c.unit}, converted to ${c.canonicalUnit}.`
    : `${q}.`;
}
