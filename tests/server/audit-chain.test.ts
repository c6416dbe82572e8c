import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '@server/entities/audit-event.entity.ts';
import { GENESIS_HASH, auditJson, chainHash } from '@server/services/audit/canonical-json.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import { verifyAuditChain } from '@server/services/audit/verify-audit-chain.ts';
import { createTestApp, makeUser, signIn, type TestApp } from '../support/test-app.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('canonical content', () => {
  it('is the same text whatever the key order', () => {
    expect(auditJson({ b: 1, a: { d: [1, { f: 2, e: 3 }], c: null } })).toBe('{"a":{"c":null,"d":[1,{"e":3,"f":2}]},"b":1}');
  });

  it('writes NaN and infinities as null, as jsonb stores them, so a diagnostic value never fails a write', () => {
    const summary = { ratio: Number.NaN, bound: Number.POSITIVE_INFINITY, list: [Number.NEGATIVE_INFINITY] };
    expect(auditJson(summary)).toBe(auditJson(JSON.parse(JSON.stringify(summary))));
    expect(auditJson(summary)).toBe('{"bound":null,"list":[null],"ratio":null}');
  });

  it('hashes with SHA-256 over the previous hash and the content', () => {
    const content = { seq: '1', occurredAt: new Date('2026-01-01T00:00:00.000Z'), actorId: null, action: 'a', entityType: 'e', entityId: null, notebookId: null, summary: {} };
    const h = chainHash(GENESIS_HASH, content);
    expect(h).toMatch(/^[0-9a-f]{64}$/);
    expect(chainHash(GENESIS_HASH, { ...content, action: 'b' })).not.toBe(h);
    expect(chainHash(h, content)).not.toBe(h);
  });
});

describe('audit trail', () => {
  it('records a write and its event in the same transaction: a rollback leaves neither', async () => {
    const before = await t.dataSource.manager.count(AuditEventEntity);
    await expect(
      t.dataSource.transaction(async (manager) => {
        await recordEvent(manager, { actorId: null, action: 'notebook.created', entityType: 'notebook', summary: { title: 'rolled back' } });
        throw new Error('abort');
      }),
    ).rejects.toThrow('abort');
    expect(await t.dataSource.manager.count(AuditEventEntity)).toBe(before);
  });

  it('refuses to record outside a transaction', async () => {
    await expect(recordEvent(t.dataSource.manager, { actorId: null, action: 'user.updated', entityType: 'user' })).rejects.toThrow(/inside a transaction/);
  });

  it('records notebook creation with its membership, through the API', async () => {
    const person = await makeUser(t.dataSource, { label: 'auditor' });
    const { agent, csrf } = await signIn(t.app, person);
    const res = await agent.post('/api/notebooks').set('x-csrf-token', csrf).send({ title: 'Bistable gene switch, second look' });
    const events = await t.dataSource.manager.find(AuditEventEntity, { where: { notebookId: res.body.id }, order: { seq: 'ASC' } });
    expect(events.map((e) => [e.action, e.actorId])).toEqual([
      ['notebook.created', person.user.id],
      ['membership.added', person.user.id],
    ]);
  });

  it('keeps the chain whole when many writes race', async () => {
    await Promise.all(
      Array.from({ length: 12 }, (_, i) =>
        t.dataSource.transaction((manager) => recordEvent(manager, { actorId: null, action: 'user.updated', entityType: 'user', summary: { race: i } })),
      ),
    );
    const report = await verifyAuditChain(t.dataSource.manager);
    expect(report).toMatchObject({ ok: true });
    expect(report.checked).toBeGreaterThan(12);
  });

  it('refuses UPDATE, DELETE and TRUNCATE', async () => {
    await expect(t.dataSource.query(`UPDATE audit_event SET action = 'x' WHERE seq = (SELECT min(seq) FROM audit_event)`)).rejects.toThrow(/append-only/);
    await expect(t.dataSource.query(`DELETE FROM audit_event`)).rejects.toThrow(/append-only/);
    await expect(t.dataSource.query(`TRUNCATE audit_event`)).rejects.toThrow(/append-only/);
  });

  it('reports the first broken link after a superuser alters a row behind the trigger', async () => {
    const [row] = (await t.dataSource.query(`SELECT e.seq::text AS seq, e.summary FROM audit_event e ORDER BY e.seq LIMIT 1 OFFSET 3`)) as { seq: string; summary: object }[];
    const tamper = async (summary: object) => {
      const runner = t.dataSource.createQueryRunner();
      await runner.connect();
      try {
        await runner.query(`ALTER TABLE audit_event DISABLE TRIGGER audit_event_append_only`);
        await runner.query(`UPDATE audit_event SET summary = $1::jsonb WHERE seq = $2`, [JSON.stringify(summary), row.seq]);
      } finally {
        await runner.query(`ALTER TABLE audit_event ENABLE TRIGGER audit_event_append_only`);
        await runner.release();
      }
    };
    await tamper({ ...row.summary, forged: true });
    try {
      expect(await verifyAuditChain(t.dataSource.manager)).toMatchObject({ ok: false, brokenAt: row.seq, reason: 'content_changed', checked: 3 }); // three whole rows before it
    } finally {
      await tamper(row.summary); // put it back so later test files see a whole chain
    }
    expect(await verifyAuditChain(t.dataSource.manager)).toMatchObject({ ok: true });
  });
});
