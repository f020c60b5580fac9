/**
 * Dataset reads and writes for the ui (SPEC §6): GET /api/datasets[/:id[/rows|/series]], POST (multipart),
 * DELETE. Shapes come from the domain contracts; keys from queryKeys.ts.
 */
import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { DatasetRowsPage, DatasetSeries, DatasetUploadResult, DatasetView } from '@driftgrid/domain';
import { api, apiRequest, type Page } from '../../api/client.js';
import { queryKeys } from '../../api/queryKeys.js';

export type { DatasetRowsPage, DatasetSeries, DatasetUploadResult, DatasetView };

export function useDatasetList(query: { page: number; pageSize: number; q?: string }) {
  return useQuery({
    queryKey: queryKeys.datasets.list(query),
    queryFn: ({ signal }) => api.get<Page<DatasetView>>('/datasets', query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useDataset(id: string | number) {
  return useQuery({
    queryKey: queryKeys.datasets.detail(id),
    queryFn: ({ signal }) => api.get<DatasetView>(`/datasets/${id}`, undefined, signal),
  });
}

export function useDatasetRows(id: string | number, page: number, pageSize: number) {
  return useQuery({
    queryKey: queryKeys.datasets.rows(id, { page, pageSize }),
    queryFn: ({ signal }) => api.get<DatasetRowsPage>(`/datasets/${id}/rows`, { page, pageSize }, signal),
    placeholderData: keepPreviousData,
  });
}

export function useDatasetSeries(id: string | number, x: string | null, y: string | null) {
  return useQuery({
    queryKey: queryKeys.datasets.series(id, { x, y }),
    queryFn: ({ signal }) => api.get<DatasetSeries>(`/datasets/${id}/series`, { x, y, maxPoints: 20000 }, signal),
    enabled: !!x && !!y,
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
