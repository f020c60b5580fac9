/**
 * Fit reads and writes for the ui (SPEC §6): POST /api/fits, GET /api/fits[/:id]. Keys come from
 * queryKeys.ts; reads have queryOptions() factories.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
// The fit shape GET /api/fits/:id returns (SPEC §6 plus intervals, plot data, versions).
import type { FitParameterView, FitPlotData } from '@driftgrid/domain';
import { api, type Page } from './client.js';
import { afterSuccess, type MutationHandlers } from './mutations.js';
import { queryKeys } from './queryKeys.js';

export type { FitParameterView, FitPlotData };

export type FitSourceKind = 'sweep' | 'dataset';

export interface FitView {
  id: number;
  status: 'queued' | 'running' | 'completed' | 'failed';
  progress: number;
  model: string;
  source: { kind: FitSourceKind; id: number; name: string | null };
  y: string;
  x: string | string[];
  request: Record<string, unknown>;
  parameters?: FitParameterView[];
  confidence?: { level: number; method: string; t: number | null; dof: number };
  rss?: number | null;
  r2?: number | null;
  rmse?: number | null;
  residualSd?: number | null;
  chi2red?: number | null;
  dof?: number;
  n?: number;
  dropped?: number;
  iterations?: number;
  converged?: boolean;
  message?: string;
  signRestored?: boolean;
  units?: Record<string, string>;
  plot?: FitPlotData;
  error: string | null;
  modelVersion: string | null;
  appVersion: string;
  owner: { id: number; name: string };
  createdAt: string;
  finishedAt: string | null;
}

/** POST /api/fits body (SPEC §6). */
export interface FitRequestBody {
  source: { kind: FitSourceKind; id: number };
  model: string;
  y: string;
  x: string | string[];
  expr?: string;
  params?: Record<string, number>;
  filter?: Record<string, Record<string, number | boolean>>;
  weights?: string;
}

export type FitCreated = FitView | { id: number; status: 'queued'; progress: number; n: number; dropped: number };

export type FitListQuery = { sourceKind?: FitSourceKind; sourceId?: number; page?: number; pageSize?: number };

export const LIVE_FIT = new Set(['queued', 'running']);

export const fitsApi = {
  create: (body: FitRequestBody) => api.post<FitCreated>('/fits', body),
  get: (id: number | string, signal?: AbortSignal) => api.get<FitView>(`/fits/${id}`, undefined, signal),
  list: (q: FitListQuery, signal?: AbortSignal) => api.get<Page<FitView>>('/fits', q, signal),
};

export const fitQueries = {
  list: (q: FitListQuery) =>
    queryOptions({ queryKey: queryKeys.fits.list(q), queryFn: ({ signal }) => fitsApi.list(q, signal) }),
  detail: (id: number) =>
    queryOptions({ queryKey: queryKeys.fits.detail(id), queryFn: ({ signal }) => fitsApi.get(id, signal) }),
};

/** One fit by id, polled while it is queued or running. */
export function useFit(id: number | null) {
  return useQuery({
    ...fitQueries.detail(id ?? 0),
    enabled: id !== null,
    refetchInterval: (query) => (query.state.data && !LIVE_FIT.has(query.state.data.status) ? false : 500),
  });
}

/** Saved fits, polled while any on the page is still running. */
export function useFitList(q: FitListQuery, { poll = false }: { poll?: boolean } = {}) {
  return useQuery({
    ...fitQueries.list(q),
    refetchInterval: poll
      ? (query) => (query.state.data?.items.some((f) => LIVE_FIT.has(f.status)) ? 1000 : false)
      : undefined,
  });
}

export function useCreateFit(handlers?: MutationHandlers<FitCreated, FitRequestBody>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: FitRequestBody) => fitsApi.create(body),
    ...afterSuccess<FitCreated, FitRequestBody>((created) => {
      if ('parameters' in created) qc.setQueryData(queryKeys.fits.detail(created.id), created);
      void qc.invalidateQueries({ queryKey: queryKeys.fits.all() });
    }, handlers),
  });
}
