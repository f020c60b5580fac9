import 'mantine-react-table/styles.css';
import { Group, SegmentedControl, Text } from '@mantine/core';
import {
  MantineReactTable,
  useMantineReactTable,
  type MRT_ColumnDef,
  type MRT_ColumnFiltersState,
  type MRT_PaginationState,
  type MRT_SortingState,
} from 'mantine-react-table';
import { useMemo, useState } from 'react';
import { formatCount, prettyUnit } from '../../lib/format.js';
import { Num } from '../Num/Num.js';
import { useResults, type SweepColumnView } from '../../api/sweeps.js';

type Row = Record<string, number | boolean | null>;

export interface ResultsTableProps {
  sweepId: number;
  columns: SweepColumnView[];
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

/** A sweep's result rows: server-side paging, sorting and range filters; units in the headers. */
export function ResultsTable({ sweepId, columns, flagNames = [] }: ResultsTableProps) {
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
        const base = {
          id: c.name,
          accessorFn: (r: Row) => r[c.name],
          header: header(c),
          mantineTableHeadCellProps: { title: c.meaning },
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
          Cell: ({ cell }) => <Num value={cell.getValue() as number | null} align="right" />,
        };
      }),
    [columns, flagNames],
  );

  const table = useMantineReactTable({
    columns: defs,
    data: (data?.rows ?? []) as Row[],
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
    state: { pagination, sorting, columnFilters: filters, isLoading, showProgressBars: isFetching },
    initialState: { density: 'xs', showColumnFilters: false },
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

  return <MantineReactTable table={table} />;
}
