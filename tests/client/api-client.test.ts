import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { apiRequest, resetCsrfToken } from '@/lib/api-client.ts';
import { ApiError } from '@/lib/api-error.ts';
import { toast } from '@/components/ui/toast.tsx';

type Call = { url: string; method: string; headers: Record<string, string>; body?: string };

/** A scripted stand-in for the server: answers each request from the queue, records what was sent. */
function fakeServer(answers: Array<(call: Call) => Response>) {
  const calls: Call[] = [];
  let csrfServed = 0;
  const fetchMock = vi.fn(async (url: string, init: RequestInit = {}) => {
    const call: Call = {
      url,
      method: init.method ?? 'GET',
      headers: (init.headers ?? {}) as Record<string, string>,
      body: init.body as string | undefined,
    };
    calls.push(call);
    if (url === '/api/auth/csrf') return Response.json({ csrfToken: `token-${++csrfServed}` });
    const next = answers.shift();
    if (!next) throw new Error(`unexpected request ${call.method} ${url}`);
    return next(call);
  });
  vi.stubGlobal('fetch', fetchMock);
  return { calls, csrfCalls: () => calls.filter((c) => c.url === '/api/auth/csrf').length };
}

const ok = (body: unknown) => () => Response.json(body);
const error =
  (status: number, code: string, message: string, fields?: { path: string; message: string }[]) => () =>
    Response.json({ error: { code, message, fields } }, { status });

beforeEach(() => {
  resetCsrfToken();
});
afterEach(() => {
  vi.unstubAllGlobals();
});

describe('apiRequest', () => {
  it('sends JSON with same-origin cookies and parses the answer with the given schema', async () => {
    const server = fakeServer([ok({ n: 3, extra: 'dropped' })]);
    const out = await apiRequest('/api/thing', { schema: z.object({ n: z.number() }) });
    expect(out).toEqual({ n: 3 });
    expect(server.calls[0].headers.accept).toBe('application/json');
    expect(server.csrfCalls()).toBe(0); // reads need no token
  });

  it('fetches the CSRF token once, caches it, and sends it on every state-changing request', async () => {
    const server = fakeServer([ok({}), ok({}), ok({})]);
    await apiRequest('/api/a', { method: 'POST', body: { x: 1 } });
    await apiRequest('/api/b', { method: 'PATCH', body: { x: 2 } });
    await apiRequest('/api/c', { method: 'DELETE' });
    expect(server.csrfCalls()).toBe(1);
    const writes = server.calls.filter((c) => c.url !== '/api/auth/csrf');
    expect(writes.map((c) => c.headers['x-csrf-token'])).toEqual(['token-1', 'token-1', 'token-1']);
    expect(writes[0].headers['content-type']).toBe('application/json');
    expect(JSON.parse(writes[0].body!)).toEqual({ x: 1 });
  });

  it('refetches the token once when the server rejects it, then retries the request', async () => {
    const server = fakeServer([error(403, 'csrf_invalid', 'Stale token'), ok({ done: true })]);
    const out = await apiRequest('/api/a', {
      method: 'POST',
      body: {},
      schema: z.object({ done: z.boolean() }),
    });
    expect(out).toEqual({ done: true });
    const writes = server.calls.filter((c) => c.url === '/api/a');
    expect(writes.map((c) => c.headers['x-csrf-token'])).toEqual(['token-1', 'token-2']);
  });

  it('does not retry a 403 that is a real refusal', async () => {
    fakeServer([error(403, 'forbidden', 'Only a PI may do that')]);
    await expect(apiRequest('/api/a', { method: 'POST' })).rejects.toMatchObject({
      status: 403,
      code: 'forbidden',
      message: 'Only a PI may do that',
    });
  });

  it('turns the error body into an ApiError with its field messages', async () => {
    fakeServer([
      error(400, 'validation_failed', 'Check the form', [
        { path: 'email', message: 'Enter a valid e-mail address' },
      ]),
    ]);
    const e = await apiRequest('/api/a', { method: 'POST', body: {} }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(ApiError);
    expect((e as ApiError).fieldMessage('email')).toBe('Enter a valid e-mail address');
  });

  it('reports an answer of the wrong shape, naming where', async () => {
    fakeServer([ok({ n: 'three' })]);
    await expect(apiRequest('/api/thing', { schema: z.object({ n: z.number() }) })).rejects.toMatchObject({
      code: 'unexpected_response',
      message: expect.stringContaining('at n'),
    });
  });

  it('sends the person to sign-in on 401, keeping where they were', async () => {
    fakeServer([error(401, 'unauthenticated', 'Please sign in')]);
    const assign = vi.fn();
    vi.stubGlobal('window', { location: { pathname: '/notebooks/42', search: '?tab=log', assign } });
    await expect(apiRequest('/api/notebooks/42')).rejects.toMatchObject({ status: 401 });
    expect(assign).toHaveBeenCalledWith('/sign-in?redirectTo=%2Fnotebooks%2F42%3Ftab%3Dlog');
  });

  it('leaves a 401 to the caller when asked (the session probe, the sign-in form)', async () => {
    fakeServer([error(401, 'unauthenticated', 'Please sign in')]);
    const assign = vi.fn();
    vi.stubGlobal('window', { location: { pathname: '/', search: '', assign } });
    await expect(apiRequest('/api/auth/me', { on401: 'return' })).rejects.toMatchObject({ status: 401 });
    expect(assign).not.toHaveBeenCalled();
  });

  it('says plainly when the server cannot be reached', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))),
    );
    await expect(apiRequest('/api/thing', { schema: z.object({}) })).rejects.toMatchObject({
      status: 0,
      code: 'network_error',
    });
  });

  it("shows the server's message when a service behind it is down (503), so the person knows nothing was saved", async () => {
    fakeServer([
      error(
        503,
        'database_unavailable',
        'The database is not reachable; nothing was saved. Try again in a moment.',
      ),
    ]);
    const shown = vi.spyOn(toast, 'show');
    await expect(apiRequest('/api/a', { method: 'POST', body: {} })).rejects.toMatchObject({
      status: 503,
      code: 'database_unavailable',
    });
    expect(shown).toHaveBeenCalledWith({
      tone: 'error',
      title: 'Temporarily unavailable',
      message: 'The database is not reachable; nothing was saved. Try again in a moment.',
    });
  });
});
