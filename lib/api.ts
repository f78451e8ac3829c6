/**
 * The one HTTP client. Turns HTTP and network failures into typed errors; `describeError()` maps
 * them to text a user can act on. Screens never call fetch: hooks call this. An answer that is
 * read is read through its shared zod schema (the server answers with the same ones), so a
 * malformed answer stops here, named field by field, instead of reaching the device's copy.
 */
import type { z } from 'zod';
import { fieldErrors, type ApiErrorBody } from '@/shared/schemas';
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

async function request(method: string, path: string, body?: unknown): Promise<unknown> {
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
  return json;
}

/** What the answer is, by its schema; an answer of another shape is an ApiError `bad_response`. */
async function read<S extends z.ZodType>(answer: Promise<unknown>, schema: S): Promise<z.output<S>> {
  const parsed = schema.safeParse(await answer);
  if (parsed.success) return parsed.data;
  throw new ApiError(
    200,
    'bad_response',
    'The server’s answer was not in the form this app expects. Reload the app; if it keeps happening, tell your administrator.',
    fieldErrors(parsed.error),
  );
}

function post<S extends z.ZodType>(path: string, body: unknown, schema: S): Promise<z.output<S>>;
function post(path: string, body?: unknown): Promise<void>;
function post(path: string, body: unknown = {}, schema?: z.ZodType): Promise<unknown> {
  return schema ? read(request('POST', path, body), schema) : request('POST', path, body).then(() => undefined);
}

/**
 * `get` always reads its answer, so it takes the schema; a write takes one when its answer is
 * read (a write whose answer is ignored returns nothing to read).
 */
export const api = {
  get: <S extends z.ZodType>(path: string, schema: S) => read(request('GET', path), schema),
  post,
  patch: (path: string, body: unknown) => request('PATCH', path, body).then(() => undefined),
  del: (path: string) => request('DELETE', path).then(() => undefined),
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
