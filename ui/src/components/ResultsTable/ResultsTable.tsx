import 'mantine-react-table/styles.css';
import { Chip, Group, SegmentedControl, Stack, Text } from '@mantine/core';
import {
  MantineReactTable,
  useMantineReactTable,
  type MRT_ColumnDef,
  type MRT_ColumnFiltersState,
  type MRT_PaginationState,
  type MRT_SortingState,
} from 'mantine-react-table';
import { cellNumber, COLUMN_GROUP_LABELS, type ColumnGroup } from '@driftgrid/domain';
import { useMemo, useState } from 'react';
import { formatCount, formatQuantity, prettyUnit } from '../../lib/format.js';
import { Num } from '../Num/Num.js';
import { loadVisibleGroups, saveVisibleGroups, tableLayout } from './tableLayout.js';
import {
  useResults,
  type ResultCell,
  type ResultRowView,
  type SweepColumnView,
  type SweepView,
} from '../../api/sweeps.js';

type Row = ResultRowView;

export interface ResultsTableProps {
  sweep: Pick<SweepView, 'id' | 'model' | 'definition' | 'columns'>;
  /** Flag codes by bit, to name the raised flags of a row in words. */
  flagNames?: { bit: number; code: string }[];
}

/** `[lo, hi]` range filters from the table → the api's filter JSON (`{"Te_eV":{"gte":10,"lte":100}}`). */
export function toFilterJson(filters: MRT_ColumnFiltersState): string | undefined {
  const out: Record<string, { gte?: number; lte?: number }> = {};
  for (const f of filters) {
    const [lo, hi] = Array.isArray(f.value) ? (f.value as unknown[]) : [];
    const ops: { gte?: number; lte?: number } = {};
    const num = (v: unknown) => (v === '' || v === undefined || v === null ? undefined : Number(v));
    const a = num(lo);
    const b = num(hi);
    if (a !== undefined && Number.isFinite(a)) ops.gte = a;
    if (b !== undefined && Number.isFinite(b)) ops.lte = b;
    if (Object.keys(ops).length) out[f.id] = ops;
  }
  return Object.keys(out).length ? JSON.stringify(out) : undefined;
}

function header(c: SweepColumnView): string {
  const u = prettyUnit(c.unit);
  return u ? `${c.name} (${u})` : c.name;
}

/** Compact header: the physics symbol over its unit (the column name and meaning are in the title). */
function HeaderCell({ symbol, unit }: { symbol: string; unit: string }) {
  return (
    <span style={{ display: 'inline-block', lineHeight: 1.2, whiteSpace: 'nowrap' }}>
      <span>{symbol}</span>
      <br />
      <span style={{ fontWeight: 400, opacity: 0.7, fontSize: 11 }}>{unit || '\u00a0'}</span>
    </span>
  );
}

/** Width that fits the header (symbol or unit, whichever is longer) and the sort icon, no more. */
function widthFor(symbol: string, unit: string, c: SweepColumnView): number {
  if (c.kind === 'flags') return 130;
  if (c.type === 'boolean') return 64;
  // A value such as "−1.959 × 10⁻⁵" at the compact size needs about 86 px.
  // Header: about 8 px a character at the compact size, plus the sort icon and padding (46 px).
  return Math.max(86, Math.min(150, Math.max(symbol.length, unit.length) * 8 + 46));
}

/**
 * A sweep's result rows, physics first: swept inputs, then outputs by group, then derived columns and flags;
 * inputs held fixed are listed once above the table. Column groups are shown or hidden together (remembered
 * per model). Server-side paging, sorting and range filters; units in the headers; compact rows.
 */
export function ResultsTable({ sweep, flagNames = [] }: ResultsTableProps) {
  const sweepId = sweep.id;
  const layout = useMemo(() => tableLayout(sweep), [sweep]);
  const columns = useMemo(() => layout.columns.map((c) => c.column), [layout]);
  const symbols = layout.symbols;
  const [visible, setVisible] = useState<ColumnGroup[]>(() => loadVisibleGroups(sweep.model));
  const chooseGroups = (groups: string[]) => {
    const next = layout.groups.filter((g) => groups.includes(g));
    setVisible(next);
    saveVisibleGroups(sweep.model, next);
  };
  const columnPinning = useMemo(
    () => ({ left: layout.columns.filter((c) => c.group === 'swept').map((c) => c.column.name), right: [] }),
    [layout],
  );
  const columnVisibility = useMemo(
    () => Object.fromEntries(layout.columns.map((c) => [c.column.name, visible.includes(c.group)])),
    [layout, visible],
  );
  const [pagination, setPagination] = useState<MRT_PaginationState>({ pageIndex: 0, pageSize: 50 });
  const [sorting, setSorting] = useState<MRT_SortingState>([]);
  const [filters, setFilters] = useState<MRT_ColumnFiltersState>([]);
  const [validity, setValidity] = useState<'all' | 'true' | 'false'>('all');
  const hasValid = columns.some((c) => c.name === 'valid');

  const query = {
    page: pagination.pageIndex + 1,
    pageSize: pagination.pageSize,
    sort: sorting[0] ? `${sorting[0].id}:${sorting[0].desc ? 'desc' : 'asc'}` : undefined,
    filter: toFilterJson(filters),
    valid: validity === 'all' ? undefined : validity,
  };
  const { data, isLoading, isFetching, error } = useResults(sweepId, query);

  const defs = useMemo<MRT_ColumnDef<Row>[]>(
    () =>
      columns.map((c): MRT_ColumnDef<Row> => {
        const symbol = symbols[c.name] ?? c.name;
        const unit = prettyUnit(c.unit);
        const base = {
          id: c.name,
          accessorFn: (r: Row) => r[c.name],
          header: header(c),
          Header: () => <HeaderCell symbol={symbol} unit={unit} />,
          size: widthFor(symbol, unit, c),
          minSize: 60,
          mantineTableHeadCellProps: { title: `${header(c)}: ${c.meaning}` },
        };
        if (c.type === 'boolean') {
          return {
            ...base,
            enableColumnFilter: false,
            Cell: ({ cell }) => (cell.getValue() === null ? '—' : cell.getValue() ? 'yes' : 'no'),
          };
        }
        if (c.kind === 'flags') {
          return {
            ...base,
            enableColumnFilter: false,
            enableSorting: false,
            Cell: ({ cell }) => {
              const m = Number(cell.getValue() ?? 0);
              const raised = flagNames.filter((f) => m & (1 << f.bit)).map((f) => f.code);
              return raised.length ? raised.join(', ') : 'none';
            },
          };
        }
        return {
          ...base,
          filterVariant: 'range',
          mantineTableBodyCellProps: { align: 'right' },
          // The api answers non-finite values as "Infinity", "-Infinity" and "NaN" (JSON has no such numbers).
          Cell: ({ cell }) => {
            const v = cell.getValue<ResultCell>();
            return v === 'NaN' ? 'NaN' : <Num value={cellNumber(v)} align="right" />;
          },
        };
      }),
    [columns, flagNames, symbols],
  );

  const table = useMantineReactTable({
    columns: defs,
    data: data?.rows ?? [],
    getRowId: (r) => String(r.idx),
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    enableMultiSort: false,
    enableGlobalFilter: false,
    enableFacetedValues: false,
    enableColumnFilterModes: false,
    enableFullScreenToggle: false,
    columnFilterDisplayMode: 'subheader',
    rowCount: data?.total ?? 0,
    onPaginationChange: setPagination,
    onSortingChange: (up) => {
      setSorting(up);
      setPagination((p) => ({ ...p, pageIndex: 0 }));
    },
    onColumnFiltersChange: (up) => {
      setFilters(up);
      setPagination((p) => ({ ...p, pageIndex: 0 }));
    },
    state: {
      pagination,
      sorting,
      columnFilters: filters,
      isLoading,
      showProgressBars: isFetching,
      columnVisibility,
      columnPinning,
    },
    // The swept inputs stay in view while wider groups scroll sideways.
    enableColumnPinning: true,
    initialState: { density: 'xs', showColumnFilters: false },
    enableHiding: false,
    // Sorting by a header click and filters from the toolbar: no per-column menu taking header width.
    enableColumnActions: false,
    enableDensityToggle: true,
    layoutMode: 'grid',
    // Compact: headers wrap instead of widening the column; cells keep to one line.
    mantineTableHeadCellProps: {
      style: { whiteSpace: 'normal', verticalAlign: 'bottom', fontSize: 12, lineHeight: 1.25 },
    },
    mantineTableBodyCellProps: {
      style: { fontSize: 12, paddingTop: 2, paddingBottom: 2, paddingLeft: 6, paddingRight: 6 },
    },
    // Flagged rows carry a coloured edge and name their flags, so validity shows even with its columns hidden.
    mantineTableBodyRowProps: ({ row }) => {
      const mask = Number(row.original.flags ?? 0);
      const raised = flagNames.filter((f) => mask & (1 << f.bit)).map((f) => f.code);
      return raised.length
        ? {
            title: `Flagged: ${raised.join(', ')}`,
            style: { boxShadow: 'inset 3px 0 0 var(--mantine-color-orange-6)' },
            'data-flagged': 'true',
          }
        : {};
    },
    mantinePaginationProps: { rowsPerPageOptions: ['25', '50', '100', '500', '1000'] },
    mantineTableProps: { striped: true, highlightOnHover: true, 'aria-label': 'Result rows' } as object,
    mantineToolbarAlertBannerProps: error ? { color: 'red', children: (error as Error).message } : undefined,
    renderTopToolbarCustomActions: () => (
      <Group gap="sm">
        {hasValid ? (
          <SegmentedControl
            size="xs"
            aria-label="Validity"
            value={validity}
            onChange={(v) => {
              setValidity(v as typeof validity);
              setPagination((p) => ({ ...p, pageIndex: 0 }));
            }}
            data={[
              { value: 'all', label: 'All points' },
              { value: 'true', label: 'Valid only' },
              { value: 'false', label: 'Flagged only' },
            ]}
          />
        ) : null}
        <Text fz="sm" c="dimmed" aria-live="polite" data-testid="results-total">
          {data ? `${formatCount(data.total)} rows` : ''}
        </Text>
      </Group>
    ),
    renderEmptyRowsFallback: () => (
      <Text p="md" fz="sm" c="dimmed">
        No rows match. Widen the range filters or show all points.
      </Text>
    ),
  });

  return (
    <Stack gap="xs">
      {layout.held.length ? (
        <Text fz="sm" data-testid="held-fixed">
          <Text span c="dimmed" fz="sm">
            Held fixed over the whole sweep:{' '}
          </Text>
          {layout.held.map((h, i) => (
            <span key={h.name} title={h.name}>
              {i ? ', ' : ''}
              {h.symbol} = <span className="dg-num">{formatQuantity(h.value, h.unit)}</span>
            </span>
          ))}
        </Text>
      ) : null}
      <Group gap="xs" align="center">
        <Text fz="sm" c="dimmed">
          Columns:
        </Text>
        <Chip.Group multiple value={visible} onChange={chooseGroups}>
          <Group gap={6} data-testid="column-groups">
            {layout.groups.map((g) => (
              <Chip key={g} value={g} size="xs" variant="outline">
                {COLUMN_GROUP_LABELS[g]}
              </Chip>
            ))}
          </Group>
        </Chip.Group>
      </Group>
      <MantineReactTable table={table} />
    </Stack>
  );
}
