import 'mantine-react-table/styles.css';
import {
  Anchor,
  Badge,
  Button,
  Group,
  MultiSelect,
  SegmentedControl,
  Select,
  Stack,
  TagsInput,
  Text,
  TextInput,
} from '@mantine/core';
import { useDebouncedValue } from '@mantine/hooks';
import { IconSearch, IconStack2 } from '@tabler/icons-react';
import { CATALOGUE_SCOPES, listModelSummaries, type CatalogueScope } from '@driftgrid/domain';
import {
  MantineReactTable,
  useMantineReactTable,
  type MRT_ColumnDef,
  type MRT_PaginationState,
  type MRT_SortingState,
} from 'mantine-react-table';
import { useEffect, useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { useMe } from '../api/auth.js';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { useSweepList, type SweepSummary } from '../api/sweeps.js';
import { STATUS_LOOK, StatusBadge, SWEEP_STATUSES } from '../components/StatusBadge/StatusBadge.js';
import { formatCount, formatPercent } from '../lib/format.js';
import { formatDateTime } from '../lib/formatDate.js';

/** A label for every scope the api takes (a new scope in the contract fails the type check here). */
const SCOPE_LABELS: Record<CatalogueScope, string> = {
  all: 'All I can see',
  mine: 'Mine',
  shared: 'Shared with me',
  archived: 'Archived',
};
const SCOPES = CATALOGUE_SCOPES.map((value) => ({ value, label: SCOPE_LABELS[value] }));

/** The URL is the state: every filter, the page and the sort survive a reload and can be bookmarked. */
const FILTER_KEYS = [
  'q',
  'model',
  'status',
  'tag',
  'scope',
  'createdFrom',
  'createdTo',
  'finishedFrom',
  'finishedTo',
  'minPoints',
  'maxPoints',
  'owner',
] as const;

const dateText = (iso: string | null) => formatDateTime(iso);

export default function CataloguePage() {
  const [params, setParams] = useSearchParams();
  const { data: me } = useMe();
  const get = (k: string) => params.get(k) ?? '';
  const list = (k: string) => (params.get(k) ? params.get(k)!.split(',').filter(Boolean) : []);
  const set = (patch: Record<string, string | string[] | null>, keepPage = false) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(patch)) {
      const text = Array.isArray(v) ? v.join(',') : v;
      if (text) next.set(k, text);
      else next.delete(k);
    }
    if (!keepPage) next.delete('page');
    setParams(next, { replace: true });
  };

  // Text search is typed: wait for a pause before it reaches the URL and the server.
  const [text, setText] = useState(get('q'));
  const [debounced] = useDebouncedValue(text, 300);
  useEffect(() => {
    if (debounced !== get('q')) set({ q: debounced || null });
    // eslint-disable-next-line react-hooks/exhaustive-deps -- only a settled search text writes the URL
  }, [debounced]);

  const page = Math.max(1, Number(get('page')) || 1);
  const pageSize = Math.min(1000, Math.max(1, Number(get('pageSize')) || 25));
  const sort = get('sort') || 'createdAt:desc';
  const [sortKey, sortDir] = sort.split(':');
  const query = useMemo(() => {
    const q: Record<string, string | number> = { page, pageSize, sort };
    for (const k of FILTER_KEYS) if (params.get(k)) q[k] = params.get(k)!;
    return q;
  }, [params, page, pageSize, sort]);
  const { data, isLoading, isFetching, error } = useSweepList(query);
  const filtered = FILTER_KEYS.some((k) => params.get(k));

  const models = useMemo(() => listModelSummaries().map((m) => ({ value: m.id, label: `${m.title} (${m.id})` })), []);
  const columns = useMemo<MRT_ColumnDef<SweepSummary>[]>(
    () => [
      {
        accessorKey: 'name',
        header: 'Name',
        size: 240,
        // Long names wrap rather than being cut off.
        mantineTableBodyCellProps: { style: { whiteSpace: 'normal', overflowWrap: 'anywhere' } },
        Cell: ({ row }) => (
          <Anchor component={Link} to={`/sweeps/${row.original.id}`} fz="sm" data-testid="catalogue-row-link">
            {row.original.name}
          </Anchor>
        ),
      },
      { accessorKey: 'model', header: 'Model', size: 120 },
      {
        accessorKey: 'status',
        header: 'Status',
        size: 130,
        Cell: ({ row }) => {
          const s = row.original;
          const running = s.status === 'running' || s.status === 'queued';
          return <StatusBadge status={s.status} suffix={running ? formatPercent(s.progress.fraction) : undefined} />;
        },
      },
      {
        id: 'tags',
        header: 'Tags',
        size: 160,
        enableSorting: false,
        Cell: ({ row }) => (
          <Group gap={4}>
            {row.original.tags.map((tag) => (
              <Badge
                key={tag}
                size="sm"
                variant="default"
                radius="sm"
                tt="none"
                style={{ cursor: 'pointer' }}
                onClick={() => set({ tag: [...new Set([...list('tag'), tag])] })}
                title={`Show only sweeps tagged ${tag}`}
              >
                {tag}
              </Badge>
            ))}
          </Group>
        ),
      },
      { id: 'owner', header: 'Owner', size: 130, enableSorting: false, accessorFn: (s) => s.owner.name },
      {
        accessorKey: 'points',
        header: 'Points',
        size: 100,
        mantineTableBodyCellProps: { align: 'right' },
        Cell: ({ row }) => (
          <span
            className="dg-num"
            title={
              row.original.invalidPoints
                ? `${formatCount(row.original.invalidPoints)} points flagged`
                : 'no point flagged'
            }
          >
            {formatCount(row.original.points)}
          </span>
        ),
      },
      { accessorKey: 'createdAt', header: 'Created', size: 150, Cell: ({ row }) => dateText(row.original.createdAt) },
      {
        accessorKey: 'finishedAt',
        header: 'Finished',
        size: 150,
        Cell: ({ row }) => dateText(row.original.finishedAt),
      },
    ],
    // eslint-disable-next-line react-hooks/exhaustive-deps -- the cells read only the URL params
    [params],
  );

  const pagination: MRT_PaginationState = { pageIndex: page - 1, pageSize };
  const sorting: MRT_SortingState = [{ id: sortKey, desc: sortDir === 'desc' }];
  const table = useMantineReactTable({
    columns,
    data: data?.items ?? [],
    getRowId: (s) => String(s.id),
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    enableColumnFilters: false,
    enableGlobalFilter: false,
    enableMultiSort: false,
    enableSortingRemoval: false,
    enableDensityToggle: false,
    enableFullScreenToggle: false,
    rowCount: data?.total ?? 0,
    state: { pagination, sorting, isLoading, showProgressBars: isFetching },
    initialState: { density: 'xs' },
    // Fixed widths that add up to less than the content area at 1440 px, so no column is cut off there.
    layoutMode: 'grid',
    defaultColumn: { minSize: 70 },
    // Sorting by a header click; no per-column menu taking header width.
    enableColumnActions: false,
    onPaginationChange: (up) => {
      const next = typeof up === 'function' ? up(pagination) : up;
      set({ page: String(next.pageIndex + 1), pageSize: String(next.pageSize) }, true);
    },
    onSortingChange: (up) => {
      const next = typeof up === 'function' ? up(sorting) : up;
      const first = next[0];
      set({ sort: first ? `${first.id}:${first.desc ? 'desc' : 'asc'}` : null });
    },
    mantinePaginationProps: { rowsPerPageOptions: ['10', '25', '50', '100', '500'] },
    mantineTableProps: { striped: true, highlightOnHover: true, 'aria-label': 'Sweeps' } as object,
    renderEmptyRowsFallback: () => (
      <EmptyState
        icon={IconStack2}
        title={filtered ? 'No sweep matches these filters' : 'No sweeps to list yet'}
        actions={
          filtered ? (
            <Button variant="light" onClick={() => (setText(''), setParams(new URLSearchParams(), { replace: true }))}>
              Clear the filters
            </Button>
          ) : me?.role !== 'reviewer' ? (
            <Button component={Link} to="/sweeps/new">
              Start a sweep
            </Button>
          ) : undefined
        }
      >
        {filtered
          ? 'Widen the search: remove a tag, pick another status or scope, or clear the dates.'
          : me?.role === 'reviewer'
            ? 'Sweeps appear here once a colleague shares one with you or archives it.'
            : 'Sweeps you start, those colleagues share with you and archived sweeps appear here. Start one from New sweep.'}
      </EmptyState>
    ),
  });

  return (
    <>
      <PageHeader
        title="Catalogue"
        description="Every sweep you can see: your own, those shared with you and the archived ones. The address bar keeps this view — bookmark or send it."
        actions={
          me?.role !== 'reviewer' ? (
            <Button component={Link} to="/sweeps/new" size="sm">
              New sweep
            </Button>
          ) : null
        }
      />
      <Stack gap="sm">
        <Group gap="sm" align="flex-end" wrap="wrap">
          <TextInput
            label="Search"
            placeholder="Name or description"
            leftSection={<IconSearch size={16} />}
            value={text}
            onChange={(e) => setText(e.currentTarget.value)}
            w={220}
          />
          <Select
            label="Model"
            placeholder="Any model"
            data={models}
            value={get('model') || null}
            onChange={(v) => set({ model: v })}
            clearable
            w={180}
            data-testid="filter-model"
          />
          <MultiSelect
            label="Status"
            placeholder={list('status').length ? undefined : 'Any status'}
            data={SWEEP_STATUSES.filter((s) => s !== 'draft').map((s) => ({ value: s, label: STATUS_LOOK[s].label }))}
            value={list('status')}
            onChange={(v) => set({ status: v })}
            clearable
            w={220}
          />
          <TagsInput
            label="Tags"
            placeholder={list('tag').length ? undefined : 'Type a tag, Enter'}
            value={list('tag')}
            onChange={(v) => set({ tag: v })}
            clearable
            w={220}
            data-testid="filter-tag"
          />
          <TextInput
            label="Created from"
            type="date"
            value={get('createdFrom')}
            onChange={(e) => set({ createdFrom: e.currentTarget.value || null })}
            w={160}
          />
          <TextInput
            label="Created to"
            type="date"
            value={get('createdTo')}
            onChange={(e) => set({ createdTo: e.currentTarget.value || null })}
            w={160}
          />
        </Group>
        <Group justify="space-between" wrap="wrap">
          <SegmentedControl
            size="xs"
            data={SCOPES}
            value={get('scope') || 'all'}
            onChange={(v) => set({ scope: v === 'all' ? null : v })}
            aria-label="Which sweeps"
          />
          <Text fz="sm" c="dimmed" aria-live="polite">
            {data ? `${formatCount(data.total)} sweep${data.total === 1 ? '' : 's'}` : ''}
          </Text>
        </Group>
        {error ? (
          <Text c="red" fz="sm" role="alert">
            {(error as Error).message}
          </Text>
        ) : null}
        <MantineReactTable table={table} />
      </Stack>
    </>
  );
}
