import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { ParsedMail } from 'mailparser';
import { AuditEventEntity } from '@server/entities/audit-event.entity.ts';
import { InviteEntity } from '@server/entities/invite.entity.ts';
import type { Mailer } from '@server/mail/mailer.ts';
import { hashLinkToken } from '@server/services/auth/tokens.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { TEST_PUBLIC_URL, createTestApp, makeUser, newAgent, signIn, uniqueEmail, type TestApp } from '../support/test-app.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
});

/** The token at the end of the link `${PUBLIC_URL}/<kind>/<token>` in a mail's text. */
function linkToken(mail: ParsedMail, kind: 'invite' | 'reset-password'): string {
  const escaped = TEST_PUBLIC_URL.replace(/[.]/g, '\\.');
  const match = new RegExp(`${escaped}/${kind}/([A-Za-z0-9_-]+)`).exec(mail.text ?? '');
  if (!match) throw new Error(`no ${kind} link in: ${mail.text}`);
  expect(mail.html).toContain(`${TEST_PUBLIC_URL}/${kind}/${match[1]}`);
  return match[1];
}

describe('invites', () => {
  it('an administrator invites by e-mail; the mail arrives; its link sets a password and signs the person in', async () => {
    const admin = await signIn(t.app, DEMO_PEOPLE.admin);
    const email = uniqueEmail('invitee');
    const since = Date.now();
    const created = await admin.agent.post('/api/invites').set('x-csrf-token', admin.csrf).send({ email, name: 'Ada Invitee' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ email, name: 'Ada Invitee', siteRole: 'member', invitedBy: 'Sam Whitlow', acceptedAt: null, mailSent: true });

    const mail = await t.waitForMail(email, since);
    expect(mail.subject).toBe('You are invited to Bifolio');
    const token = linkToken(mail, 'invite');
    // Only the hash is stored.
    const row = await t.dataSource.manager.findOneOrFail(InviteEntity, { where: { id: created.body.id } });
    expect(row.tokenHash).toBe(hashLinkToken(token));
    expect(row.tokenHash).not.toContain(token);

    const lookup = await request(t.app).get(`/api/invites/${token}`);
    expect(lookup.status).toBe(200);
    expect(lookup.body).toMatchObject({ email, name: 'Ada Invitee' });

    const invitee = await newAgent(t.app);
    const accepted = await invitee.agent.post(`/api/invites/${token}/accept`).set('x-csrf-token', invitee.csrf).send({ password: 'a-fresh-password-1' });
    expect(accepted.status).toBe(201);
    expect(accepted.body.user).toMatchObject({ email, siteRole: 'member' });
    expect((await invitee.agent.get('/api/auth/me')).body.user.email).toBe(email);

    await expect(signIn(t.app, { email, password: 'a-fresh-password-1' })).resolves.toBeTruthy();
    // The link works once.
    expect((await request(t.app).get(`/api/invites/${token}`)).status).toBe(404);
    const again = await newAgent(t.app);
    expect((await again.agent.post(`/api/invites/${token}/accept`).set('x-csrf-token', again.csrf).send({ password: 'another-password-2' })).status).toBe(404);

    const actions = (await t.dataSource.manager.find(AuditEventEntity, { where: { entityId: created.body.id } })).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['invite.created', 'invite.accepted']));
  });

  it('lists invites for administrators', async () => {
    const admin = await signIn(t.app, DEMO_PEOPLE.admin);
    const res = await admin.agent.get('/api/invites');
    expect(res.status).toBe(200);
    expect(res.body.invites.length).toBeGreaterThan(0);
    expect(res.body.invites[0]).not.toHaveProperty('tokenHash');
  });

  it('refuses to invite an address that already has an account (409 naming the field)', async () => {
    const admin = await signIn(t.app, DEMO_PEOPLE.admin);
    const res = await admin.agent.post('/api/invites').set('x-csrf-token', admin.csrf).send({ email: DEMO_PEOPLE.reader.email, name: 'Jun again' });
    expect(res.status).toBe(409);
    expect(res.body.error.fields).toEqual([expect.objectContaining({ path: 'email' })]);
  });

  it('an unknown or malformed token is 404', async () => {
    expect((await request(t.app).get('/api/invites/not-a-real-token-at-all')).status).toBe(404);
  });

  it('a mail failure after the invite committed still answers 201, reporting mailSent: false', async () => {
    const failing: Mailer = { send: () => Promise.reject(new Error('relay refused')), close: () => undefined };
    const broken = await createTestApp({ mailer: failing });
    try {
      const admin = await signIn(broken.app, DEMO_PEOPLE.admin);
      const email = uniqueEmail('unmailed');
      const res = await admin.agent.post('/api/invites').set('x-csrf-token', admin.csrf).send({ email, name: 'No Mail' });
      expect(res.status).toBe(201);
      expect(res.body.mailSent).toBe(false);
      expect(await broken.dataSource.manager.exists(InviteEntity, { where: { email } })).toBe(true);
    } finally {
      await broken.close();
    }
  });
});

describe('invites while the mail relay is down', () => {
  it('commits the invite and says the mail was not sent; once the relay is back the next invite is mailed, without a restart', async () => {
    const admin = await signIn(t.app, DEMO_PEOPLE.admin);
    await t.stopMail();
    const unmailed = uniqueEmail('relay-down');
    try {
      const res = await admin.agent.post('/api/invites').set('x-csrf-token', admin.csrf).send({ email: unmailed, name: 'Relay Down' }).timeout(20_000);
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ email: unmailed, mailSent: false });
      expect(await t.dataSource.manager.exists(InviteEntity, { where: { email: unmailed } })).toBe(true);
    } finally {
      await t.startMail();
    }
    const email = uniqueEmail('relay-back');
    const since = Date.now();
    const res = await admin.agent.post('/api/invites').set('x-csrf-token', admin.csrf).send({ email, name: 'Relay Back' });
    expect(res.body).toMatchObject({ email, mailSent: true });
    expect((await t.waitForMail(email, since)).subject).toBe('You are invited to Bifolio');
  });
});

describe('password reset', () => {
  it('mails a link that sets a new password once; the old password stops working; other sessions end', async () => {
    const person = await makeUser(t.dataSource, { label: 'forgetful' });
    const oldSession = await signIn(t.app, person);
    const { agent, csrf } = await newAgent(t.app);
    const since = Date.now();
    const asked = await agent.post('/api/auth/password-reset').set('x-csrf-token', csrf).send({ email: person.email });
    expect(asked.status).toBe(202);
    const mail = await t.waitForMail(person.email, since);
    expect(mail.subject).toBe('Reset your Bifolio password');
    const token = linkToken(mail, 'reset-password');

    const done = await agent.post('/api/auth/password-reset/complete').set('x-csrf-token', csrf).send({ token, password: 'brand-new-password-9' });
    expect(done.status).toBe(204);
    await expect(signIn(t.app, { email: person.email, password: 'brand-new-password-9' })).resolves.toBeTruthy();
    await expect(signIn(t.app, person)).rejects.toThrow(/401/);
    expect((await oldSession.agent.get('/api/auth/me')).status).toBe(401);

    const reuse = await agent.post('/api/auth/password-reset/complete').set('x-csrf-token', csrf).send({ token, password: 'yet-another-password' });
    expect(reuse.status).toBe(400);
    expect(reuse.body.error.fields).toEqual([expect.objectContaining({ path: 'token' })]);
    const event = await t.dataSource.manager.findOne(AuditEventEntity, { where: { action: 'auth.password_reset', entityId: person.user.id } });
    expect(event).not.toBeNull();
  });

  it('answers 202 for an unknown address and sends nothing', async () => {
    const { agent, csrf } = await newAgent(t.app);
    const email = uniqueEmail('unknown');
    const res = await agent.post('/api/auth/password-reset').set('x-csrf-token', csrf).send({ email });
    expect(res.status).toBe(202);
    await expect(t.waitForMail(email, 0, 600)).rejects.toThrow(/No mail/);
  });
});

describe('own account', () => {
  it('changes the name and, with the current password, the password', async () => {
    const person = await makeUser(t.dataSource, { label: 'self' });
    const { agent, csrf } = await signIn(t.app, person);
    const renamed = await agent.patch('/api/account').set('x-csrf-token', csrf).send({ name: 'Renamed Person' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.name).toBe('Renamed Person');
    const wrong = await agent.post('/api/account/password').set('x-csrf-token', csrf).send({ currentPassword: 'nope', newPassword: 'whatever-long-1' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields[0].path).toBe('currentPassword');
    const ok = await agent.post('/api/account/password').set('x-csrf-token', csrf).send({ currentPassword: person.password, newPassword: 'changed-password-7' });
    expect(ok.status).toBe(204);
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    await expect(signIn(t.app, { email: person.email, password: 'changed-password-7' })).resolves.toBeTruthy();
  });
});
