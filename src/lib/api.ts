import type { z } from 'zod';

/** A response schema: full zod or zod/mini (the shell uses the smaller build). */
export interface ResponseSchema<T> {
  safeParse(
    data: unknown,
  ): { success: true; data: T } | { success: false; error: { issues: z.core.$ZodIssue[] } };
}

/** Shape of every error body the server sends: `{ error: { code, message, details } }`. */
export interface ApiErrorBody {
  readonly code: string;
  readonly message: string;
  readonly details?: unknown;
}

/** A failed API call: HTTP status plus the server's error code, message and details. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;

  constructor(status: number, body: ApiErrorBody) {
    super(body.message);
    this.name = 'ApiError';
    this.status = status;
    this.code = body.code;
    this.details = body.details;
  }
}

export const isApiError = (e: unknown): e is ApiError => e instanceof ApiError;

/** Prefix for every API call; tests and the dev server both serve the API on the same origin. */
export const API_BASE = '/api';

export interface RequestOptions<T> {
  readonly method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  readonly body?: unknown;
  /** Sent as is with this content type instead of a JSON body (CSV uploads). */
  readonly rawBody?: { readonly contentType: string; readonly text: string };
  readonly query?: Record<string, string | number | undefined | null>;
  /** When given, the answer is validated; a mismatch is reported as an ApiError with code `bad-response`. */
  readonly schema?: ResponseSchema<T>;
  readonly signal?: AbortSignal;
}

function buildUrl(path: string, query?: RequestOptions<unknown>['query']): string {
  const url = `${API_BASE}${path}`;
  if (!query) return url;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) {
    if (v === undefined || v === null || v === '') continue;
    params.set(k, String(v));
  }
  const qs = params.toString();
  return qs === '' ? url : `${url}?${qs}`;
}

function readErrorBody(status: number, statusText: string, data: unknown): ApiErrorBody {
  if (data && typeof data === 'object' && 'error' in data) {
    const err = (data as { error: unknown }).error;
    if (err && typeof err === 'object') {
      const e = err as Partial<ApiErrorBody>;
      return {
        code: typeof e.code === 'string' ? e.code : `http-${status}`,
        message:
          typeof e.message === 'string' ? e.message : statusText || `request failed (${status})`,
        details: e.details,
      };
    }
  }
  // better-auth answers `{ code, message }` without the wrapper.
  if (data && typeof data === 'object' && 'message' in data) {
    const e = data as { code?: unknown; message?: unknown };
    return {
      code: typeof e.code === 'string' ? e.code : `http-${status}`,
      message: String(e.message),
    };
  }
  return { code: `http-${status}`, message: statusText || `request failed (${status})` };
}

/**
 * Call the Spoolwright API with the session cookie. JSON in, JSON out; a non-2xx answer
 * becomes an {@link ApiError} carrying the server's `{ code, message, details }`.
 */
export async function apiRequest<T = unknown>(
  path: string,
  opts: RequestOptions<T> = {},
): Promise<T> {
  const raw = opts.rawBody;
  const init: RequestInit = {
    method: opts.method ?? (opts.body === undefined && raw === undefined ? 'GET' : 'POST'),
    credentials: 'include',
    headers: {
      Accept: 'application/json',
      ...(raw
        ? { 'Content-Type': raw.contentType }
        : opts.body === undefined
          ? {}
          : { 'Content-Type': 'application/json' }),
    },
    body: raw ? raw.text : opts.body === undefined ? undefined : JSON.stringify(opts.body),
    signal: opts.signal,
  };
  let res: Response;
  try {
    res = await fetch(buildUrl(path, opts.query), init);
  } catch (e) {
    if (e instanceof DOMException && e.name === 'AbortError') throw e;
    throw new ApiError(0, { code: 'network', message: 'the server could not be reached' });
  }
  const text = await res.text();
  let data: unknown = undefined;
  if (text !== '') {
    try {
      data = JSON.parse(text);
    } catch {
      data = undefined;
    }
  }
  if (!res.ok) throw new ApiError(res.status, readErrorBody(res.status, res.statusText, data));
  if (opts.schema) {
    const parsed = opts.schema.safeParse(data);
    if (!parsed.success) {
      throw new ApiError(res.status, {
        code: 'bad-response',
        message: `unexpected answer from ${path}: ${parsed.error.issues[0]?.message ?? 'invalid'}`,
        details: parsed.error.issues,
      });
    }
    return parsed.data;
  }
  return data as T;
}
