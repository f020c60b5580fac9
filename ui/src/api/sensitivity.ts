/**
 * Sensitivity reads for the ui: GET /api/sweeps/:id/sensitivity?output=<column> (Saltelli-design
 * sweeps). The response is checked against the shared contract, so a shape change fails loudly here
 * rather than as a blank chart.
 */
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { sensitivityReportSchema, type SensitivityIndex, type SensitivityReport } from '@driftgrid/domain';
import { api } from './client.js';
import { queryKeys } from './queryKeys.js';

export type { SensitivityIndex, SensitivityReport };

export const sensitivityQueries = {
  report: (id: string | number, output: string) =>
    queryOptions({
      queryKey: queryKeys.sweeps.sensitivity(id, output),
      queryFn: async ({ signal }) =>
        sensitivityReportSchema.parse(await api.get<unknown>(`/sweeps/${id}/sensitivity`, { output }, signal)),
      // Indices of a finished sweep never change; a running one is refreshed by `live`.
      staleTime: Infinity,
      retry: false,
    }),
};

/** The indices of one output; `live` refreshes them every few seconds while the sweep still computes. */
export function useSensitivity(id: string | number, output: string | null, live = false) {
  return useQuery({
    ...sensitivityQueries.report(id, output ?? ''),
    enabled: !!output,
    placeholderData: keepPreviousData,
    refetchInterval: live ? 5000 : false,
  });
}
