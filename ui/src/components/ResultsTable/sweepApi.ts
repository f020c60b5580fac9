/**
 * Catalogue and sweep reads for the ui: typed fetchers and React Query hooks over GET /api/sweeps,
 * /api/sweeps/:id, /results and /series (SPEC §6). Keys come from queryKeys.ts.
 */
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type { HeatmapSeries, LineSeries, SweepSummary } from '@driftgrid/domain';
import { api, type Page, type Query } from '../../api/client.js';
import { queryKeys } from '../../api/queryKeys.js';

export type { HeatmapSeries, LineSeries, SweepSummary };

export interface SweepColumnView {
  name: string;
  kind: 'index' | 'input' | 'output' | 'derived' | 'flags';
  unit: string;
  meaning: string;
  type: 'int' | 'float' | 'boolean' | 'mask';
  source?: string;
}

/** GET /api/sweeps/:id (SweepsService.present). */
export interface SweepView {
  id: number;
  name: string;
  model: string;
  status: string;
  points: number;
  progress: { done: number; total: number; fraction: number };
  chunks: number;
  definition: {
    description?: string;
    fixed?: Record<string, unknown>;
    axes?: {
      param: string;
      kind: string;
      min?: number | string;
      max?: number | string;
      count?: number;
      values?: unknown[];
      unit?: string;
    }[];
    sampling?: { kind: string; samples?: number; seed?: number };
    derived?: { name: string; expr: string }[];
  };
  columns: SweepColumnView[];
  tags: string[];
  owner: { id: number; name: string; email: string };
  visibility: 'private' | 'group';
  sharedWith: number[];
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  error: string | null;
  flagsSummary: { invalidPoints: number; byFlag: Record<string, number> };
  provenance: {
    modelVersion: string;
    appVersion: string;
    computeMs: number;
    workers: { id: string; chunks: number; points: number }[];
  };
  archive?: { sha256: string; bytes: number | null; archivedAt: string | null };
}

export interface ResultsPage {
  rows: Record<string, number | boolean | null>[];
  total: number;
  columns: SweepColumnView[];
}

export const ACTIVE = ['queued', 'running'];

export function useSweepList(query: Query) {
  return useQuery({
    queryKey: queryKeys.sweeps.list(query),
    queryFn: ({ signal }) => api.get<Page<SweepSummary>>('/sweeps', query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useSweep(id: string | number) {
  return useQuery({
    queryKey: queryKeys.sweeps.detail(id),
    queryFn: ({ signal }) => api.get<SweepView>(`/sweeps/${id}`, undefined, signal),
    // Live progress while the sweep is queued or running (SPEC §12: long actions show progress).
    refetchInterval: (q) => (q.state.data && ACTIVE.includes(q.state.data.status) ? 1000 : false),
  });
}

export function useResults(id: string | number, query: Query, enabled = true) {
  return useQuery({
    queryKey: queryKeys.sweeps.results(id, query),
    queryFn: ({ signal }) => api.get<ResultsPage>(`/sweeps/${id}/results`, query, signal),
    placeholderData: keepPreviousData,
    enabled,
  });
}

export function useSeries(id: string | number, query: Query, enabled = true) {
  return useQuery({
    queryKey: queryKeys.sweeps.series(id, query),
    queryFn: ({ signal }) => api.get<LineSeries | HeatmapSeries>(`/sweeps/${id}/series`, query, signal),
    placeholderData: keepPreviousData,
    enabled,
  });
}
