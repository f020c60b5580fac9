import { cellNumber } from '@driftgrid/domain';
import type { ResultCell, ResultRowView, SweepColumnView } from '../../api/sweeps.js';
import { formatQuantity } from '../../lib/format.js';

const esc = (t: string) => t.replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!);

function cell(c: SweepColumnView, v: ResultCell | undefined, flagNames: { bit: number; code: string }[]) {
  if (v === null || v === undefined) return '—';
  if (c.kind === 'flags') {
    const raised = flagNames.filter((f) => Number(v) & (1 << f.bit)).map((f) => f.code);
    return raised.length ? esc(raised.join(', ')) : 'none';
  }
  if (typeof v === 'boolean' || c.type === 'boolean') return v ? 'yes' : 'no';
  // Non-finite values arrive as "Infinity", "-Infinity" or "NaN" (JSON has no such numbers).
  if (v === 'NaN') return 'NaN';
  return esc(formatQuantity(cellNumber(v), c.unit));
}

/**
 * Every input, output and derived value of one stored point, with units, as a compact two-column
 * tooltip: inputs on the left, outputs and derived values on the right.
 */
export function pointDetailHtml(
  row: ResultRowView,
  columns: readonly SweepColumnView[],
  flagNames: { bit: number; code: string }[],
  heading = '',
): string {
  const line = (c: SweepColumnView) =>
    `<div style="display:flex;justify-content:space-between;gap:10px"><span style="opacity:.75">${esc(c.name)}</span><span style="font-variant-numeric:tabular-nums">${cell(c, row[c.name], flagNames)}</span></div>`;
  const inputs = columns.filter((c) => c.kind === 'input');
  const outputs = columns.filter((c) => c.kind === 'output' || c.kind === 'derived' || c.kind === 'flags');
  const idx = row.idx;
  return `<div style="font-size:12px;line-height:1.35">${heading ? `<div style="margin-bottom:4px">${heading}</div>` : ''}<div style="opacity:.75;margin-bottom:4px">Stored point ${idx ?? ''}</div><div style="display:grid;grid-template-columns:1fr 1fr;gap:0 18px"><div><b>Inputs</b>${inputs.map(line).join('')}</div><div><b>Outputs</b>${outputs.map(line).join('')}</div></div></div>`;
}
