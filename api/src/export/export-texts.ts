import type { FlagSpec } from '@driftgrid/domain';

/** SPEC §11, in the words every export README carries. */
export const CAUTIONS = [
  'Results come from reduced fluid models with stated validity limits: each model assumes, among',
  'other things, that gyroradii and Debye lengths are small against gradient lengths. Points outside',
  'those limits are flagged (see "Validity flags") but are still computed; read them as indications,',
  'not predictions, and check anything that matters against a more complete model or a measurement.',
  '',
  'Work on real plasma devices - high voltage, RF power, strong magnetic fields, vacuum and',
  'cryogenics - follows local codes and licensed practice. Nothing in this export is a safety',
  'assessment or a design approval.',
];

export interface ReadmeColumn {
  name: string;
  unit: string;
  kind: string;
  meaning: string;
}

const unitText = (u: string) => (u === '' ? '(none)' : u === '1' ? '1 (dimensionless)' : u);

function wrap(text: string, indent: string, width = 96): string[] {
  const words = text.split(/\s+/).filter(Boolean);
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    if (line && indent.length + line.length + 1 + w.length > width) {
      lines.push(indent + line);
      line = w;
    } else line = line ? `${line} ${w}` : w;
  }
  if (line) lines.push(indent + line);
  return lines;
}

function columnLines(columns: readonly ReadmeColumn[]): string[] {
  return columns.flatMap((c) => [`  ${c.name}  [${unitText(c.unit)}]  (${c.kind})`, ...wrap(c.meaning, '      ')]);
}

export function sweepReadme(p: {
  name: string;
  id: number;
  model: { id: string; title: string; version: string };
  appVersion: string;
  rows: number;
  columns: readonly ReadmeColumn[];
  flags: readonly FlagSpec[];
  archived: boolean;
}): string {
  const flagLines = p.flags.length
    ? p.flags.flatMap((f) => [
        `  bit ${f.bit} (value ${2 ** f.bit})  ${f.code}${f.invalidates ? '  - marks the point invalid (valid = false)' : '  - informational'}`,
        ...wrap(f.meaning, '      '),
      ])
    : ['  This model raises no validity flags.'];
  return [
    `Driftgrid sweep export: ${p.name} (sweep ${p.id})`,
    '',
    `Model: ${p.model.title} (${p.model.id}, version ${p.model.version}); computed with Driftgrid ${p.appVersion}.`,
    `Rows: ${p.rows}. ${p.archived ? 'This is the frozen archive of the sweep: it will not change.' : 'Exported live: an archived copy, once made, is frozen.'}`,
    '',
    'Files',
    '  results.csv    one row per sweep point; the first line names the columns.',
    '  columns.csv    name, unit and meaning of every column (units are canonical: SI, temperatures in eV).',
    '  manifest.json  the sweep definition, model and app versions, row count, times, owner, the fits',
    '                 attached to the sweep, and the SHA-256 of results.csv (check: sha256sum results.csv).',
    '  README.txt     this file.',
    '',
    'Numbers',
    '  Values are written at full precision (the shortest decimal that reads back to the same',
    '  double). Values that are not finite numbers are written Infinity, -Infinity or NaN.',
    '  Boolean columns hold true or false.',
    '',
    'Columns',
    ...columnLines(p.columns),
    '',
    'Validity flags',
    '  The column "flags" is a bit mask: add the values of the flags raised at that point.',
    ...flagLines,
    '',
    'Cautions',
    ...CAUTIONS.map((l) => (l ? `  ${l}` : '')),
    '',
  ].join('\n');
}

export function datasetReadme(p: {
  name: string;
  id: number;
  rows: number;
  fileName: string | null;
  columns: readonly ReadmeColumn[];
}): string {
  return [
    `Driftgrid dataset export: ${p.name} (dataset ${p.id})`,
    '',
    `Uploaded file: ${p.fileName ?? '(unnamed)'}. Rows: ${p.rows}.`,
    '',
    'Files',
    '  data.csv       the rows; numeric columns converted to canonical units (SI, temperatures in eV).',
    '  columns.csv    name, kind, canonical unit, unit as uploaded and recognised quantity of every column.',
    '  manifest.json  dataset metadata, the SHA-256 of the uploaded file and of data.csv, and attached fits.',
    '  README.txt     this file.',
    '',
    'Text cells',
    '  Text that begins with =, +, -, @, a tab or a carriage return is written with a leading single',
    '  quote (the OWASP "CSV Injection" advice) so that a spreadsheet shows it as text and never runs it.',
    '  Empty numeric cells are missing values.',
    '',
    'Columns',
    ...columnLines(p.columns),
    '',
    'Cautions',
    ...CAUTIONS.map((l) => (l ? `  ${l}` : '')),
    '',
  ].join('\n');
}
