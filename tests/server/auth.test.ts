import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { AuditEventEntity } from '@server/entities/audit-event.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { SESSION_COOKIE } from '@server/app.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { createTestApp, makeUser, newAgent, signIn, type TestApp } from '../support/test-app.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
});

const lastEvent = (action: string) =>
  t.dataSource.manager.findOne(AuditEventEntity, { where: { action }, order: { seq: 'DESC' } });

describe('sign-in', () => {
  it('signs in a demo researcher, sets an HttpOnly SameSite=Lax session cookie and reports memberships', async () => {
    const { agent, csrf } = await newAgent(t.app);
    const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', csrf).send({ email: DEMO_PEOPLE.researcher.email, password: DEMO_PEOPLE.researcher.password });
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe(DEMO_PEOPLE.researcher.email);
    expect(res.body.user).not.toHaveProperty('passwordHash');
    expect(res.body.memberships).toHaveLength(2);
    const cookie = [res.headers['set-cookie']].flat().find((c: string) => c.startsWith(`${SESSION_COOKIE}=`));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // PUBLIC_URL is http in tests
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.name).toBe('Kofi Mensah');
    const event = await lastEvent('auth.signed_in');
    expect(event?.actorId).toBe(res.body.user.id);
  });

  it('marks the cookie Secure when the public address is https (behind a TLS proxy on this machine)', async () => {
    const https = await createTestApp({ env: { PUBLIC_URL: 'https://bifolio.example' } });
    try {
      // The first answer that starts a session (the CSRF token lives in it) sets the cookie.
      const res = await request(https.app).get('/api/auth/csrf').set('x-forwarded-proto', 'https');
      expect(res.status).toBe(200);
      const cookie = [res.headers['set-cookie']].flat().find((c: string) => c?.startsWith(`${SESSION_COOKIE}=`));
      expect(cookie).toMatch(/; Secure/i);
      expect(cookie).toMatch(/HttpOnly/i);
      expect(res.headers['strict-transport-security']).toBeDefined();
    } finally {
      await https.close();
    }
  });

  it('accepts the e-mail address in any letter case', async () => {
    await expect(signIn(t.app, { email: DEMO_PEOPLE.reader.email.toUpperCase(), password: DEMO_PEOPLE.reader.password })).resolves.toBeTruthy();
  });

  it('refuses a wrong password with 401 and records the failed attempt', async () => {
    const { agent, csrf } = await newAgent(t.app);
    const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', csrf).send({ email: DEMO_PEOPLE.pi.email, password: 'not-the-password' });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
    const event = await lastEvent('auth.sign_in_failed');
    expect(event?.summary).toMatchObject({ email: DEMO_PEOPLE.pi.email });
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('refuses an unknown address the same way as a wrong password', async () => {
    const { agent, csrf } = await newAgent(t.app);
    const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', csrf).send({ email: 'nobody@vellharbour.example', password: 'whatever-password' });
    expect(res.status).toBe(401);
    expect(res.body.error.message).toBe('The e-mail address or password is not right');
  });

  it('refuses a deactivated account', async () => {
    const person = await makeUser(t.dataSource, { label: 'inactive' });
    await t.dataSource.manager.update(UserEntity, { id: person.user.id }, { active: false });
    await expect(signIn(t.app, person)).rejects.toThrow(/401/);
  });

  it('never answers /me with 200 to a stranger', async () => {
    const res = await request(t.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});

describe('sign-out', () => {
  it('ends the session and records it', async () => {
    const { agent, csrf } = await signIn(t.app, DEMO_PEOPLE.researcher2);
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    const out = await agent.post('/api/auth/sign-out').set('x-csrf-token', csrf);
    expect(out.status).toBe(204);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    expect((await lastEvent('auth.signed_out'))?.entityType).toBe('user');
  });
});

describe('CSRF protection', () => {
  it('refuses a state-changing request without the token', async () => {
    const { agent } = await newAgent(t.app);
    const res = await agent.post('/api/auth/sign-in').send({ email: DEMO_PEOPLE.pi.email, password: DEMO_PEOPLE.pi.password });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
  });

  it('refuses a token from another session', async () => {
    const { csrf: otherToken } = await newAgent(t.app);
    const { agent } = await signIn(t.app, DEMO_PEOPLE.pi);
    const res = await agent.post('/api/notebooks').set('x-csrf-token', otherToken).send({ title: 'Should not exist' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
  });

  it('lets a signed-in person write with the token they were given', async () => {
    const { agent, csrf } = await signIn(t.app, DEMO_PEOPLE.pi);
    const res = await agent.post('/api/notebooks').set('x-csrf-token', csrf).send({ title: 'Voltage collapse in a two-bus system' });
    expect(res.status).toBe(201);
    expect(res.body.role).toBe('pi');
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 once the failed attempts for an address exceed the limit, and successes do not count', async () => {
    const limited = await createTestApp({ rateLimits: { signInFailures: 3 } });
    try {
      const person = await makeUser(limited.dataSource, { label: 'limited' });
      const { agent, csrf } = await newAgent(limited.app);
      const attempt = (password: string) => agent.post('/api/auth/sign-in').set('x-csrf-token', csrf).send({ email: person.email, password });
      expect((await attempt(person.password)).status).toBe(200);
      for (let i = 0; i < 3; i++) expect((await attempt('wrong-password')).status).toBe(401);
      const blocked = await attempt(person.password);
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('rate_limited');
    } finally {
      await limited.close();
    }
  });

  it('limits password-reset requests and invitations the same way', async () => {
    const limited = await createTestApp({ rateLimits: { resetRequests: 2, invites: 1 } });
    try {
      const { agent, csrf } = await newAgent(limited.app);
      const ask = () => agent.post('/api/auth/password-reset').set('x-csrf-token', csrf).send({ email: 'someone@test.example' });
      expect((await ask()).status).toBe(202);
      expect((await ask()).status).toBe(202);
      expect((await ask()).status).toBe(429);
      const admin = await signIn(limited.app, DEMO_PEOPLE.admin);
      const invite = (label: string) => admin.agent.post('/api/invites').set('x-csrf-token', admin.csrf).send({ email: `${label}.${Date.now()}@test.example`, name: 'Limited' });
      expect((await invite('first')).status).toBe(201);
      expect((await invite('second')).status).toBe(429);
    } finally {
      await limited.close();
    }
  });
});
