import { createHash } from 'node:crypto';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TextChecker, binaryTypeOf, claimedTypeOf, decideType } from '@server/services/attachments/sniff-content-type.ts';
import { attachmentListSchema, attachmentSchema, type Attachment } from '@shared/api/attachments.ts';
import type { EntryDetail } from '@shared/api/entries.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import { UserEntity } from '@server/entities/user.entity.ts';
import { storeAttachment } from '@server/services/attachments/store-attachment.ts';
import { sweepOrphanedObjects } from '@server/services/attachments/sweep-orphaned-objects.ts';
import { attachmentKey } from '@server/services/attachments/storage-keys.ts';
import { receiveUpload } from '@server/services/attachments/receive-upload.ts';
import { createS3Storage } from '@server/storage/s3-storage.ts';
import { closeAnalysisPool } from '@server/analysis/analysis-pool.ts';
import { freePort } from '../support/free-port.ts';
import { createTestApp, signIn as signInAgent } from '../support/test-app.ts';
import { DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { auditActionsFor, closeLogServer, demoNotebookId, logServer, signIn, startLogServer, type Client } from './entries-support.ts';

/** A 1×1 PNG (the 8-byte signature, IHDR, IDAT, IEND; PNG specification, W3C 2003, §5). */
const PNG_1x1 = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==',
  'base64',
);
const PDF_HEAD = Buffer.from('%PDF-1.4\n1 0 obj << >> endobj\ntrailer << >>\n%%EOF\n');
const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

describe('content type from the bytes', () => {
  it('recognises each accepted signature and nothing else from a name alone', () => {
    expect(binaryTypeOf(PNG_1x1)).toBe('image/png');
    expect(binaryTypeOf(Buffer.from([0xff, 0xd8, 0xff, 0xe0]))).toBe('image/jpeg');
    expect(binaryTypeOf(Buffer.from('GIF89a\x01\x00'))).toBe('image/gif');
    expect(binaryTypeOf(Buffer.from('RIFF\x10\x00\x00\x00WEBPVP8 '))).toBe('image/webp');
    expect(binaryTypeOf(Buffer.from('RIFF\x10\x00\x00\x00WAVEfmt '))).toBeNull();
    expect(binaryTypeOf(PDF_HEAD)).toBe('application/pdf');
    expect(claimedTypeOf('Photo.JPG', undefined)).toBe('image/jpeg');
    expect(claimedTypeOf('noext', 'application/octet-stream')).toBeNull();
  });

  it('splits multi-byte UTF-8 across chunks without calling it binary, and rejects broken UTF-8', () => {
    const ok = new TextChecker();
    const bytes = Buffer.from('μ = 0.25 → fold');
    ok.push(bytes.subarray(0, 1));
    ok.push(bytes.subarray(1));
    expect(ok.finish()).toBe(true);
    const bad = new TextChecker();
    bad.push(Buffer.from([0x61, 0xc3]));
    expect(bad.finish()).toBe(false);
  });

  it('never throws on arbitrary bytes and names', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 64 }), fc.string({ maxLength: 30 }), fc.option(fc.string({ maxLength: 30 }), { nil: undefined }), (bytes, name, declared) => {
        const text = new TextChecker();
        text.push(bytes);
        const decided = decideType(bytes.subarray(0, 16), text.finish(), claimedTypeOf(name, declared));
        expect('type' in decided || decided.error.length > 0).toBe(true);
      }),
      { numRuns: 500 },
    );
  });
});

describe('attachments API', () => {
  let kofi: Client;
  let jun: Client;
  let mira: Client;
  let notebook: string;
  let entryId: string;
  let base: string;

  beforeAll(async () => {
    await startLogServer();
    [kofi, jun, mira] = await Promise.all([signIn('researcher'), signIn('reader'), signIn('researcher2')]);
    notebook = await demoNotebookId('stirredTank');
    const created = await kofi.post(`/api/notebooks/${notebook}/entries`, { title: 'Ignition photos', entryDate: '2026-11-20', tags: [] });
    entryId = (created.body as EntryDetail).entry.id;
    base = `/api/notebooks/${notebook}/entries/${entryId}/attachments`;
  });
  afterAll(closeLogServer);

  const upload = (who: Client, bytes: Buffer, filename: string, contentType = 'application/octet-stream') =>
    who.agent
      .post(base)
      .set('x-csrf-token', csrfOf(who))
      .attach('file', bytes, { filename, contentType });
  // Multipart writes go through the agent directly, with the session's CSRF token.
  const tokens = new Map<Client, string>();
  const csrfOf = (who: Client) => tokens.get(who) ?? '';

  beforeAll(async () => {
    for (const who of [kofi, jun, mira]) {
      const res = await who.agent.get('/api/auth/csrf');
      tokens.set(who, res.body.csrfToken as string);
    }
  });

  it('stores a PNG under a key made of ids, records its SHA-256 and an audit event, and lists it', async () => {
    const res = await upload(kofi, PNG_1x1, 'flame front.png', 'image/png');
    expect(res.status).toBe(201);
    const a = attachmentSchema.parse(res.body);
    expect(a).toMatchObject({ name: 'flame front.png', contentType: 'image/png', byteSize: PNG_1x1.length, sha256: sha(PNG_1x1) });
    const [row] = (await logServer().dataSource.query('SELECT storage_key FROM attachment WHERE id = $1', [a.id])) as { storage_key: string }[];
    expect(row.storage_key).toBe(`notebooks/${notebook}/entries/${entryId}/attachments/${a.id}`);
    expect(await auditActionsFor(entryId)).toContain('attachment.added');
    const list = attachmentListSchema.parse((await jun.get(base)).body);
    expect(list.attachments.map((x) => x.id)).toContain(a.id);
  });

  it('downloads through a short-lived signed address that returns the same bytes and the original name', async () => {
    const a = attachmentSchema.parse((await upload(kofi, PDF_HEAD, 'résumé final.pdf', 'application/pdf')).body);
    const res = await jun.get(a.contentUrl);
    expect(res.status).toBe(302);
    const url = new URL(res.headers.location as string);
    expect(url.searchParams.get('X-Amz-Expires')).toBe('300');
    const download = await fetch(url);
    expect(download.status).toBe(200);
    const bytes = Buffer.from(await download.arrayBuffer());
    expect(sha(bytes)).toBe(a.sha256);
    expect(download.headers.get('content-type')).toBe('application/pdf');
    const disposition = download.headers.get('content-disposition') ?? '';
    expect(disposition).toContain(`filename*=UTF-8''r%C3%A9sum%C3%A9%20final.pdf`);
    expect(disposition).toContain('filename="r_sum_ final.pdf"');
  });

  it('takes CSV and plain text from their bytes; a name without extension gets plain text', async () => {
    const csv = Buffer.from('mu,x\n0.1,0.5\n0.2,0.7\n');
    expect((await upload(kofi, csv, 'data.csv', 'text/csv')).body.contentType).toBe('text/csv');
    expect((await upload(kofi, Buffer.from('notes: ignition at τ ≈ 3.2 s\n'), 'README')).body.contentType).toBe('text/plain');
  });

  it('streams a large file through intact (8 MB)', async () => {
    const big = Buffer.alloc(8 * 1024 * 1024, 'x0123456789,\n');
    const res = await upload(kofi, big, 'long-run.csv', 'text/csv');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ byteSize: big.length, sha256: sha(big) });
  });

  it.each([
    ['PNG bytes named as a PDF', PNG_1x1, 'scan.pdf', 415, 'file_type_mismatch', 'The file name says a PDF document, but its contents are a PNG image'],
    ['a PDF named as a PNG', PDF_HEAD, 'plot.png', 415, 'file_type_mismatch', 'The file name says a PNG image, but its contents are a PDF document'],
    ['an executable', Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0, 0, 0, 0, 0]), 'tool', 415, 'unsupported_file_type', 'This file is not an accepted kind'],
    ['text named as a program', Buffer.from('echo hi\n'), 'run.sh', 415, 'file_type_mismatch', 'The file name says another kind of file'],
    ['an empty file', Buffer.alloc(0), 'empty.txt', 400, 'validation_failed', 'The file is empty'],
  ])('refuses %s with a clear message and keeps nothing', async (_label, bytes, name, status, code, message) => {
    const before = (await logServer().dataSource.query('SELECT count(*)::int AS n FROM attachment')) as { n: number }[];
    const res = await upload(kofi, bytes, name);
    expect(res.status).toBe(status);
    expect(res.body.error.code).toBe(code);
    expect(res.body.error.message).toContain(message);
    const after = (await logServer().dataSource.query('SELECT count(*)::int AS n FROM attachment')) as { n: number }[];
    expect(after[0].n).toBe(before[0].n);
  });

  it('refuses a file over the size limit with 413', async () => {
    const tooBig = Buffer.alloc(25 * 1024 * 1024 + 1, 'a');
    const res = await upload(kofi, tooBig, 'huge.txt', 'text/plain');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toBe('A file may have at most 25 MB');
  });

  it('asks for multipart with a named field', async () => {
    const res = await kofi.post(base, { file: 'not a file' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('file');
  });

  it('lets readers download but not upload; non-members see nothing', async () => {
    expect((await upload(jun, PNG_1x1, 'a.png')).status).toBe(403);
    expect((await mira.get(base)).status).toBe(404);
    expect((await upload(mira, PNG_1x1, 'a.png')).status).toBe(404);
  });

  it('removes an attachment from the list with an audit event', async () => {
    const a = (await upload(kofi, PNG_1x1, 'wrong.png')).body as Attachment;
    expect((await jun.delete(`${base}/${a.id}`)).status).toBe(403);
    expect((await kofi.delete(`${base}/${a.id}`)).status).toBe(204);
    expect((await kofi.get(`${base}/${a.id}`)).status).toBe(404);
    expect(await auditActionsFor(entryId)).toContain('attachment.removed');
  });

  it('deletes the stored object again when the database refuses the row', async () => {
    const app = logServer();
    const real = createS3Storage(app.env);
    const keys: string[] = [];
    const storage = { ...real, putStream: (key: string, ...rest: Parameters<typeof real.putStream> extends [string, ...infer R] ? R : never) => (keys.push(key), real.putStream(key, ...rest)) };
    const entry = await app.dataSource.manager.findOneByOrFail(EntryEntity, { id: entryId });
    const ghost = Object.assign(new UserEntity(), { id: '00000000-0000-4000-8000-000000000000' });
    // A request-like stream for receiveUpload: a multipart body built by hand.
    const boundary = 'bifolio-test-boundary';
    const body = Buffer.concat([
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="x.png"\r\nContent-Type: image/png\r\n\r\n`),
      PNG_1x1,
      Buffer.from(`\r\n--${boundary}--\r\n`),
    ]);
    const { Readable } = await import('node:stream');
    const req = Object.assign(Readable.from([body]), {
      headers: { 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(body.length) },
      is: (t: string) => (t === 'multipart/form-data' ? t : false),
    });
    const file = await receiveUpload(req as never);
    await expect(storeAttachment({ dataSource: app.dataSource, storage }, { actor: ghost, entry, file })).rejects.toThrow();
    expect(keys).toHaveLength(1);
    expect(await real.get(keys[0])).toBeNull();
    real.client.destroy();
  });
});

describe('orphaned objects', () => {
  beforeAll(startLogServer);
  afterAll(closeLogServer);

  it('deletes stored files no row points at once they are past the grace period, and keeps recorded ones', async () => {
    const app = logServer();
    const storage = createS3Storage(app.env);
    try {
      const kofi = await signIn('researcher');
      const nb = await demoNotebookId('stirredTank');
      const en = ((await kofi.post(`/api/notebooks/${nb}/entries`, { title: 'Sweep', entryDate: '2026-11-21', tags: [] })).body as EntryDetail).entry.id;
      const { csrfToken } = (await kofi.agent.get('/api/auth/csrf')).body as { csrfToken: string };
      const up = await kofi.agent.post(`/api/notebooks/${nb}/entries/${en}/attachments`).set('x-csrf-token', csrfToken).attach('file', PNG_1x1, { filename: 'kept.png' });
      const [row] = (await app.dataSource.query('SELECT storage_key FROM attachment WHERE id = $1', [up.body.id])) as { storage_key: string }[];
      const kept = row.storage_key;
      const orphan = attachmentKey(nb, en);
      await storage.put(orphan, 'left behind', 'text/plain');
      // Within the grace period nothing is touched.
      expect(await sweepOrphanedObjects({ dataSource: app.dataSource, storage })).not.toContain(orphan);
      const later = new Date(Date.now() + 31 * 60_000);
      const swept = await sweepOrphanedObjects({ dataSource: app.dataSource, storage }, { now: later });
      expect(swept).toContain(orphan);
      expect(swept).not.toContain(kept);
      expect(await storage.get(orphan)).toBeNull();
      expect(await storage.get(kept)).toEqual(PNG_1x1);
    } finally {
      storage.client.destroy();
    }
  });
});

describe('attachments when file storage is down', () => {
  it('refuses an upload while storage is stopped, keeps nothing of it, and takes the next one once storage is back, without a restart', async () => {
    const app = await createTestApp();
    const storage = createS3Storage(app.env);
    try {
      const { agent, csrf } = await signInAgent(app.app, DEMO_PEOPLE.researcher);
      const [{ id: nb }] = (await app.dataSource.query(`SELECT id FROM notebook WHERE title = 'Stirred-tank ignition and extinction'`)) as { id: string }[];
      const created = await agent.post(`/api/notebooks/${nb}/entries`).set('x-csrf-token', csrf).send({ title: 'Storage down and back', entryDate: '2026-12-02' });
      const entry = (created.body as EntryDetail).entry.id;
      const upload = (name: string) =>
        agent.post(`/api/notebooks/${nb}/entries/${entry}/attachments`).set('x-csrf-token', csrf).attach('file', PDF_HEAD, { filename: name, contentType: 'application/pdf' }).timeout(20_000);
      const prefix = attachmentKey(nb, entry).replace(/[^/]+$/, '');

      await app.stopStorage();
      const refused = await upload('while-down.pdf');
      expect(refused.status).toBe(503);
      expect(refused.body.error).toMatchObject({ code: 'storage_unavailable' });
      expect(refused.body.error.message).toContain('the file was not saved');

      await app.startStorage();
      // Nothing of the refused upload: no row, no event, no object under the entry's prefix.
      const rows = (await app.dataSource.query('SELECT count(*)::int AS n FROM attachment WHERE entry_id = $1', [entry])) as { n: number }[];
      expect(rows[0].n).toBe(0);
      expect(await auditActionsForEntry(app, entry)).not.toContain('attachment.added');
      const leftovers: string[] = [];
      for await (const o of storage.list(prefix)) leftovers.push(o.key);
      expect(leftovers).toEqual([]);

      // The same app and session store the next upload whole.
      const stored = await upload('after.pdf');
      expect(stored.status).toBe(201);
      const attachment = attachmentSchema.parse(stored.body);
      expect(attachment.sha256).toBe(sha(PDF_HEAD));
      const download = await agent.get(attachment.contentUrl);
      expect(download.status).toBe(302);
      expect(Buffer.from(await (await fetch(download.headers.location as string)).arrayBuffer())).toEqual(PDF_HEAD);
    } finally {
      storage.client.destroy();
      await closeAnalysisPool();
      await app.close();
    }
  });


  it('fails with 503 and a clear message, and records nothing', async () => {
    const deadPort = await freePort();
    const app = await createTestApp({ env: { S3_ENDPOINT: `http://127.0.0.1:${deadPort}` } });
    try {
      const { agent, csrf } = await signInAgent(app.app, DEMO_PEOPLE.researcher);
      const notebook = (await app.dataSource.query(`SELECT id FROM notebook WHERE title = 'Stirred-tank ignition and extinction'`)) as { id: string }[];
      const created = await agent.post(`/api/notebooks/${notebook[0].id}/entries`).set('x-csrf-token', csrf).send({ title: 'Offline', entryDate: '2026-11-21' });
      const entry = (created.body as EntryDetail).entry.id;
      const res = await agent
        .post(`/api/notebooks/${notebook[0].id}/entries/${entry}/attachments`)
        .set('x-csrf-token', csrf)
        .attach('file', PNG_1x1, { filename: 'a.png', contentType: 'image/png' });
      expect(res.status).toBe(503);
      expect(res.body.error).toMatchObject({ code: 'storage_unavailable' });
      expect(res.body.error.message).toContain('the file was not saved');
      const rows = (await app.dataSource.query('SELECT count(*)::int AS n FROM attachment WHERE entry_id = $1', [entry])) as { n: number }[];
      expect(rows[0].n).toBe(0);
      const events = (await app.dataSource.query(`SELECT count(*)::int AS n FROM audit_event WHERE action = 'attachment.added' AND summary->>'entryId' = $1`, [entry])) as { n: number }[];
      expect(events[0].n).toBe(0);
    } finally {
      await closeAnalysisPool();
      await app.close();
    }
  });
});

async function auditActionsForEntry(app: Awaited<ReturnType<typeof createTestApp>>, entryId: string): Promise<string[]> {
  const rows = (await app.dataSource.query(`SELECT action FROM audit_event WHERE summary->>'entryId' = $1`, [entryId])) as { action: string }[];
  return rows.map((r) => r.action);
}
