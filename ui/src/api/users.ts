/** The people directory sharing pickers read (GET /api/users/directory). */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DirectoryUser } from '@driftgrid/domain';
import { api } from './client.js';
import { queryKeys } from './queryKeys.js';

export type { DirectoryUser };

export const userQueries = {
  directory: () =>
    queryOptions({
      queryKey: queryKeys.users.directory(),
      queryFn: ({ signal }) => api.get<{ items: DirectoryUser[] }>('/users/directory', { pageSize: 200 }, signal),
    }),
};

export const useUserDirectory = () => useQuery(userQueries.directory());
