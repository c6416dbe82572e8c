import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SESSION_COOKIE } from '@server/app.ts';
import { NotebookEntity } from '@server/entities/notebook.entity.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { createTestApp, makeNotebook, makeUser, newAgent, signIn, type TestApp } from '../support/test-app.ts';

/**
 * Session management and request integrity, by the OWASP Application Security Verification
 * Standard 4.0.3, chapter V3 (session management), V4.2.2 (CSRF) and V14.4 (HTTP security headers).
 */
let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
});

/** The session cookie ("name=value") a response sets, if any. */
function sessionCookieOf(res: { headers: Record<string, unknown> }): string | null {
  const raw = res.headers['set-cookie'];
  const cookies = Array.isArray(raw) ? (raw as string[]) : typeof raw === 'string' ? [raw] : [];
  const mine = cookies.find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  return mine ? mine.split(';')[0] : null;
}

/** The full Set-Cookie line of the session cookie. */
function sessionCookieLine(res: { headers: Record<string, unknown> }): string {
  const raw = res.headers['set-cookie'];
  const cookies = Array.isArray(raw) ? (raw as string[]) : [];
  const line = cookies.find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!line) throw new Error('no session cookie set');
  return line;
}

/** The session id inside a signed cookie value ("s:<sid>.<signature>", URL-encoded). */
const sidOf = (cookie: string) => decodeURIComponent(cookie.slice(SESSION_COOKIE.length + 1)).replace(/^s:/, '').split('.')[0];

/** A fresh client that sends only this cookie. */
const replay = (cookie: string) => request(t.app).get('/api/auth/me').set('Cookie', cookie);

/** Signs in step by step, keeping the cookie from before and after. */
async function signInTracked(person: { email: string; password: string }) {
  const agent = request.agent(t.app);
  const csrfRes = await agent.get('/api/auth/csrf').expect(200);
  const before = sessionCookieOf(csrfRes);
  const csrf = csrfRes.body.csrfToken as string;
  const signed = await agent.post('/api/auth/sign-in').set('x-csrf-token', csrf).send({ email: person.email, password: person.password });
  expect(signed.status).toBe(200);
  const after = sessionCookieOf(signed);
  return { agent, csrf, before, after, signed };
}

describe('ASVS V3 session management', () => {
  it('V3.2.1: sign-in issues a new session id; the cookie from before sign-in is not signed in', async () => {
    const person = await makeUser(t.dataSource, { label: 'fixation' });
    const { before, after } = await signInTracked(person);
    expect(before).not.toBeNull();
    expect(after).not.toBeNull();
    expect(sidOf(after as string)).not.toBe(sidOf(before as string));
    expect((await replay(before as string)).status).toBe(401);
    expect((await replay(after as string)).status).toBe(200);
  });

  it('V3.4.1–V3.4.3: the session cookie is HttpOnly, SameSite=Lax, on path /, with a 12-hour lifetime', async () => {
    const person = await makeUser(t.dataSource, { label: 'cookie-flags' });
    const { signed } = await signInTracked(person);
    const line = sessionCookieLine(signed);
    expect(line).toMatch(/;\s*HttpOnly/i);
    expect(line).toMatch(/;\s*SameSite=Lax/i);
    expect(line).toMatch(/;\s*Path=\//);
    const expires = /;\s*Expires=([^;]+)/i.exec(line)?.[1];
    expect(expires).toBeDefined();
    const lifetimeH = (Date.parse(expires as string) - Date.now()) / 3600_000;
    expect(lifetimeH).toBeGreaterThan(11.9);
    expect(lifetimeH).toBeLessThanOrEqual(12);
    // Plain http here, so not Secure; auth.test.ts checks Secure behind an https address.
    expect(line).not.toMatch(/;\s*Secure/i);
  });

  it('V3.3.1: sign-out ends the session on the server; replaying its cookie gets 401', async () => {
    const person = await makeUser(t.dataSource, { label: 'sign-out' });
    const { agent, csrf, after } = await signInTracked(person);
    expect((await agent.post('/api/auth/sign-out').set('x-csrf-token', csrf)).status).toBe(204);
    const res = await replay(after as string);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
    const left = await t.dataSource.query(`SELECT count(*)::int AS n FROM session WHERE sid = $1 AND sess -> 'passport' ->> 'user' IS NOT NULL`, [sidOf(after as string)]);
    expect(left[0].n).toBe(0);
  });

  it('V3.3.1: a session past its expiry time is refused even with a valid signed cookie', async () => {
    const person = await makeUser(t.dataSource, { label: 'expired' });
    const { after } = await signInTracked(person);
    const sid = sidOf(after as string);
    const stored = await t.dataSource.query(`SELECT expire FROM session WHERE sid = $1`, [sid]);
    const hours = (new Date(stored[0].expire).getTime() - Date.now()) / 3600_000;
    expect(hours).toBeGreaterThan(11.9);
    await t.dataSource.query(`UPDATE session SET expire = now() - interval '1 second' WHERE sid = $1`, [sid]);
    expect((await replay(after as string)).status).toBe(401);
  });

  it('V3.3.3: changing the password ends the person’s other sessions and keeps the one that changed it', async () => {
    const person = await makeUser(t.dataSource, { label: 'everywhere' });
    const laptop = await signInTracked(person);
    const phone = await signInTracked(person);
    const stranger = await signIn(t.app, await makeUser(t.dataSource, { label: 'bystander' }));
    const res = await laptop.agent
      .post('/api/account/password')
      .set('x-csrf-token', laptop.csrf)
      .send({ currentPassword: person.password, newPassword: 'a brand new long passphrase' });
    expect(res.status, JSON.stringify(res.body)).toBe(204);
    expect((await replay(phone.after as string)).status).toBe(401);
    expect((await laptop.agent.get('/api/auth/me')).status).toBe(200);
    // Someone else's session is untouched.
    expect((await stranger.agent.get('/api/auth/me')).status).toBe(200);
  });

  it('V3.3.3: an administrator deactivating an account ends all of its sessions', async () => {
    const person = await makeUser(t.dataSource, { label: 'deactivated' });
    const one = await signInTracked(person);
    const two = await signInTracked(person);
    const admin = await signIn(t.app, DEMO_PEOPLE.admin);
    const res = await admin.agent.patch(`/api/users/${person.user.id}`).set('x-csrf-token', admin.csrf).send({ active: false });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect((await replay(one.after as string)).status).toBe(401);
    expect((await replay(two.after as string)).status).toBe(401);
  });

  it('tampering: a cookie whose signature does not match is treated as no session', async () => {
    const person = await makeUser(t.dataSource, { label: 'tampered' });
    const { after } = await signInTracked(person);
    const cookie = after as string;
    const forged = `${cookie.slice(0, -3)}${cookie.endsWith('AAA') ? 'BBB' : 'AAA'}`;
    expect((await replay(forged)).status).toBe(401);
    // A made-up session id with no signature at all.
    expect((await replay(`${SESSION_COOKIE}=${randomUUID()}`)).status).toBe(401);
  });
});

describe('ASVS V4.2.2 / V13.2.3 CSRF on every state-changing route family', () => {
  let pi: Awaited<ReturnType<typeof signIn>>;
  let otherToken: string;
  let notebookId: string;
  const entryId = randomUUID();
  const some = randomUUID();

  beforeAll(async () => {
    const person = await makeUser(t.dataSource, { label: 'csrf-pi' });
    pi = await signIn(t.app, person);
    otherToken = (await newAgent(t.app)).csrf;
    notebookId = (await makeNotebook(t.dataSource, person.user)).id;
  });

  const nb = () => `/api/notebooks/${notebookId}`;
  const en = () => `${nb()}/entries/${entryId}`;
  type Method = 'post' | 'put' | 'patch' | 'delete';
  const ROUTES: { family: string; method: Method; url: () => string; body?: object }[] = [
    { family: 'sign-in', method: 'post', url: () => '/api/auth/sign-in', body: { email: DEMO_PEOPLE.pi.email, password: DEMO_PEOPLE.pi.password } },
    { family: 'sign-out', method: 'post', url: () => '/api/auth/sign-out' },
    { family: 'password reset request', method: 'post', url: () => '/api/auth/password-reset', body: { email: 'x@test.example' } },
    { family: 'password reset completion', method: 'post', url: () => '/api/auth/password-reset/complete', body: { token: 'x'.repeat(40), password: 'long enough password' } },
    { family: 'invite', method: 'post', url: () => '/api/invites', body: { email: 'csrf@test.example', name: 'CSRF' } },
    { family: 'invite acceptance', method: 'post', url: () => `/api/invites/${'t'.repeat(40)}/accept`, body: { password: 'long enough password' } },
    { family: 'person update', method: 'patch', url: () => `/api/users/${some}`, body: { active: false } },
    { family: 'own account', method: 'patch', url: () => '/api/account', body: { name: 'Changed' } },
    { family: 'own password', method: 'post', url: () => '/api/account/password', body: { currentPassword: 'x', newPassword: 'long enough password' } },
    { family: 'notification preferences', method: 'put', url: () => '/api/account/notifications', body: {} },
    { family: 'notebook create', method: 'post', url: () => '/api/notebooks', body: { title: 'Forged notebook' } },
    { family: 'notebook update', method: 'patch', url: nb, body: { title: 'Forged title' } },
    { family: 'member add', method: 'post', url: () => `${nb()}/members`, body: { email: DEMO_PEOPLE.reader.email, role: 'pi' } },
    { family: 'member role', method: 'patch', url: () => `${nb()}/members/${some}`, body: { role: 'pi' } },
    { family: 'member removal', method: 'delete', url: () => `${nb()}/members/${some}` },
    { family: 'entry create', method: 'post', url: () => `${nb()}/entries`, body: { title: 'Forged', entryDate: '2026-11-30' } },
    { family: 'draft save', method: 'put', url: () => `${en()}/draft`, body: {} },
    { family: 'draft discard', method: 'delete', url: () => `${en()}/draft` },
    { family: 'revision record', method: 'post', url: () => `${en()}/revisions`, body: {} },
    { family: 'revision restore', method: 'post', url: () => `${en()}/revisions/${some}/restore`, body: { baseRevisionId: some } },
    { family: 'cell run', method: 'post', url: () => `${en()}/cells/${some}/run`, body: { model: {}, task: {} } },
    { family: 'cell run cancel', method: 'delete', url: () => `${en()}/cells/${some}/run` },
    { family: 'model check', method: 'post', url: () => '/api/engine/validate-model', body: { model: {} } },
    { family: 'review submit', method: 'post', url: () => `${en()}/review`, body: { revisionId: some } },
    { family: 'review mark seen', method: 'post', url: () => `${en()}/review/mark-seen`, body: { revisionId: some } },
    { family: 'review request changes', method: 'post', url: () => `${en()}/review/request-changes`, body: { revisionId: some, comment: 'x' } },
    { family: 'review approve', method: 'post', url: () => `${en()}/review/approve`, body: { revisionId: some, password: 'x' } },
    { family: 'comment', method: 'post', url: () => `${en()}/comments`, body: { anchor: { revisionId: some }, body: 'x' } },
    { family: 'comment resolve', method: 'post', url: () => `${en()}/comments/${some}/resolve` },
    { family: 'comment reopen', method: 'post', url: () => `${en()}/comments/${some}/reopen` },
    { family: 'attachment upload', method: 'post', url: () => `${en()}/attachments` },
    { family: 'attachment removal', method: 'delete', url: () => `${en()}/attachments/${some}` },
    { family: 'figure attach', method: 'post', url: () => `${en()}/figures`, body: { revisionId: some, cellId: some } },
    { family: 'measurements import', method: 'post', url: () => `${en()}/measurements`, body: { name: 'x', csv: 'a,b\n1,2\n' } },
  ];

  const CASES = ROUTES.flatMap((r) => [
    { ...r, token: 'missing' as const },
    { ...r, token: 'another session’s' as const },
    { ...r, token: 'made-up' as const },
  ]);

  it.each(CASES)('$family ($method) with a $token token → 403 csrf_invalid', async (c) => {
    let req = pi.agent[c.method](c.url());
    if (c.token === 'another session’s') req = req.set('x-csrf-token', otherToken);
    if (c.token === 'made-up') req = req.set('x-csrf-token', 'not-a-real-token');
    const res = await (c.body ? req.send(c.body) : req);
    expect(res.status, JSON.stringify(res.body)).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
  });

  it('a refused request changes nothing, and the session stays signed in', async () => {
    await pi.agent.patch(nb()).send({ title: 'Forged title' });
    await pi.agent.post('/api/notebooks').set('x-csrf-token', otherToken).send({ title: 'Forged notebook' });
    const notebook = await t.dataSource.manager.findOneByOrFail(NotebookEntity, { id: notebookId });
    expect(notebook.title).not.toBe('Forged title');
    expect(await t.dataSource.manager.countBy(NotebookEntity, { title: 'Forged notebook' })).toBe(0);
    expect((await pi.agent.get('/api/auth/me')).status).toBe(200);
  });

  it('the token is not accepted from a query string or a form field, only from the header', async () => {
    const viaQuery = await pi.agent.post(`/api/notebooks?_csrf=${encodeURIComponent(pi.csrf)}`).send({ title: 'Query token' });
    expect(viaQuery.status).toBe(403);
    const viaBody = await pi.agent.post('/api/notebooks').send({ title: 'Body token', _csrf: pi.csrf, csrfToken: pi.csrf });
    expect(viaBody.status).toBe(403);
  });
});

describe('ASVS V14.4 security headers', () => {
  /** The CSP's directives as a map of name → sources. */
  function cspOf(header: unknown): Map<string, string[]> {
    expect(typeof header).toBe('string');
    return new Map(
      String(header)
        .split(';')
        .map((d) => d.trim().split(/\s+/))
        .filter((parts) => parts[0])
        .map(([name, ...sources]) => [name, sources]),
    );
  }

  it.each(['/api/health', '/api/auth/me', '/api/nothing-here'])('V14.4.3: %s carries a Content-Security-Policy that allows no inline or eval’d script', async (url) => {
    const res = await request(t.app).get(url);
    const csp = cspOf(res.headers['content-security-policy']);
    const scriptSrc = csp.get('script-src') ?? csp.get('default-src');
    expect(scriptSrc).toEqual(["'self'"]);
    expect(scriptSrc).not.toContain("'unsafe-inline'");
    expect(scriptSrc).not.toContain("'unsafe-eval'");
    // Inline event handlers (onclick="…") are refused outright.
    expect(csp.get('script-src-attr')).toEqual(["'none'"]);
    expect(csp.get('object-src')).toEqual(["'none'"]);
    expect(csp.get('base-uri')).toEqual(["'self'"]);
    expect(csp.get('frame-ancestors')).toEqual(["'self'"]);
    expect(csp.get('default-src')).toEqual(["'self'"]);
  });

  it('V14.4.4, V14.4.6, V14.4.7: nosniff, no framing by other sites, a strict referrer policy and no X-Powered-By', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('signed-in answers are JSON and never carry the password hash', async () => {
    const person = await makeUser(t.dataSource, { label: 'headers' });
    const { agent } = await signInTracked(person);
    const me = await agent.get('/api/auth/me');
    expect(me.headers['content-type']).toMatch(/^application\/json/);
    expect(JSON.stringify(me.body)).not.toContain('passwordHash');
    expect(JSON.stringify(me.body)).not.toMatch(/\$argon2/);
  });
});

describe('ASVS V2.2.1 rate limits on guessing', () => {
  it('invite tokens cannot be guessed without limit: lookups and acceptances per address get 429', async () => {
    const limited = await createTestApp({ rateLimits: { invites: 3 } });
    try {
      const { agent, csrf } = await newAgent(limited.app);
      const statuses: number[] = [];
      for (let i = 0; i < 3; i++) statuses.push((await agent.get(`/api/invites/${'g'.repeat(30)}${i}`)).status);
      expect(statuses).toEqual([404, 404, 404]);
      const blocked = await agent.post(`/api/invites/${'g'.repeat(31)}/accept`).set('x-csrf-token', csrf).send({ password: 'long enough password' });
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('rate_limited');
    } finally {
      await limited.close();
    }
  });

  it('reset tokens cannot be guessed without limit: completions per address get 429', async () => {
    const limited = await createTestApp({ rateLimits: { resetRequests: 2 } });
    try {
      const { agent, csrf } = await newAgent(limited.app);
      const guess = (i: number) => agent.post('/api/auth/password-reset/complete').set('x-csrf-token', csrf).send({ token: `${'r'.repeat(40)}${i}`, password: 'long enough password' });
      expect((await guess(1)).status).toBeGreaterThanOrEqual(400);
      expect((await guess(2)).status).toBeGreaterThanOrEqual(400);
      const blocked = await guess(3);
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('rate_limited');
    } finally {
      await limited.close();
    }
  });
});
