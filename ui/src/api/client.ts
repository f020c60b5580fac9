import type { ErrorDetail, PageOf } from '@driftgrid/domain';
import { getToken } from '../auth/session.js';

/** One entry of an error's `details` (SPEC §6): the domain's ErrorDetail, as the api's error filter sends it. */
export type ApiErrorDetail = ErrorDetail;

/** Any failed api call. `status` 0 means the server could not be reached. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly error: string = '',
    readonly details: ApiErrorDetail[] = [],
    readonly correlationId?: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }

  /** The message for one field (`axes.0.min`), if the server named it. */
  detailFor(path: string): string | undefined {
    return this.details.find((d) => d.path === path)?.message;
  }
}

type UnauthorizedHandler = () => void;
let onUnauthorized: UnauthorizedHandler | null = null;

/** The app registers what happens when a signed-in call gets 401 (keep the route, go to sign-in). */
export function setUnauthorizedHandler(handler: UnauthorizedHandler | null): void {
  onUnauthorized = handler;
}

export type Query = Record<string, string | number | boolean | null | undefined>;

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** A plain object is sent as JSON; FormData as multipart. */
  body?: unknown;
  query?: Query;
  signal?: AbortSignal;
  /** false for calls that must not carry or react to a session (sign-in, invitations). */
  auth?: boolean;
  headers?: Record<string, string>;
}

export function buildUrl(path: string, query?: Query): string {
  const url = path.startsWith('/api') ? path : `/api${path.startsWith('/') ? '' : '/'}${path}`;
  if (!query) return url;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) {
    if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  }
  const qs = params.toString();
  return qs ? `${url}?${qs}` : url;
}

async function send(path: string, opts: RequestOptions): Promise<Response> {
  const headers: Record<string, string> = { Accept: 'application/json', ...opts.headers };
  const token = opts.auth === false ? null : getToken();
  if (token) headers.Authorization = `Bearer ${token}`;
  let body: BodyInit | undefined;
  if (opts.body instanceof FormData) body = opts.body;
  else if (opts.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }
  let res: Response;
  try {
    res = await fetch(buildUrl(path, opts.query), { method: opts.method ?? 'GET', headers, body, signal: opts.signal });
  } catch (err) {
    if (err instanceof DOMException && err.name === 'AbortError') throw err;
    throw new ApiError(
      0,
      'Cannot reach the Driftgrid server. Check that it is running and try again.',
      'Network Error',
    );
  }
  if (!res.ok) {
    const error = await toApiError(res);
    if (res.status === 401 && token && onUnauthorized) onUnauthorized();
    throw error;
  }
  return res;
}

/** Reads the SPEC §6 error shape `{ statusCode, error, message, details? }`, tolerating others. */
export async function toApiError(res: Response): Promise<ApiError> {
  const correlationId = res.headers.get('x-correlation-id') ?? res.headers.get('x-request-id') ?? undefined;
  let payload: unknown;
  try {
    const text = await res.text();
    payload = text ? JSON.parse(text) : null;
  } catch {
    payload = null;
  }
  const p = (payload && typeof payload === 'object' ? payload : {}) as Record<string, unknown>;
  const rawMessage = p.message;
  const message = Array.isArray(rawMessage)
    ? rawMessage.map(String).join('; ')
    : typeof rawMessage === 'string' && rawMessage
      ? rawMessage
      : `Request failed (${res.status}${res.statusText ? ` ${res.statusText}` : ''}).`;
  const details = Array.isArray(p.details)
    ? (p.details as unknown[]).filter(
        (d): d is ApiErrorDetail => !!d && typeof d === 'object' && typeof (d as ApiErrorDetail).message === 'string',
      )
    : [];
  const status = typeof p.statusCode === 'number' ? p.statusCode : res.status;
  return new ApiError(status, message, typeof p.error === 'string' ? p.error : res.statusText, details, correlationId);
}

/** A JSON call; 204 and empty bodies resolve to undefined. */
export async function apiRequest<T>(path: string, opts: RequestOptions = {}): Promise<T> {
  const res = await send(path, opts);
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

export const api = {
  get: <T>(path: string, query?: Query, signal?: AbortSignal) => apiRequest<T>(path, { query, signal }),
  post: <T>(path: string, body?: unknown, opts: Omit<RequestOptions, 'body' | 'method'> = {}) =>
    apiRequest<T>(path, { ...opts, method: 'POST', body }),
  put: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'PUT', body }),
  patch: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'PATCH', body }),
  delete: <T = void>(path: string) => apiRequest<T>(path, { method: 'DELETE' }),
};

/** A binary download (zip export) with the server's file name from Content-Disposition. */
export async function apiDownload(
  path: string,
  signal?: AbortSignal,
): Promise<{ blob: Blob; filename: string | null }> {
  const res = await send(path, { signal, headers: { Accept: '*/*' } });
  const disposition = res.headers.get('content-disposition') ?? '';
  const match = /filename\*?=(?:UTF-8'')?"?([^";]+)"?/i.exec(disposition);
  return { blob: await res.blob(), filename: match ? decodeURIComponent(match[1]!) : null };
}

/** Lists share one shape (SPEC §6), declared in the domain's contracts. */
export type Page<T> = PageOf<T>;
