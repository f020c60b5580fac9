import type { SweepColumn, SweepColumnView } from '@driftgrid/domain';
import { RESULT_SLOTS } from '../db/schema.js';

/** A result column with where it lives in the results table. */
export interface StoredColumn extends SweepColumn {
  /** SQL expression reading the column: a slot `c7`, `flags`, or the index derived from the rowid. */
  slot: string;
}

export const ROW_SPAN = 2 ** 32;

/** A sweep's stored column layout (written once when the sweep is created). */
export function layoutOf(s: { columns: string }): StoredColumn[] {
  return JSON.parse(s.columns) as StoredColumn[];
}

/** The columns as the api shows them (sweep and results pages alike): the layout without storage slots. */
export function columnViews(layout: readonly StoredColumn[]): SweepColumnView[] {
  return layout.map(({ slot: _slot, ...c }) => c);
}

/** rowid range of a sweep's rows: [sweepId·2^32, (sweepId+1)·2^32). */
export function rowRange(sweepId: number): { lo: number; hi: number } {
  return { lo: sweepId * ROW_SPAN, hi: (sweepId + 1) * ROW_SPAN - 1 };
}

/**
 * Assigns each numeric column of a sweep a REAL slot. The index comes from the rowid and the flag mask
 * has its own INTEGER column, so neither uses a slot.
 */
export function layoutColumns(columns: readonly SweepColumn[], sweepId?: number): StoredColumn[] {
  let next = 0;
  const base = sweepId === undefined ? 'id' : `(id - ${sweepId * ROW_SPAN})`;
  const out = columns.map((c): StoredColumn => {
    if (c.kind === 'index') return { ...c, slot: base };
    if (c.kind === 'flags') return { ...c, slot: 'flags' };
    return { ...c, slot: `c${next++}` };
  });
  if (next > RESULT_SLOTS)
    throw new RangeError(`A sweep may store at most ${RESULT_SLOTS} numeric columns; this one has ${next}`);
  return out;
}

/** Columns written per chunk: slot name ↔ column name (in slot order). */
export function slotColumns(layout: readonly StoredColumn[]): { name: string; slot: string }[] {
  return layout.filter((c) => /^c\d+$/.test(c.slot)).map((c) => ({ name: c.name, slot: c.slot }));
}
