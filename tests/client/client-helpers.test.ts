import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { signInSchema } from '@shared/api/auth.ts';
import { paths, safeRedirect } from '@/config/paths.ts';
import { issuesToErrors } from '@/components/ui/form.tsx';
import { ApiError, toApiError } from '@/lib/api-error.ts';
import { shouldRetry } from '@/lib/query-client.ts';
import { resolveTheme } from '@/lib/theme.ts';
import { inviteStatus } from '@/features/invites/components/invites-table.tsx';
import { linkify } from '@/features/outbox/components/outbox-message.tsx';

describe('safeRedirect', () => {
  it.each([
    ['/notebooks/42', '/notebooks/42'],
    ['/admin/users?page=2', '/admin/users?page=2'],
    [null, '/'],
    ['', '/'],
    ['https://elsewhere.example/', '/'],
    ['//elsewhere.example/', '/'],
    ['/\\elsewhere.example', '/'],
    ['/sign-in?redirectTo=/x', '/'],
  ])('sends %s to %s', (input, expected) => {
    expect(safeRedirect(input)).toBe(expected);
  });
  it('round-trips through the sign-in link', () => {
    const href = paths.signIn.getHref('/notebooks/a b?x=1');
    const back = new URL(href, 'http://localhost').searchParams.get('redirectTo');
    expect(safeRedirect(back)).toBe('/notebooks/a b?x=1');
  });
});

describe('toApiError', () => {
  it('keeps code, message and field issues from the API error shape', () => {
    const e = toApiError(400, {
      error: {
        code: 'validation_failed',
        message: 'Check the form',
        fields: [{ path: 'email', message: 'Enter a valid e-mail address' }],
      },
    });
    expect(e).toBeInstanceOf(ApiError);
    expect([e.status, e.code, e.message]).toEqual([400, 'validation_failed', 'Check the form']);
    expect(e.fieldMessage('email')).toBe('Enter a valid e-mail address');
    expect(e.fieldMessage('password')).toBeUndefined();
  });
  it.each([
    [401, 'unauthenticated'],
    [403, 'forbidden'],
    [404, 'not_found'],
    [429, 'rate_limited'],
    [502, 'internal_error'],
  ])('falls back to a stable code for a bare %i', (status, code) => {
    expect(toApiError(status, '<html>proxy error</html>').code).toBe(code);
  });
});

describe('shouldRetry', () => {
  it('retries network and server failures at most twice, never client errors', () => {
    expect(shouldRetry(0, new ApiError(0, 'network_error', 'x'))).toBe(true);
    expect(shouldRetry(1, new ApiError(503, 'internal_error', 'x'))).toBe(true);
    expect(shouldRetry(2, new ApiError(503, 'internal_error', 'x'))).toBe(false);
    expect(shouldRetry(0, new ApiError(404, 'not_found', 'x'))).toBe(false);
    expect(shouldRetry(0, new ApiError(401, 'unauthenticated', 'x'))).toBe(false);
  });
});

describe('issuesToErrors', () => {
  it('gives one message per field from the shared schema, the first one winning', () => {
    const r = signInSchema.safeParse({ email: 'not-an-address', password: '' });
    expect(r.success).toBe(false);
    expect(issuesToErrors(r.error!.issues)).toEqual({
      email: 'Enter a valid e-mail address',
      password: 'Enter your password',
    });
  });
  it('names nested fields by their dotted path', () => {
    const r = z.object({ a: z.object({ b: z.string() }) }).safeParse({ a: { b: 1 } });
    expect(Object.keys(issuesToErrors(r.error!.issues))).toEqual(['a.b']);
  });
});

describe('resolveTheme', () => {
  it('follows the system only when asked to', () => {
    expect(resolveTheme('system', true)).toBe('dark');
    expect(resolveTheme('system', false)).toBe('light');
    expect(resolveTheme('light', true)).toBe('light');
    expect(resolveTheme('dark', false)).toBe('dark');
  });
});

describe('inviteStatus', () => {
  const now = Date.parse('2026-12-01T12:00:00Z');
  it('reads accepted, waiting and expired invites', () => {
    expect(inviteStatus({ acceptedAt: '2026-11-30T00:00:00Z', expiresAt: '2026-11-29T00:00:00Z' }, now)).toBe(
      'accepted',
    );
    expect(inviteStatus({ acceptedAt: null, expiresAt: '2026-12-02T00:00:00Z' }, now)).toBe('pending');
    expect(inviteStatus({ acceptedAt: null, expiresAt: '2026-12-01T12:00:00Z' }, now)).toBe('expired');
  });
});

describe('linkify', () => {
  it('finds the links in a plain-text mail and keeps the rest as text', () => {
    const parts = linkify('Open http://127.0.0.1:4800/invite/abc123 to join.\nThanks');
    expect(parts).toEqual(['Open ', { href: 'http://127.0.0.1:4800/invite/abc123' }, ' to join.\nThanks']);
  });
  it('leaves text without links alone', () => {
    expect(linkify('no links here')).toEqual(['no links here']);
  });
});
