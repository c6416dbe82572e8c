import type { z } from 'zod';
import { csrfResponseSchema } from '@shared/api/auth.ts';
import { ERROR_CODES } from '@shared/api/errors.ts';
import { paths } from '@/config/paths.ts';
import { toast } from '@/components/ui/toast.tsx';
import { ApiError, toApiError } from './api-error.ts';

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export type RequestOptions<T> = {
  method?: Method;
  body?: unknown;
  /** Shared zod schema the response must satisfy; omit for empty (204/202) responses. */
  schema?: z.ZodType<T>;
  /**
   * What a 401 means. 'redirect' (default): the session ended, go to sign-in and come back.
   * 'return': the caller handles it (the session probe, the sign-in form itself).
   */
  on401?: 'redirect' | 'return';
  signal?: AbortSignal;
};

let csrfToken: Promise<string> | null = null;

function fetchCsrfToken(): Promise<string> {
  csrfToken ??= fetch('/api/auth/csrf', {
    credentials: 'same-origin',
    headers: { accept: 'application/json' },
  })
    .then(async (res) => {
      if (!res.ok) throw toApiError(res.status, await readJson(res));
      return csrfResponseSchema.parse(await res.json()).csrfToken;
    })
    .catch((e: unknown) => {
      csrfToken = null;
      throw e;
    });
  return csrfToken;
}

/** Forget the CSRF token (after sign-in or sign-out the server issues a new session). */
export function resetCsrfToken(): void {
  csrfToken = null;
}

async function readJson(res: Response): Promise<unknown> {
  const text = await res.text();
  if (!text) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

function redirectToSignIn(): void {
  const here = `${window.location.pathname}${window.location.search}`;
  if (window.location.pathname === paths.signIn.path) return;
  window.location.assign(paths.signIn.getHref(here));
}

async function send(path: string, method: Method, body: unknown, signal?: AbortSignal): Promise<Response> {
  const headers: Record<string, string> = { accept: 'application/json' };
  if (body !== undefined) headers['content-type'] = 'application/json';
  if (method !== 'GET') headers['x-csrf-token'] = await fetchCsrfToken();
  return fetch(path, {
    method,
    headers,
    credentials: 'same-origin',
    body: body === undefined ? undefined : JSON.stringify(body),
    signal,
  });
}

/**
 * The one way the client talks to the API: JSON in and out, same-origin cookies, the CSRF
 * token on every state-changing request (fetched once, refetched once if the server rejects it),
 * error bodies turned into ApiError, a toast for failures nobody can fix by editing a form.
 */
export async function apiRequest<T = void>(path: string, options: RequestOptions<T> = {}): Promise<T> {
  const method = options.method ?? 'GET';
  let res: Response;
  try {
    res = await send(path, method, options.body, options.signal);
    if (res.status === 403 && method !== 'GET') {
      const first = toApiError(403, await readJson(res.clone()));
      if (first.code === ERROR_CODES.csrf) {
        resetCsrfToken();
        res = await send(path, method, options.body, options.signal);
      }
    }
  } catch (e) {
    if (e instanceof ApiError) throw notify(e);
    if ((e as Error).name === 'AbortError') throw e;
    throw notify(
      new ApiError(
        0,
        'network_error',
        'The server could not be reached. Check your connection and try again.',
      ),
    );
  }

  if (!res.ok) {
    const error = toApiError(res.status, await readJson(res));
    if (res.status === 401 && (options.on401 ?? 'redirect') === 'redirect') redirectToSignIn();
    throw notify(error);
  }
  if (!options.schema) return undefined as T;
  const data = await readJson(res);
  const parsed = options.schema.safeParse(data);
  if (!parsed.success) {
    const where = parsed.error.issues[0]?.path.join('.') || 'body';
    throw notify(
      new ApiError(
        res.status,
        'unexpected_response',
        `The server's answer did not have the expected shape (at ${where}).`,
      ),
    );
  }
  return parsed.data;
}

/** Errors a person can't fix by correcting a form get a toast; the rest are shown where they happened. */
function notify(error: ApiError): ApiError {
  if (
    error.status === 0 ||
    error.status >= 500 ||
    error.code === 'unexpected_response' ||
    error.code === ERROR_CODES.rateLimited
  ) {
    toast.show({
      tone: 'error',
      title:
        error.status === 0
          ? 'Connection problem'
          : error.status === 503
            ? 'Temporarily unavailable'
            : 'Something went wrong',
      message: error.message,
    });
  }
  return error;
}

export const api = {
  get: <T>(path: string, schema: z.ZodType<T>, opts: Omit<RequestOptions<T>, 'schema' | 'method'> = {}) =>
    apiRequest(path, { ...opts, schema }),
  post: <T = void>(path: string, body?: unknown, schema?: z.ZodType<T>) =>
    apiRequest<T>(path, { method: 'POST', body, schema }),
  patch: <T = void>(path: string, body?: unknown, schema?: z.ZodType<T>) =>
    apiRequest<T>(path, { method: 'PATCH', body, schema }),
  put: <T = void>(path: string, body?: unknown, schema?: z.ZodType<T>) =>
    apiRequest<T>(path, { method: 'PUT', body, schema }),
  delete: (path: string) => apiRequest<void>(path, { method: 'DELETE' }),
};
