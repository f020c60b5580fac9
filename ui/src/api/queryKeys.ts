/**
 * Query-key factories; each feature module beside this file (sweeps.ts, datasets.ts, fits.ts, admin.ts,
 * tokens.ts, users.ts) builds its queryOptions() factories and hooks from them. Keys are nested so invalidating a prefix refreshes everything under it:
 * `queryKeys.sweeps.detail(id)` also covers that sweep's results and series.
 */
export type KeyParams = Record<string, unknown>;

export const queryKeys = {
  me: () => ['me'] as const,
  health: () => ['health'] as const,
  models: {
    all: () => ['models'] as const,
    detail: (id: string) => ['models', id] as const,
  },
  sweeps: {
    all: () => ['sweeps'] as const,
    lists: () => ['sweeps', 'list'] as const,
    list: (filters: KeyParams = {}) => ['sweeps', 'list', filters] as const,
    detail: (id: string | number) => ['sweeps', 'detail', String(id)] as const,
    results: (id: string | number, params: KeyParams = {}) =>
      ['sweeps', 'detail', String(id), 'results', params] as const,
    series: (id: string | number, params: KeyParams = {}) =>
      ['sweeps', 'detail', String(id), 'series', params] as const,
    /** Sobol indices of one output (under the sweep's detail key: refreshed with it). */
    sensitivity: (id: string | number, output: string) =>
      ['sweeps', 'detail', String(id), 'sensitivity', output] as const,
    preview: (definition: unknown) => ['sweeps', 'preview', definition] as const,
  },
  datasets: {
    all: () => ['datasets'] as const,
    list: (filters: KeyParams = {}) => ['datasets', 'list', filters] as const,
    detail: (id: string | number) => ['datasets', 'detail', String(id)] as const,
    rows: (id: string | number, params: KeyParams = {}) => ['datasets', 'detail', String(id), 'rows', params] as const,
    series: (id: string | number, params: KeyParams = {}) =>
      ['datasets', 'detail', String(id), 'series', params] as const,
  },
  fits: {
    all: () => ['fits'] as const,
    list: (filters: KeyParams = {}) => ['fits', 'list', filters] as const,
    detail: (id: string | number) => ['fits', 'detail', String(id)] as const,
  },
  users: {
    directory: (q = '') => ['users', 'directory', q] as const,
  },
  tokens: {
    all: () => ['tokens'] as const,
    list: (params: KeyParams = {}) => ['tokens', 'list', params] as const,
    active: () => ['tokens', 'active'] as const,
  },
  admin: {
    all: () => ['admin'] as const,
    users: (filters: KeyParams = {}) => ['admin', 'users', filters] as const,
    quotas: () => ['admin', 'quotas'] as const,
    queue: () => ['admin', 'queue'] as const,
    mailbox: (filters: KeyParams = {}) => ['admin', 'mailbox', filters] as const,
    mail: (id: number) => ['admin', 'mailbox', 'message', id] as const,
    invitations: (params: KeyParams = {}) => ['admin', 'invitations', params] as const,
    audit: (params: KeyParams = {}) => ['admin', 'audit', params] as const,
  },
} as const;
