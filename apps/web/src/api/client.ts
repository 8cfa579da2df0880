import type { ApiErrorBody } from '@barmkeep/schemas';

/** Codes the client itself produces when the server gave no error body. */
export const clientErrorCodes = {
  network: 'network_error',
  badResponse: 'bad_response',
} as const;

/** An error response from the Barmkeep API, or a failure to reach it. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string[]>;
  readonly requestId: string | undefined;

  constructor(init: {
    status: number;
    code: string;
    message: string;
    fields?: Record<string, string[]>;
    requestId?: string;
  }) {
    super(init.message);
    this.name = 'ApiError';
    this.status = init.status;
    this.code = init.code;
    this.fields = init.fields ?? {};
    this.requestId = init.requestId;
  }

  get hasFieldErrors(): boolean {
    return Object.keys(this.fields).length > 0;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

function isErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const error = (value as { error: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { code?: unknown }).code === 'string' &&
    typeof (error as { message?: unknown }).message === 'string'
  );
}

function fallbackMessage(status: number): string {
  if (status === 401) return 'Please sign in again.';
  if (status === 403) return 'You do not have access to this.';
  if (status === 404) return 'This was not found.';
  if (status === 429) return 'Too many tries. Wait a moment and try again.';
  if (status >= 500) return 'Something went wrong on our side. Try again in a moment.';
  return `The request failed (status ${status}).`;
}

function fallbackCode(status: number): string {
  if (status === 401) return 'unauthenticated';
  if (status === 403) return 'forbidden';
  if (status === 404) return 'not_found';
  if (status === 429) return 'rate_limited';
  return clientErrorCodes.badResponse;
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  /** Sent as JSON. */
  body?: unknown;
  signal?: AbortSignal;
}

/**
 * Calls the API on the same origin. Resolves with the parsed JSON body
 * (undefined for 204), rejects with an ApiError for any non-2xx status or
 * when the server cannot be reached.
 */
export async function apiFetch<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const { method = 'GET', body, signal } = options;
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';

  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError({
      status: 0,
      code: clientErrorCodes.network,
      message: 'Could not reach Barmkeep. Check your connection and try again.',
    });
  }

  if (response.status === 204) return undefined as T;

  const text = await response.text();
  let parsed: unknown = undefined;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parsed = undefined;
    }
  }

  if (!response.ok) {
    if (isErrorBody(parsed)) {
      throw new ApiError({
        status: response.status,
        code: parsed.error.code,
        message: parsed.error.message,
        fields: parsed.error.fields,
        requestId: parsed.error.requestId,
      });
    }
    throw new ApiError({
      status: response.status,
      code: fallbackCode(response.status),
      message: fallbackMessage(response.status),
    });
  }

  if (text && parsed === undefined) {
    throw new ApiError({
      status: response.status,
      code: clientErrorCodes.badResponse,
      message: 'The server sent a reply Barmkeep could not read.',
    });
  }
  return parsed as T;
}

export const api = {
  get: <T>(path: string, signal?: AbortSignal) => apiFetch<T>(path, { signal }),
  post: <T>(path: string, body?: unknown) => apiFetch<T>(path, { method: 'POST', body }),
  patch: <T>(path: string, body?: unknown) => apiFetch<T>(path, { method: 'PATCH', body }),
  delete: <T>(path: string) => apiFetch<T>(path, { method: 'DELETE' }),
};
