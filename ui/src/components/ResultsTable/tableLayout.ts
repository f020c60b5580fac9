/**
 * How a sweep's result columns are laid out for reading the physics: swept inputs first, then the model's
 * outputs by group, then derived columns and the flags. Inputs held at one value across the whole sweep
 * leave the table and are listed once above it. Pure; the table component renders the result.
 */
import {
  COLUMN_GROUPS,
  columnGroup,
  compileSweep,
  getModel,
  type ColumnGroup,
  type ModelDefinition,
} from '@driftgrid/domain';
import type { SweepColumnView, SweepView } from '../../api/sweeps.js';

export interface HeldInput {
  name: string;
  symbol: string;
  value: number;
  unit: string;
}

export interface TableLayout {
  /** Columns in display order, each with its group. */
  columns: { column: SweepColumnView; group: ColumnGroup }[];
  /** Groups that have at least one column, in display order. */
  groups: ColumnGroup[];
  held: HeldInput[];
  /** Display symbol per column name (model inputs and outputs; derived columns keep their name). */
  symbols: Record<string, string>;
}

/**
 * Groups shown until the user picks: the swept inputs with the drifts, orderings and derived columns (they
 * fit 1440 px without cutting a column off). Flagged rows are marked on their edge either way.
 */
export const DEFAULT_VISIBLE: ColumnGroup[] = ['swept', 'drifts', 'orderings', 'derived'];

export function tableLayout(sweep: Pick<SweepView, 'model' | 'definition' | 'columns'>): TableLayout {
  let model: ModelDefinition | null = null;
  try {
    model = getModel(sweep.model);
  } catch {
    model = null;
  }
  const swept = (sweep.definition.axes ?? []).map((a) => a.param);
  const fixed = sweep.definition.fixed ?? {};
  const varying = varyingInputs(swept, fixed);
  const held: HeldInput[] = [];
  let values: Record<string, number> | null = null;
  try {
    values = compileSweep({ ...sweep.definition, model: sweep.model }).pointAt(0);
  } catch {
    values = null;
  }
  const placed: { column: SweepColumnView; group: ColumnGroup; order: number }[] = [];
  sweep.columns.forEach((c, order) => {
    if (c.kind === 'index') return;
    if (c.kind === 'input' && !varying.has(c.name) && values && values[c.name] !== undefined) {
      const spec = model?.inputs.find((i) => i.name === c.name);
      held.push({ name: c.name, symbol: spec?.symbol ?? c.name, value: values[c.name]!, unit: c.unit });
      return;
    }
    const group = columnGroup(c, model, [...varying]) ?? 'swept';
    // Swept inputs keep the order of the axes; tied inputs follow them.
    const rank = c.kind === 'input' ? (swept.includes(c.name) ? swept.indexOf(c.name) : swept.length + order) : order;
    placed.push({ column: c, group, order: rank });
  });
  placed.sort((a, b) => COLUMN_GROUPS.indexOf(a.group) - COLUMN_GROUPS.indexOf(b.group) || a.order - b.order);
  const groups = COLUMN_GROUPS.filter((g) => placed.some((p) => p.group === g));
  const symbols: Record<string, string> = { flags: 'flags' };
  for (const x of [...(model?.inputs ?? []), ...(model?.outputs ?? [])]) symbols[x.name] = x.symbol;
  return { columns: placed.map(({ column, group }) => ({ column, group })), groups, held, symbols };
}

/**
 * The swept inputs and those whose fixed value is an expression naming one of them (Ti_eV = "Te_eV / 20"),
 * directly or through another such input: they vary with the axes and stay in the table. A fixed value
 * with a unit or of constants only ("2 cm", "39.948 * m_u / m_p") is held at one value and leaves it.
 */
export function varyingInputs(swept: readonly string[], fixed: Record<string, unknown>): Set<string> {
  const varying = new Set(swept);
  const names = (v: string) => v.match(/[A-Za-z_][A-Za-z0-9_]*/g) ?? [];
  for (let grew = true; grew;) {
    grew = false;
    for (const [k, v] of Object.entries(fixed)) {
      if (varying.has(k) || typeof v !== 'string') continue;
      if (names(v).some((n) => varying.has(n))) {
        varying.add(k);
        grew = true;
      }
    }
  }
  return varying;
}

const KEY = (model: string) => `driftgrid.results.groups.${model}`;

/** The groups the user last chose for this model (localStorage), else the default. */
export function loadVisibleGroups(
  model: string,
  storage: Pick<Storage, 'getItem'> | null = globalStorage(),
): ColumnGroup[] {
  try {
    const raw = storage?.getItem(KEY(model));
    if (!raw) return DEFAULT_VISIBLE;
    const parsed = JSON.parse(raw) as unknown;
    if (!Array.isArray(parsed)) return DEFAULT_VISIBLE;
    return parsed.filter((g): g is ColumnGroup => (COLUMN_GROUPS as readonly string[]).includes(g as string));
  } catch {
    return DEFAULT_VISIBLE;
  }
}

export function saveVisibleGroups(
  model: string,
  groups: readonly ColumnGroup[],
  storage: Pick<Storage, 'setItem'> | null = globalStorage(),
): void {
  try {
    storage?.setItem(KEY(model), JSON.stringify(groups));
  } catch {
    // Private mode or a full quota: the choice lasts for this page only.
  }
}

function globalStorage(): Storage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    return null;
  }
}
