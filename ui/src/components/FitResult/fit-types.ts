import { api, type Page } from '../../api/client.js';

// The fit shape GET /api/fits/:id returns (SPEC §6 plus intervals, plot data, versions).
import type { FitParameterView, FitPlotData } from '@driftgrid/domain';

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

export const fitsApi = {
  create: (body: FitRequestBody) => api.post<FitCreated>('/fits', body),
  get: (id: number | string, signal?: AbortSignal) => api.get<FitView>(`/fits/${id}`, undefined, signal),
  list: (
    q: { sourceKind?: FitSourceKind; sourceId?: number; page?: number; pageSize?: number },
    signal?: AbortSignal,
  ) => api.get<Page<FitView>>('/fits', q, signal),
};

export const LIVE_FIT = new Set(['queued', 'running']);

export const MODEL_LABEL: Record<string, string> = {
  'power-law': 'Power law',
  exponential: 'Exponential (Boltzmann)',
  polytropic: 'Polytropic',
  expression: 'Expression',
};

export function xList(x: string | string[]): string[] {
  return Array.isArray(x) ? x : [x];
}
