import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/test-app.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('local outbox', () => {
  it('lists and shows the messages the SMTP sink kept', async () => {
    const since = Date.now();
    await t.mailer.send({ to: 'outbox.reader@test.example', subject: 'Prüfung: ignition ✓', text: 'Plain body', html: '<p>HTML body</p>' });
    await t.waitForMail('outbox.reader@test.example', since);
    const list = await request(t.app).get('/api/dev/outbox');
    expect(list.status).toBe(200);
    const summary = list.body.messages.find((m: { subject: string }) => m.subject === 'Prüfung: ignition ✓');
    expect(summary).toMatchObject({ to: ['outbox.reader@test.example'] });
    expect(summary).not.toHaveProperty('text');
    const one = await request(t.app).get(`/api/dev/outbox/${summary.id}`);
    expect(one.status).toBe(200);
    expect(one.body.text.trim()).toBe('Plain body');
    expect(one.body.html).toContain('<p>HTML body</p>');
  });

  it('answers 404 for an unknown or path-like id', async () => {
    expect((await request(t.app).get('/api/dev/outbox/nope')).status).toBe(404);
    expect((await request(t.app).get('/api/dev/outbox/..%2F..%2Fetc%2Fpasswd')).status).toBe(404);
  });

  it('does not exist in production', async () => {
    const prod = await createTestApp({ env: { NODE_ENV: 'production', SESSION_SECRET: 'a-production-secret-of-enough-length-123', PUBLIC_URL: 'https://bifolio.example' } });
    try {
      const res = await request(prod.app).get('/api/dev/outbox');
      expect(res.status).toBe(404);
    } finally {
      await prod.close();
    }
  });
});

describe('health', () => {
  it('reports the database and file storage up', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true, database: 'up', storage: 'up' });
  });
});

describe('serving the built client', () => {
  const clientDir = mkdtempSync(path.join(os.tmpdir(), 'bifolio-client-'));
  let withClient: TestApp;
  beforeAll(async () => {
    mkdirSync(path.join(clientDir, 'assets'));
    writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><script type="module" src="/assets/app.js"></script><div id="root"></div>');
    writeFileSync(path.join(clientDir, 'assets', 'app.js'), 'console.log(1)');
    withClient = await createTestApp({ clientDir });
  });
  afterAll(async () => {
    await withClient?.close();
    rmSync(clientDir, { recursive: true, force: true });
  });

  it('answers client routes with index.html under a CSP that allows no inline script', async () => {
    const res = await request(withClient.app).get('/notebooks/123/entries');
    expect(res.status).toBe(200);
    expect(res.text).toContain('<div id="root">');
    const csp = res.headers['content-security-policy'];
    expect(csp).toMatch(/script-src 'self'(;|$)/);
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
  });

  it('serves assets as long-cached files and keeps /api answers in JSON', async () => {
    const asset = await request(withClient.app).get('/assets/app.js');
    expect(asset.status).toBe(200);
    expect(asset.headers['cache-control']).toMatch(/immutable/);
    expect((await request(withClient.app).get('/assets/missing.js')).status).toBe(404);
    const api = await request(withClient.app).get('/api/unknown');
    expect(api.status).toBe(404);
    expect(api.body.error.code).toBe('not_found');
  });
});
