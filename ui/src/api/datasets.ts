/**
 * Dataset reads and writes for the ui (SPEC §6): GET /api/datasets[/:id[/rows|/series]], POST (multipart),
 * DELETE. Shapes come from the domain contracts; keys from queryKeys.ts.
 */
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { DatasetRowsPage, DatasetSeries, DatasetUploadResult, DatasetView } from '@driftgrid/domain';
import { api, apiRequest, type Page, type Query } from './client.js';
import { queryKeys } from './queryKeys.js';

export type { DatasetRowsPage, DatasetSeries, DatasetUploadResult, DatasetView };

export const datasetQueries = {
  list: (query: Query) =>
    queryOptions({
      queryKey: queryKeys.datasets.list(query),
      queryFn: ({ signal }) => api.get<Page<DatasetView>>('/datasets', query, signal),
    }),
  detail: (id: string | number) =>
    queryOptions({
      queryKey: queryKeys.datasets.detail(id),
      queryFn: ({ signal }) => api.get<DatasetView>(`/datasets/${id}`, undefined, signal),
    }),
  rows: (id: string | number, page: number, pageSize: number) =>
    queryOptions({
      queryKey: queryKeys.datasets.rows(id, { page, pageSize }),
      queryFn: ({ signal }) => api.get<DatasetRowsPage>(`/datasets/${id}/rows`, { page, pageSize }, signal),
    }),
  series: (id: string | number, params: { x: string | null; y: string | null; maxPoints: number }) =>
    queryOptions({
      queryKey: queryKeys.datasets.series(id, params),
      queryFn: ({ signal }) => api.get<DatasetSeries>(`/datasets/${id}/series`, params, signal),
    }),
};

export function useDatasetList(query: { page?: number; pageSize: number; q?: string }, enabled = true) {
  return useQuery({ ...datasetQueries.list(query), placeholderData: keepPreviousData, enabled });
}

export function useDataset(id: string | number) {
  return useQuery(datasetQueries.detail(id));
}

export function useDatasetRows(id: string | number, page: number, pageSize: number) {
  return useQuery({ ...datasetQueries.rows(id, page, pageSize), placeholderData: keepPreviousData });
}

export function useDatasetSeries(
  id: string | number | null,
  x: string | null,
  y: string | null,
  { maxPoints = 20000, enabled = true }: { maxPoints?: number; enabled?: boolean } = {},
) {
  return useQuery({
    ...datasetQueries.series(id ?? '', { x, y, maxPoints }),
    enabled: enabled && id !== null && id !== '' && !!x && !!y,
  });
}

export interface UploadInput {
  file: File;
  name?: string;
  units: Record<string, string>;
  visibility?: 'private' | 'group';
}

export function useUploadDataset() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UploadInput) => {
      const form = new FormData();
      form.append('file', input.file, input.file.name);
      if (input.name) form.append('name', input.name);
      const units = Object.fromEntries(Object.entries(input.units).filter(([, u]) => u.trim() !== ''));
      form.append('units', JSON.stringify(units));
      if (input.visibility) form.append('visibility', input.visibility);
      return apiRequest<DatasetUploadResult>('/datasets', { method: 'POST', body: form });
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: queryKeys.datasets.all() }),
  });
}

export function useDeleteDataset() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/datasets/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: queryKeys.datasets.all() }),
  });
}
