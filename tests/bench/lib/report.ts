/** Collects figures as table rows (printed at the end) and raw details (written to JSON). */

export interface Row {
  scenario: string;
  metric: string;
  /** Number, or a text such as "not available" / "skipped". */
  value: number | string;
  unit: string;
  /** Target as printed, e.g. "≥ 3 M/s"; empty when there is none. */
  target?: string;
  /** True/false when a numeric target applies; undefined otherwise. Printed, never asserted. */
  met?: boolean;
  note?: string;
}

export class Report {
  readonly rows: Row[] = [];
  readonly details: Record<string, unknown> = {};
  readonly notes: string[] = [];

  add(row: Row): void {
    this.rows.push(row);
    const v = typeof row.value === 'number' ? fmt(row.value) : row.value;
    console.log(
      `  ${row.scenario} · ${row.metric}: ${v} ${row.unit}${row.target ? `  (target ${row.target})` : ''}${row.note ? `  — ${row.note}` : ''}`,
    );
  }

  /** A figure with a "lower is better" or "higher is better" target. */
  target(row: Omit<Row, 'met' | 'target'>, op: '≤' | '<' | '≥', limit: number, limitText: string): void {
    const v = row.value;
    const met =
      typeof v === 'number' && Number.isFinite(v)
        ? op === '≥'
          ? v >= limit
          : op === '≤'
            ? v <= limit
            : v < limit
        : undefined;
    this.add({ ...row, target: `${op} ${limitText}`, met });
  }

  detail(key: string, value: unknown): void {
    this.details[key] = value;
  }

  note(text: string): void {
    this.notes.push(text);
    console.log(`  note: ${text}`);
  }
}

/** Three significant figures, thousands separated; integers above 1000 without decimals. */
export function fmt(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a >= 1000) return Math.round(v).toLocaleString('en-US');
  if (a === 0) return '0';
  return Number(v.toPrecision(3)).toString();
}

export function printTable(report: Report): void {
  const head = ['scenario', 'metric', 'value', 'unit', 'target', 'met', 'note'];
  const body = report.rows.map((r) => [
    r.scenario,
    r.metric,
    typeof r.value === 'number' ? fmt(r.value) : r.value,
    r.unit,
    r.target ?? '',
    r.met === undefined ? '' : r.met ? 'yes' : 'NO',
    r.note ?? '',
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i]!.length)));
  const line = (cells: string[]) =>
    cells
      .map((c, i) => (i === 2 ? c.padStart(widths[i]!) : c.padEnd(widths[i]!)))
      .join('  ')
      .trimEnd();
  console.log(`\n${line(head)}\n${widths.map((w) => '-'.repeat(w)).join('  ')}`);
  let last = '';
  for (const b of body) {
    console.log(line(b[0] === last ? ['', ...b.slice(1)] : b));
    last = b[0]!;
  }
  for (const n of report.notes) console.log(`note: ${n}`);
}
