import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { documentSchema, type DocumentJson } from '@shared/editor/document.ts';
import { closeAnalysisPool } from '@server/analysis/analysis-pool.ts';
import { AttachmentEntity } from '@server/entities/attachment.entity.ts';
import { SADDLE_MODEL_CELL_ID, saddleModel } from './entries-support.ts';
import { createTestApp, makeNotebook, makeUser, signIn, type Agent, type TestApp, type TestPerson } from '../support/test-app.ts';

/**
 * Hostile input, by the OWASP Application Security Verification Standard 4.0.3, chapter V5
 * (validation, sanitization and encoding) and V12 (files). Every text field either stores a
 * hostile string verbatim and gives it back as JSON text, or refuses it with a 4xx that names
 * the field; never a 500.
 */
let t: TestApp;
let piPerson: TestPerson;
let pi: { agent: Agent; csrf: string };
let researcher: { agent: Agent; csrf: string };
let notebookId: string;

beforeAll(async () => {
  t = await createTestApp();
  piPerson = await makeUser(t.dataSource, { label: 'input-pi' });
  const researcherPerson = await makeUser(t.dataSource, { label: 'input-researcher' });
  pi = await signIn(t.app, piPerson);
  researcher = await signIn(t.app, researcherPerson);
  notebookId = (await makeNotebook(t.dataSource, piPerson.user, [{ user: researcherPerson.user, role: 'researcher' }])).id;
});
afterAll(async () => {
  await closeAnalysisPool();
  await t?.close();
});

/** Strings that must stay inert. */
const HOSTILE: { kind: string; value: string; mayRefuse?: boolean }[] = [
  { kind: 'SQL meta-characters', value: `'; DROP TABLE "user"; --` },
  { kind: 'SQL comment and quote', value: `Robert'); DELETE FROM revision WHERE ('a'='a` },
  { kind: 'a script tag', value: '<script>alert(1)</script>' },
  { kind: 'an image with an error handler', value: '<img src=x onerror="alert(document.cookie)">' },
  { kind: 'a javascript: address', value: 'javascript:alert(1)' },
  { kind: 'a template expression', value: '{{constructor.constructor("alert(1)")()}} ${7*7}' },
  { kind: 'a right-to-left override', value: 'fold\u202Egnp.exe' },
  { kind: 'zero-width joiners and spaces', value: '👩\u200D🔬 saddle\u200B\u200C\uFEFFnode' },
  { kind: 'combining marks and astral characters', value: 'Z\u0324\u0354\u0367\u0311\u0313 𝔣(𝑥) ∂²' },
  { kind: 'a NUL character', value: 'before\u0000after', mayRefuse: true },
  { kind: 'an unpaired surrogate', value: 'half \uD800 pair', mayRefuse: true },
];

const HUGE = 'x'.repeat(1_000_000);

/** A tag holding the hostile string, or its first characters within the tag limit (whole characters). */
const tagOf = (value: string) => Array.from(value).slice(0, 36).join('');

interface Outcome {
  status: number;
  body: { error?: { code: string; fields?: { path: string }[] } };
}

/** Either verbatim storage (read back equal) or a 4xx naming `field`; never a 500. */
function expectInert(res: Outcome, field: string, stored: () => Promise<unknown>, value: string, mayRefuse: boolean | undefined) {
  return (async () => {
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBeLessThan(500);
    if (res.status < 300) {
      expect(await stored()).toBe(value);
      return;
    }
    expect(mayRefuse, `refused ${JSON.stringify(value)} in ${field}: ${JSON.stringify(res.body)}`).toBe(true);
    expect(res.status).toBe(400);
    expect(res.body.error?.code).toBe('validation_failed');
    expect(res.body.error?.fields?.map((f) => f.path).join(' ')).toContain(field);
  })();
}

/** A new entry of the researcher's, with its head revision. */
async function newEntry(title = 'Input entry') {
  const res = await researcher.agent.post(`/api/notebooks/${notebookId}/entries`).set('x-csrf-token', researcher.csrf).send({ title, entryDate: '2026-11-30' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { entryId: res.body.entry.id as string, headId: res.body.head.id as string, base: `/api/notebooks/${notebookId}/entries/${res.body.entry.id}` };
}

const docWith = (text: string, modelName = 'Saddle-node', rhs = 'mu - x^2'): DocumentJson => ({
  type: 'doc',
  content: [
    { type: 'paragraph', content: [{ type: 'text', text }] },
    { type: 'cell', attrs: { id: SADDLE_MODEL_CELL_ID, kind: 'model', input: { name: modelName, ...saddleModel, variables: [{ name: 'x', rhs }] } } },
  ],
});

describe('ASVS V5.1 / V5.3: hostile strings in every text field', () => {
  it.each(HOSTILE)('a notebook title and description with $kind', async ({ value, mayRefuse }) => {
    const res = await pi.agent.post('/api/notebooks').set('x-csrf-token', pi.csrf).send({ title: `T ${value}`, description: value });
    await expectInert(res, res.status < 300 ? '' : 'title', async () => {
      const read = await pi.agent.get(`/api/notebooks/${res.body.id}`);
      expect(read.headers['content-type']).toMatch(/^application\/json/);
      expect(read.body.title).toBe(`T ${value}`);
      return read.body.description;
    }, value, mayRefuse);
  });

  it.each(HOSTILE)('an entry title and tags with $kind', async ({ value, mayRefuse }) => {
    const res = await researcher.agent
      .post(`/api/notebooks/${notebookId}/entries`)
      .set('x-csrf-token', researcher.csrf)
      .send({ title: `E ${value}`, entryDate: '2026-11-30', tags: [tagOf(value)] });
    await expectInert(res, 'title', async () => {
      const read = await researcher.agent.get(`/api/notebooks/${notebookId}/entries/${res.body.entry.id}`);
      expect(read.body.entry.tags).toEqual([tagOf(value)]);
      return read.body.entry.title;
    }, `E ${value}`, mayRefuse);
  });

  it.each(HOSTILE)('document text, a model name and a revision message with $kind', async ({ value, mayRefuse }) => {
    const { base, headId } = await newEntry();
    const res = await researcher.agent
      .post(`${base}/revisions`)
      .set('x-csrf-token', researcher.csrf)
      .send({ baseRevisionId: headId, title: 'Hostile document', entryDate: '2026-11-30', tags: [], document: docWith(value, `M ${value}`), message: value });
    await expectInert(res, 'document', async () => {
      const read = await researcher.agent.get(`${base}/revisions/${res.body.id}`);
      const [paragraph, cell] = read.body.document.content;
      expect(cell.attrs.input.name).toBe(`M ${value}`);
      expect(read.body.message).toBe(value);
      return paragraph.content[0].text;
    }, value, mayRefuse);
  });

  it.each(HOSTILE)('a comment and a review note with $kind', async ({ value, mayRefuse }) => {
    const { base, headId } = await newEntry();
    const comment = await pi.agent.post(`${base}/comments`).set('x-csrf-token', pi.csrf).send({ anchor: { revisionId: headId }, body: value });
    await expectInert(comment, 'body', async () => (await pi.agent.get(`${base}/comments`)).body.threads[0].body, value, mayRefuse);
    const review = await researcher.agent.post(`${base}/review`).set('x-csrf-token', researcher.csrf).send({ revisionId: headId, note: value });
    await expectInert(review, 'note', async () => (await pi.agent.get(`${base}/review`)).body.review.note, value, mayRefuse);
    if (review.status < 300) {
      const changes = await pi.agent.post(`${base}/review/request-changes`).set('x-csrf-token', pi.csrf).send({ revisionId: headId, comment: value });
      await expectInert(changes, 'comment', async () => {
        const threads = (await pi.agent.get(`${base}/comments`)).body.threads as { body: string }[];
        return threads.map((th) => th.body).find((b) => b === value) ?? threads.map((th) => th.body);
      }, value, mayRefuse);
    }
  });

  it.each(HOSTILE)('a measured data set’s name with $kind', async ({ value, mayRefuse }) => {
    const { base } = await newEntry();
    const res = await researcher.agent.post(`${base}/measurements`).set('x-csrf-token', researcher.csrf).send({ name: value, csv: 'mu,x\n0.25,0.5\n' });
    await expectInert(res, 'name', async () => (await researcher.agent.get(`${base}/measurements/${res.body.id}`)).body.name, value, mayRefuse);
  });

  it.each(HOSTILE)('search and audit filters with $kind answer normally', async ({ value }) => {
    const search = await pi.agent.get('/api/search').query({ q: value, tag: value });
    expect(search.status, JSON.stringify(search.body)).toBeLessThan(500);
    if (search.status === 200) expect(Array.isArray(search.body.results)).toBe(true);
    const audit = await pi.agent.get('/api/audit').query({ action: value });
    expect(audit.status).toBe(400);
    expect(audit.body.error.fields[0].path).toBe('action');
  });

  it.each([
    { field: 'title', send: () => pi.agent.post('/api/notebooks').set('x-csrf-token', pi.csrf).send({ title: HUGE }) },
    { field: 'description', send: () => pi.agent.post('/api/notebooks').set('x-csrf-token', pi.csrf).send({ title: 'Huge', description: HUGE }) },
    { field: 'title', send: () => researcher.agent.post(`/api/notebooks/${notebookId}/entries`).set('x-csrf-token', researcher.csrf).send({ title: HUGE, entryDate: '2026-11-30' }) },
    { field: 'tags', send: () => researcher.agent.post(`/api/notebooks/${notebookId}/entries`).set('x-csrf-token', researcher.csrf).send({ title: 'Huge', entryDate: '2026-11-30', tags: [HUGE] }) },
    { field: 'q', send: () => pi.agent.get('/api/search').query({ q: HUGE.slice(0, 6000) }) },
  ])('a 1 MB string in $field is refused with 400 naming it (or 413), not stored', async ({ field, send }) => {
    const res = await send();
    expect([400, 413, 431]).toContain(res.status);
    if (res.status === 400) expect(res.body.error.fields.map((f: { path: string }) => f.path).join(' ')).toContain(field);
  });

  it('1 MB strings in a comment, a review note and a model name are refused naming the field', async () => {
    const { base, headId } = await newEntry();
    const comment = await pi.agent.post(`${base}/comments`).set('x-csrf-token', pi.csrf).send({ anchor: { revisionId: headId }, body: HUGE });
    expect(comment.status).toBe(400);
    expect(comment.body.error.fields[0].path).toBe('body');
    const note = await researcher.agent.post(`${base}/review`).set('x-csrf-token', researcher.csrf).send({ revisionId: headId, note: HUGE });
    expect(note.status).toBe(400);
    expect(note.body.error.fields[0].path).toBe('note');
    const model = await researcher.agent.post('/api/engine/validate-model').set('x-csrf-token', researcher.csrf).send({ model: { ...saddleModel, variables: [{ name: 'x', rhs: HUGE }] } });
    expect(model.status).toBeLessThan(500);
    const errors = model.status === 200 ? model.body.errors : model.body.error.fields;
    expect(errors.length).toBeGreaterThan(0);
    expect(errors.map((e: { path: string }) => e.path).join(' ')).toContain('model.variables[0].rhs');
  });
});

describe('ASVS V5.3.3 / V5.2.1: rich text only from the document’s JSON through the editor schema', () => {
  const link = (href: string): unknown => ({
    type: 'doc',
    content: [{ type: 'paragraph', content: [{ type: 'text', text: 'click', marks: [{ type: 'link', attrs: { href } }] }] }],
  });
  const image = (src: string): unknown => ({ type: 'doc', content: [{ type: 'image', attrs: { src, alt: 'x' } }] });

  const REFUSED = [
    'javascript:alert(1)',
    'JaVaScRiPt:alert(1)',
    '  javascript:alert(1)',
    'java\tscript:alert(1)',
    'java\nscript:alert(1)',
    '\u0001javascript:alert(1)',
    'vbscript:msgbox(1)',
    'data:text/html,<script>alert(1)</script>',
    'data:image/svg+xml,<svg onload=alert(1)>',
    'file:///etc/passwd',
    'blob:http://127.0.0.1/1',
    '//evil.example/x.png',
    ' //evil.example/x.png',
    '/\\evil.example/x.png',
    '\\\\evil.example\\x.png',
    'https:\\\\evil.example',
    '/\t/evil.example/x.png',
  ];
  const ALLOWED = [
    'https://example.org/paper.pdf',
    'http://example.org/a?b=c#d',
    'mailto:pi@example.org',
    '/api/notebooks/0b0c1a3e-8f34-4c36-9e69-6d0c2e1f5a10/entries/5d3a1c2b-1e4f-4a6b-8c9d-0e1f2a3b4c5d/attachments/6e4b2d3c-2f5a-4b7c-9d0e-1f2a3b4c5d6e/content',
    '#section-2',
    'notes/figure-1.png',
    'https://example.org/a file with spaces.pdf',
  ];

  it.each(REFUSED)('refuses %j as a link and as an image address', (url) => {
    for (const doc of [link(url), image(url)]) {
      const parsed = documentSchema.safeParse(doc);
      expect(parsed.success, url).toBe(false);
      if (!parsed.success) expect(parsed.error.issues[0].message).toMatch(/address/i);
    }
  });

  it.each(ALLOWED)('accepts the address %j', (url) => {
    expect(documentSchema.safeParse(link(url)).success).toBe(true);
    expect(documentSchema.safeParse(image(url)).success).toBe(true);
  });

  it('the API refuses a javascript: link or image in a draft or revision with 400 naming the document', async () => {
    const { base, headId } = await newEntry();
    for (const document of [link('java\tscript:alert(1)'), image('javascript:alert(document.cookie)')]) {
      const body = { baseRevisionId: headId, title: 'Links', entryDate: '2026-11-30', tags: [], document };
      for (const res of [
        await researcher.agent.put(`${base}/draft`).set('x-csrf-token', researcher.csrf).send(body),
        await researcher.agent.post(`${base}/revisions`).set('x-csrf-token', researcher.csrf).send(body),
      ]) {
        expect(res.status, JSON.stringify(res.body)).toBe(400);
        expect(res.body.error.fields.map((f: { path: string }) => f.path).join(' ')).toMatch(/^document/);
      }
    }
  });

  it('raw HTML in a document is a text node, kept as text, and unknown node types or attributes are refused', async () => {
    const { base, headId } = await newEntry();
    const html = '<img src=x onerror=alert(1)><script>alert(2)</script>';
    const ok = await researcher.agent
      .post(`${base}/revisions`)
      .set('x-csrf-token', researcher.csrf)
      .send({ baseRevisionId: headId, title: 'HTML as text', entryDate: '2026-11-30', tags: [], document: { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'text', text: html }] }] } });
    expect(ok.status).toBe(201);
    expect(ok.body.document.content[0].content[0].text).toBe(html);
    // The printable record escapes it.
    const record = await researcher.agent.get(`${base}/export/record`);
    expect(record.status).toBe(200);
    expect(record.text).not.toContain('<script>alert(2)');
    expect(record.text).not.toContain('<img src=x onerror');
    expect(record.text).toContain('&lt;script&gt;alert(2)&lt;/script&gt;');
    for (const document of [
      { type: 'doc', content: [{ type: 'html', attrs: { html } }] },
      { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'text', text: 'x', marks: [{ type: 'onclick' }] }] }] },
    ]) {
      expect(documentSchema.safeParse(document).success, JSON.stringify(document)).toBe(false);
    }
  });
});

describe('ASVS V12.3.1: upload names cannot reach the storage path', () => {
  const PNG_1x1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64');
  const NAMES = [
    { raw: '../../../etc/passwd.png', kept: 'passwd.png' },
    { raw: '..\\..\\windows\\system32\\evil.png', kept: 'evil.png' },
    { raw: '/etc/cron.d/job.png', kept: 'job.png' },
    { raw: 'C:\\Users\\x\\photo.png', kept: 'photo.png' },
    { raw: '\u202Egnp.exe.png', kept: '\u202Egnp.exe.png' },
  ];

  it.each(NAMES)('the name $raw is kept as $kept; the key is ids only; Content-Disposition is safe', async ({ raw, kept }) => {
    const { base } = await newEntry();
    const up = await researcher.agent.post(`${base}/attachments`).set('x-csrf-token', researcher.csrf).attach('file', PNG_1x1, { filename: raw, contentType: 'image/png' });
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    expect(up.body.name).toBe(kept);
    const row = await t.dataSource.manager.findOneByOrFail(AttachmentEntity, { id: up.body.id });
    expect(row.storageKey).toMatch(/^[0-9a-z/-]+$/i);
    expect(row.storageKey).not.toContain('..');
    expect(row.storageKey).toContain(row.id);
    expect(row.storageKey).not.toContain(kept.split('.')[0]);
    // The download redirect asks storage for the original name in RFC 6266 form.
    const download = await researcher.agent.get(`${base}/attachments/${up.body.id}/content`);
    expect(download.status).toBe(302);
    const location = new URL(download.headers.location as string);
    const disposition = location.searchParams.get('response-content-disposition') ?? (await fetch(location)).headers.get('content-disposition') ?? '';
    expect(disposition).toMatch(/^(attachment|inline); filename="[\x20-\x7e]*"; filename\*=UTF-8''/);
    const fallback = /filename="([^"]*)"/.exec(disposition)?.[1] ?? '';
    expect(fallback).not.toMatch(/[/\\"\r\n]/);
    expect(decodeURIComponent(/filename\*=UTF-8''(.*)$/.exec(disposition)?.[1] ?? '')).toBe(kept);
  });
});

describe('ASVS V5.2.4 / V5.2.8: model expressions reach only the whitelisted maths', () => {
  const EXPRESSIONS = [
    'import("fs")',
    'require("child_process")',
    'constructor',
    'x.constructor',
    'e.constructor',
    '__proto__',
    'x["__proto__"]',
    'this.process',
    'process.exit(1)',
    'globalThis',
    'evaluate("1+1")',
    'parse("x")',
    'import({}, {override: true})',
    'createUnit("foo")',
    'f(x) = x; f',
    'x = 2',
    '[1, 2][1]',
    '"text"',
    'cos.constructor("return process")()',
    'x;\nmu',
    'constructor(x)',
    'toString(x)',
    'hasOwnProperty(x)',
    'valueOf',
    '__proto__(x)',
  ];

  it.each(EXPRESSIONS)('refuses %j with a structured error naming the expression', async (rhs) => {
    const res = await researcher.agent
      .post('/api/engine/validate-model')
      .set('x-csrf-token', researcher.csrf)
      .send({ model: { variables: [{ name: 'x', rhs }], parameters: [{ name: 'mu', value: 1 }], definitions: [] } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const errors = res.body.errors as { path: string; message: string }[];
    expect(errors.length, JSON.stringify(res.body)).toBeGreaterThan(0);
    expect(errors[0].path).toBe('model.variables[0].rhs');
    expect(typeof errors[0].message).toBe('string');
    expect(errors[0].message.length).toBeGreaterThan(5);
  });

  it('the same expressions cannot be run as a cell either: a structured error result naming the field, nothing evaluated', async () => {
    const { base } = await newEntry();
    for (const rhs of ['import("fs")', 'this.process', 'e.constructor', 'constructor(x)', '__proto__']) {
      const res = await researcher.agent
        .post(`${base}/cells/${SADDLE_MODEL_CELL_ID}/run`)
        .set('x-csrf-token', researcher.csrf)
        .send({ model: { variables: [{ name: 'x', rhs }], parameters: [{ name: 'mu', value: 1 }], definitions: [] }, task: { kind: 'equilibria', start: { x: 1 } } });
      // A model that does not check out is an expected outcome: a result with status "error".
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ status: 'error', error: { path: 'model.variables[0].rhs' } });
      expect(typeof res.body.error.code).toBe('string');
    }
  });

  it('ordinary maths still passes', async () => {
    const res = await researcher.agent.post('/api/engine/validate-model').set('x-csrf-token', researcher.csrf).send({ model: saddleModel });
    expect(res.body).toEqual({ errors: [] });
  });
});
