/** Personal API tokens (SPEC §6): list, create (the secret comes back once), revoke. */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ActiveTokenCount, ApiTokenSummary, CreatedApiToken, CreateTokenRequest } from '@driftgrid/domain';
import { api, type Page } from './client.js';
import { afterSuccess, type MutationHandlers } from './mutations.js';
import { queryKeys } from './queryKeys.js';

export type { ApiTokenSummary, CreatedApiToken };

export type CreateTokenBody = CreateTokenRequest;

export const tokenQueries = {
  list: () =>
    queryOptions({
      queryKey: queryKeys.tokens.list(),
      queryFn: ({ signal }) => api.get<Page<ApiTokenSummary>>('/tokens', { pageSize: 200 }, signal),
    }),
  active: () =>
    queryOptions({
      queryKey: queryKeys.tokens.active(),
      queryFn: ({ signal }) => api.get<ActiveTokenCount>('/tokens/active', undefined, signal),
    }),
};

export const useTokens = () => useQuery(tokenQueries.list());

/** Unrevoked, unexpired tokens: what a password change offers to revoke. */
export const useActiveTokenCount = () => useQuery(tokenQueries.active());

export function useCreateToken(handlers?: MutationHandlers<CreatedApiToken, CreateTokenBody>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateTokenBody) => api.post<CreatedApiToken>('/tokens', body),
    ...afterSuccess(() => void qc.invalidateQueries({ queryKey: queryKeys.tokens.all() }), handlers),
  });
}

export function useRevokeToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete<ApiTokenSummary>(`/tokens/${id}`),
    onSuccess: () => void qc.invalidateQueries({ queryKey: queryKeys.tokens.all() }),
  });
}
