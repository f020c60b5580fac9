/**
 * Fit reads and writes for the ui (SPEC §6): POST /api/fits, GET /api/fits[/:id]. Keys come from
 * queryKeys.ts; reads have queryOptions() factories.
 */
import { queryOptions, useMutation, useQueries, useQuery, useQueryClient } from '@tanstack/react-query';
import { LIVE_FIT_STATUSES } from '@driftgrid/domain';
// The fit shapes are the domain's contracts (domain/src/contracts/fits.ts), shared with the api's presenter.
import type {
  FitCreatedView,
  FitDerivedView,
  FitParameterView,
  FitPlotData,
  FitRequestBody,
  FitSourceKind,
  FitView,
} from '@driftgrid/domain';
import { api, type Page } from './client.js';
import { afterSuccess, type MutationHandlers } from './mutations.js';
import { queryKeys } from './queryKeys.js';

export type { FitDerivedView, FitParameterView, FitPlotData, FitRequestBody, FitSourceKind, FitView };
export type FitCreated = FitCreatedView;

export type FitListQuery = { sourceKind?: FitSourceKind; sourceId?: number; page?: number; pageSize?: number };

export const LIVE_FIT = new Set<string>(LIVE_FIT_STATUSES);

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

/** Several fits by id at once (the comparison view). */
export function useFits(ids: number[]) {
  return useQueries({ queries: ids.map((id) => fitQueries.detail(id)) });
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
