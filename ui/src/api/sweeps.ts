/**
 * Sweep reads and writes for the ui (SPEC §6): the catalogue, one sweep, its results and series, the
 * builder's preview, submit, cancel, sharing and archive. Keys come from queryKeys.ts; each read has a
 * queryOptions() factory so a component can prefetch or share the exact query a hook runs.
 */
import {
  keepPreviousData,
  queryOptions,
  useMutation,
  useQueries,
  useQuery,
  useQueryClient,
  type QueryClient,
} from '@tanstack/react-query';
import { useCallback } from 'react';
import { ACTIVE_STATES } from '@driftgrid/domain';
import type {
  HeatmapSeries,
  LineSeries,
  ResultCell,
  ResultRowView,
  ResultsPage,
  SweepColumnView,
  SweepCreatedView,
  SweepPreviewView,
  SweepSummary,
  SweepView,
} from '@driftgrid/domain';
import { api, ApiError, type Page, type Query } from './client.js';
import { afterSuccess, type MutationHandlers } from './mutations.js';
import { shouldRetry } from './queryClient.js';
import { queryKeys } from './queryKeys.js';

// Response shapes are declared once, in the domain's contracts (shared with the api's presenters).
export type {
  HeatmapSeries,
  LineSeries,
  ResultCell,
  ResultRowView,
  ResultsPage,
  SweepColumnView,
  SweepPreviewView,
  SweepSummary,
  SweepView,
};

/** Statuses in which a sweep still runs (declared once in the domain's contracts). */
export const ACTIVE: readonly string[] = ACTIVE_STATES;

/**
 * Archived sweeps through the catalogue's `scope=archived`; a server without that scope answers
 * 400, and the list falls back to `status=archived`.
 */
async function fetchArchived(
  query: { page: number; pageSize: number; q?: string },
  signal?: AbortSignal,
): Promise<Page<SweepSummary>> {
  try {
    return await api.get<Page<SweepSummary>>('/sweeps', { ...query, scope: 'archived' }, signal);
  } catch (err) {
    if (!(err instanceof ApiError) || err.status !== 400) throw err;
    return api.get<Page<SweepSummary>>('/sweeps', { ...query, status: 'archived' }, signal);
  }
}

export const sweepQueries = {
  list: (query: Query) =>
    queryOptions({
      queryKey: queryKeys.sweeps.list(query),
      queryFn: ({ signal }) => api.get<Page<SweepSummary>>('/sweeps', query, signal),
    }),
  archived: (query: { page: number; pageSize: number; q?: string }) =>
    queryOptions({
      queryKey: queryKeys.sweeps.list({ ...query, archived: true }),
      queryFn: ({ signal }) => fetchArchived(query, signal),
    }),
  detail: (id: string | number) =>
    queryOptions({
      queryKey: queryKeys.sweeps.detail(id),
      queryFn: ({ signal }) => api.get<SweepView>(`/sweeps/${id}`, undefined, signal),
    }),
  results: (id: string | number, query: Query) =>
    queryOptions({
      queryKey: queryKeys.sweeps.results(id, query),
      queryFn: ({ signal }) => api.get<ResultsPage>(`/sweeps/${id}/results`, query, signal),
    }),
  series: (id: string | number, query: Query) =>
    queryOptions({
      queryKey: queryKeys.sweeps.series(id, query),
      queryFn: ({ signal }) => api.get<LineSeries | HeatmapSeries>(`/sweeps/${id}/series`, query, signal),
    }),
  preview: (definition: unknown) =>
    queryOptions({
      queryKey: queryKeys.sweeps.preview(definition),
      queryFn: ({ signal }) => api.post<SweepPreviewView>('/sweeps/preview', definition, { signal }),
    }),
};

export function useSweepList(query: Query, enabled = true) {
  return useQuery({ ...sweepQueries.list(query), placeholderData: keepPreviousData, enabled });
}

export function useArchivedSweeps(query: { page: number; pageSize: number; q?: string }) {
  return useQuery({ ...sweepQueries.archived(query), placeholderData: keepPreviousData });
}

export function useSweep(id: string | number, enabled = true) {
  return useQuery({
    ...sweepQueries.detail(id),
    enabled,
    // Live progress while the sweep is queued or running (SPEC §12: long actions show progress).
    refetchInterval: (q) => (q.state.data && ACTIVE.includes(q.state.data.status) ? 1000 : false),
  });
}

/** Progress polling for a compact card: every second until the sweep settles, never served stale. */
export function useSweepProgress(id: string | number) {
  return useQuery({
    ...sweepQueries.detail(id),
    refetchInterval: (query) => (query.state.data && !ACTIVE.includes(query.state.data.status) ? false : 1000),
    staleTime: 0,
  });
}

export function useResults(id: string | number, query: Query, enabled = true) {
  return useQuery({ ...sweepQueries.results(id, query), placeholderData: keepPreviousData, enabled });
}

export function useSeries(id: string | number, query: Query, enabled = true) {
  return useQuery({ ...sweepQueries.series(id, query), placeholderData: keepPreviousData, enabled });
}

/** The server's estimate and quota verdict for a definition the builder has already checked locally. */
export function useSweepPreview(definition: unknown, enabled: boolean) {
  return useQuery({
    ...sweepQueries.preview(definition),
    enabled,
    placeholderData: keepPreviousData,
    staleTime: 10_000,
  });
}

export function useSubmitSweep(handlers?: MutationHandlers<SweepCreatedView, Record<string, unknown>>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (def: Record<string, unknown>) => api.post<SweepCreatedView>('/sweeps', def),
    ...afterSuccess(() => {
      // Usage (quota meters) and the catalogue change with a new sweep.
      void qc.invalidateQueries({ queryKey: queryKeys.me() });
      void qc.invalidateQueries({ queryKey: queryKeys.sweeps.lists() });
    }, handlers),
  });
}

export function useCancelSweep(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<SweepView>(`/sweeps/${id}/cancel`),
    onSuccess: (s) => qc.setQueryData(queryKeys.sweeps.detail(id), s),
  });
}

export function useSaveSharing(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { visibility: SweepView['visibility']; userIds: number[] }) =>
      api.put<SweepView>(`/sweeps/${id}/sharing`, body),
    onSuccess: (s) => qc.setQueryData(queryKeys.sweeps.detail(id), s),
  });
}

export function useArchiveSweep(id: number, handlers?: MutationHandlers<SweepView, void>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<SweepView>(`/sweeps/${id}/archive`),
    ...afterSuccess<SweepView, void>((s) => {
      qc.setQueryData(queryKeys.sweeps.detail(id), s);
      void qc.invalidateQueries({ queryKey: queryKeys.sweeps.all() });
    }, handlers),
  });
}

/** Several plot series of one sweep at once (a heatmap and the ordering parameters its contours need). */
export function useSeriesList(id: string | number, queries: Query[], enabled = true) {
  return useQueries({
    queries: queries.map((q) => ({
      ...sweepQueries.series(id, q),
      placeholderData: keepPreviousData,
      enabled,
      // Several reads at once may meet the per-user read limit (429) or a busy pool (503): wait and retry.
      retry: (n: number, e: unknown) =>
        e instanceof ApiError && (e.status === 429 || e.status === 503) ? n < 4 : shouldRetry(n, e),
      retryDelay: (n: number) => 250 * 2 ** n,
    })),
    combine: seriesData,
  });
}

// Stable, so the combined array keeps its identity while no series changes.
const seriesData = (results: { data?: LineSeries | HeatmapSeries }[]) => results.map((r) => r.data);

type Row = ResultRowView;

/** A function reading one stored point by index through the query cache (hover read-outs drawn by the chart). */
export function useResultRowReader(id: string | number): (idx: number) => Promise<Row | null> {
  const qc = useQueryClient();
  return useCallback((idx: number) => fetchResultRow(qc, id, idx), [qc, id]);
}

/** One stored point (every input, output, derived column and the flag mask) by its index, cached for good. */
async function fetchResultRow(qc: QueryClient, id: string | number, idx: number): Promise<Row | null> {
  const page = await qc.fetchQuery({
    ...sweepQueries.results(id, { filter: JSON.stringify({ idx: { eq: idx } }), pageSize: 1 }),
    staleTime: Infinity,
  });
  return page.rows[0] ?? null;
}

/** The first `limit` stored points with every column (a scatter of a random design), in pages of 1,000. */
export function useLeadingRows(id: string | number, limit: number, enabled = true) {
  return useQuery({
    queryKey: [...queryKeys.sweeps.results(id, { leading: limit })],
    enabled,
    staleTime: 30_000,
    queryFn: async ({ signal }) => {
      const pageSize = Math.min(1000, limit);
      const rows: Row[] = [];
      let total = 0;
      for (let page = 1; rows.length < limit; page++) {
        const p = await api.get<ResultsPage>(`/sweeps/${id}/results`, { page, pageSize, sort: 'idx:asc' }, signal);
        total = p.total;
        rows.push(...p.rows);
        if (p.rows.length < pageSize) break;
      }
      return { rows: rows.slice(0, limit), total };
    },
  });
}
