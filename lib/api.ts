/**
 * The one HTTP client. Turns HTTP and network failures into typed errors; `describeError()` maps
 * them to text a user can act on. Screens never call fetch: hooks call this.
 */
import type { ApiErrorBody } from '@/shared/schemas';
import { apiUrl } from './api-base';
import { markUnreachable } from './online';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

/** The request never got an answer: offline, DNS, server down, connection dropped. */
export class NetworkError extends Error {
  constructor(cause?: unknown) {
    super('No connection to the server');
    this.cause = cause;
  }
}

async function request<T>(method: string, path: string, body?: unknown): Promise<T> {
  let response: Response;
  try {
    response = await fetch(apiUrl(path), {
      method,
      credentials: 'include',
      headers: body === undefined ? undefined : { 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch (error) {
    markUnreachable();
    throw new NetworkError(error);
  }
  const text = await response.text();
  let json: unknown = undefined;
  try {
    json = text ? JSON.parse(text) : undefined;
  } catch {
    // a proxy's HTML error page: fall through to the status
  }
  if (!response.ok) {
    const error = (json as ApiErrorBody | undefined)?.error;
    throw new ApiError(
      response.status,
      error?.code ?? 'http_' + response.status,
      error?.message ?? `The server answered ${response.status}`,
      error?.fields,
    );
  }
  return json as T;
}

export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  del: <T>(path: string) => request<T>('DELETE', path),
};

export function isUnauthorised(error: unknown): boolean {
  return error instanceof ApiError && error.status === 401;
}

export function describeError(error: unknown): string {
  if (error instanceof NetworkError) {
    return 'No connection to the server. Check the signal and try again.';
  }
  if (error instanceof ApiError) {
    if (error.status === 401) {
      return error.code === 'bad_credentials' ? error.message : 'You are signed out. Sign in again.';
    }
    if (error.status === 403) return error.message;
    if (error.status === 404) return 'This was not found. It may have been deleted.';
    if (error.status === 429) return error.message;
    if (error.status >= 500) return 'The server had a problem. Try again in a minute.';
    return error.message;
  }
  return 'Something went wrong. Try again.';
}
