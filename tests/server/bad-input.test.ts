import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LIMITS } from '@shared/domain/limits.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { createTestApp, makeNotebook, makeUser, newAgent, signIn, type Agent, type TestApp } from '../support/test-app.ts';

/**
 * Bad input of every kind gets a 4xx JSON error with a stable code that names the field,
 * never a 500 or a stack trace.
 */
let t: TestApp;
let pi: { agent: Agent; csrf: string };
let anon: { agent: Agent; csrf: string };
let notebookId: string;

beforeAll(async () => {
  t = await createTestApp();
  const person = await makeUser(t.dataSource, { label: 'bad-input-pi' });
  pi = await signIn(t.app, person);
  anon = await newAgent(t.app);
  notebookId = (await makeNotebook(t.dataSource, person.user)).id;
});
afterAll(async () => {
  await t?.close();
});

type Who = 'anonymous' | 'pi';
interface Case {
  name: string;
  who: Who;
  method: 'post' | 'patch';
  url: () => string;
  /** A raw string is sent as-is with the given content type; anything else as JSON. */
  body: unknown;
  contentType?: string;
  status: number;
  code: string;
  fields?: string[];
}

const CASES: Case[] = [
  { name: 'malformed JSON on sign-in', who: 'anonymous', method: 'post', url: () => '/api/auth/sign-in', body: '{"email": "a@b.example",', contentType: 'application/json', status: 400, code: 'malformed_json' },
  { name: 'sign-in with no body', who: 'anonymous', method: 'post', url: () => '/api/auth/sign-in', body: undefined, status: 400, code: 'validation_failed', fields: ['email', 'password'] },
  { name: 'sign-in with missing password', who: 'anonymous', method: 'post', url: () => '/api/auth/sign-in', body: { email: DEMO_PEOPLE.pi.email }, status: 400, code: 'validation_failed', fields: ['password'] },
  { name: 'sign-in with a number for e-mail', who: 'anonymous', method: 'post', url: () => '/api/auth/sign-in', body: { email: 42, password: 'x' }, status: 400, code: 'validation_failed', fields: ['email'] },
  { name: 'sign-in with an array body', who: 'anonymous', method: 'post', url: () => '/api/auth/sign-in', body: [1, 2], status: 400, code: 'validation_failed', fields: ['(body)'] },
  { name: 'sign-in as form data', who: 'anonymous', method: 'post', url: () => '/api/auth/sign-in', body: 'email=a&password=b', contentType: 'application/x-www-form-urlencoded', status: 400, code: 'validation_failed', fields: ['email', 'password'] },
  { name: 'reset request with an invalid address', who: 'anonymous', method: 'post', url: () => '/api/auth/password-reset', body: { email: 'not-an-address' }, status: 400, code: 'validation_failed', fields: ['email'] },
  { name: 'reset completion with a short token and password', who: 'anonymous', method: 'post', url: () => '/api/auth/password-reset/complete', body: { token: 'short', password: 'short' }, status: 400, code: 'validation_failed', fields: ['token', 'password'] },
  { name: 'invite acceptance with a password too long', who: 'anonymous', method: 'post', url: () => '/api/invites/some-token-value-here/accept', body: { password: 'x'.repeat(LIMITS.passwordMax + 1) }, status: 400, code: 'validation_failed', fields: ['password'] },
  { name: 'notebook with a numeric title', who: 'pi', method: 'post', url: () => '/api/notebooks', body: { title: 12 }, status: 400, code: 'validation_failed', fields: ['title'] },
  { name: 'notebook with a blank title', who: 'pi', method: 'post', url: () => '/api/notebooks', body: { title: '   ' }, status: 400, code: 'validation_failed', fields: ['title'] },
  { name: 'notebook with a title too long', who: 'pi', method: 'post', url: () => '/api/notebooks', body: { title: 'x'.repeat(LIMITS.notebookTitleMax + 1) }, status: 400, code: 'validation_failed', fields: ['title'] },
  { name: 'notebook update with a wrong type', who: 'pi', method: 'patch', url: () => `/api/notebooks/${notebookId}`, body: { description: ['a'] }, status: 400, code: 'validation_failed', fields: ['description'] },
  { name: 'member with an unknown role', who: 'pi', method: 'post', url: () => `/api/notebooks/${notebookId}/members`, body: { email: DEMO_PEOPLE.reader.email, role: 'boss' }, status: 400, code: 'validation_failed', fields: ['role'] },
  { name: 'member with nothing', who: 'pi', method: 'post', url: () => `/api/notebooks/${notebookId}/members`, body: {}, status: 400, code: 'validation_failed', fields: ['email', 'role'] },
  { name: 'notebook id that is not a UUID', who: 'pi', method: 'patch', url: () => '/api/notebooks/not-a-uuid', body: { title: 'x' }, status: 404, code: 'not_found' },
  { name: 'member id that is not a UUID', who: 'pi', method: 'patch', url: () => `/api/notebooks/${notebookId}/members/12`, body: { role: 'reader' }, status: 404, code: 'not_found' },
  { name: 'a path with broken percent-encoding', who: 'pi', method: 'patch', url: () => '/api/notebooks/%E0%A4%A', body: { title: 'x' }, status: 400, code: 'validation_failed' },
  { name: 'an API route that does not exist', who: 'pi', method: 'post', url: () => '/api/nothing-here', body: {}, status: 404, code: 'not_found' },
  {
    name: 'a body over the size limit',
    who: 'pi',
    method: 'post',
    url: () => '/api/notebooks',
    body: JSON.stringify({ title: 'big', description: 'x'.repeat(LIMITS.jsonBodyBytes + 10) }),
    contentType: 'application/json',
    status: 413,
    code: 'payload_too_large',
  },
];

describe('bad input', () => {
  it.each(CASES)('$name → $status $code', async (c) => {
    const { agent, csrf } = c.who === 'pi' ? pi : anon;
    let req = agent[c.method](c.url()).set('x-csrf-token', csrf);
    if (typeof c.body === 'string') req = req.set('content-type', c.contentType ?? 'application/json').send(c.body);
    else if (c.body !== undefined) req = req.send(c.body as object);
    const res = await req;
    expect(res.status, JSON.stringify(res.body)).toBe(c.status);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(res.body.error.code).toBe(c.code);
    expect(typeof res.body.error.message).toBe('string');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts:\d+|node_modules|stack/i);
    if (c.fields) expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual([...c.fields].sort());
  });
});

describe('any JSON at all', () => {
  const targets = [
    { method: 'post' as const, url: () => '/api/notebooks' },
    { method: 'patch' as const, url: () => `/api/notebooks/${notebookId}` },
    { method: 'post' as const, url: () => `/api/notebooks/${notebookId}/members` },
    { method: 'post' as const, url: () => '/api/account/password' },
  ];
  it.each(targets.map((target) => ({ ...target, label: `${target.method.toUpperCase()} ${target.url()}` })))(
    'never gets a 500 from $label',
    async (target) => {
      await fc.assert(
        fc.asyncProperty(fc.jsonValue({ maxDepth: 3 }), async (value) => {
          const res = await pi.agent[target.method](target.url()).set('x-csrf-token', pi.csrf).set('content-type', 'application/json').send(JSON.stringify(value));
          expect(res.status).toBeGreaterThanOrEqual(200);
          expect(res.status).toBeLessThan(500);
          if (res.status >= 400) expect(typeof res.body.error.code).toBe('string');
        }),
        { numRuns: 40 },
      );
    },
  );
});
