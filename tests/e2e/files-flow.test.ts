import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_NOTEBOOKS } from '../../seeds/demo-people.ts';
import { launchBrowser, saveScreenshot } from '../support/browser.ts';
import { signIn, pageApi } from './helpers.ts';

/**
 * Files in the browser: a multipart upload with progress, an uploaded image placed in the text
 * and shown on the entry page (through the signed-address redirect, under the page's content
 * security policy), a figure made from a branch cell, the printable record printed to PDF by
 * Chromium, and the whole entry downloaded as a ZIP.
 */
const baseUrl = inject('baseUrl');
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let page: Page;
let notebookId = '';
let entryId = '';
let entryApi = '';

const MODEL = 'c0ffee00-0000-4000-8000-000000000001';
const BRANCH = 'c0ffee00-0000-4000-8000-000000000002';
const model = { variables: [{ name: 'x', rhs: 'mu - x^2' }], parameters: [{ name: 'mu', value: 1 }], definitions: [] };
const task = { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 2 } };
/** A 2×2 PNG (PNG specification, W3C 2003): signature, IHDR, IDAT, IEND. */
const PNG_2x2 = 'iVBORw0KGgoAAAANSUhEUgAAAAIAAAACCAIAAAD91JpzAAAAFklEQVR4nGP8z8DAwMDAxMDAwMDAAAANHQEDasKb6QAAAABJRU5ErkJggg==';

const api = <T,>(method: string, url: string, body?: unknown) => pageApi<T>(page, method, url, body);

/** Uploads bytes from the page the way the attachments panel does: FormData over XMLHttpRequest, with progress. */
async function uploadInPage(url: string, file: { base64?: string; size?: number; name: string; type: string }) {
  return page.evaluate(
    async ({ url, file }) => {
      const bytes = file.base64 ? Uint8Array.from(atob(file.base64), (c) => c.charCodeAt(0)) : new TextEncoder().encode('t,x\n'.padEnd(file.size ?? 0, '0'));
      const form = new FormData();
      form.append('file', new File([bytes], file.name, { type: file.type }));
      const csrf = ((await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string }).csrfToken;
      return new Promise<{ status: number; body: Record<string, unknown>; progress: number[] }>((resolve) => {
        const progress: number[] = [];
        const xhr = new XMLHttpRequest();
        xhr.open('POST', url);
        xhr.setRequestHeader('x-csrf-token', csrf);
        xhr.upload.onprogress = (e) => progress.push(e.loaded / e.total);
        xhr.onload = () => resolve({ status: xhr.status, body: JSON.parse(xhr.responseText) as Record<string, unknown>, progress });
        xhr.send(form);
      });
    },
    { url, file },
  );
}

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await page.setViewportSize({ width: 1280, height: 900 });
  await signIn(page, baseUrl, 'researcher');
  const { notebooks } = await api<{ notebooks: { id: string; title: string }[] }>('GET', '/api/notebooks');
  notebookId = notebooks.find((n) => n.title === DEMO_NOTEBOOKS.stirredTank.title)!.id;
  const detail = await api<{ entry: { id: string } }>('POST', `/api/notebooks/${notebookId}/entries`, { title: 'Photographs of the flame front', entryDate: '2026-11-30', tags: ['files'] });
  entryId = detail.entry.id;
  entryApi = `/api/notebooks/${notebookId}/entries/${entryId}`;
});

afterAll(async () => {
  await browser?.close();
});

describe('files in the browser', () => {
  let image: { id: string; contentUrl: string; sha256: string };
  let revisionId = '';

  it('uploads a file with progress events and refuses bytes that are not what the name says', async () => {
    const big = await uploadInPage(`${entryApi}/attachments`, { size: 3 * 1024 * 1024, name: 'long-run.csv', type: 'text/csv' });
    expect(big.status).toBe(201);
    expect(big.body).toMatchObject({ contentType: 'text/csv', byteSize: 3 * 1024 * 1024 });
    expect(big.progress.length).toBeGreaterThan(0);
    expect(big.progress[big.progress.length - 1]).toBe(1);
    const wrong = await uploadInPage(`${entryApi}/attachments`, { base64: PNG_2x2, name: 'report.pdf', type: 'application/pdf' });
    expect(wrong.status).toBe(415);
    expect((wrong.body.error as { message: string }).message).toBe('The file name says a PDF document, but its contents are a PNG image');
    const ok = await uploadInPage(`${entryApi}/attachments`, { base64: PNG_2x2, name: 'flame.png', type: 'image/png' });
    expect(ok.status).toBe(201);
    image = ok.body as typeof image;
  });

  it('shows an uploaded image placed in the text on the entry page', async () => {
    const detail = await api<{ head: { id: string } }>('GET', entryApi);
    const document = {
      type: 'doc',
      content: [
        { type: 'paragraph', content: [{ type: 'text', text: 'The flame front at ignition.' }] },
        { type: 'image', attrs: { src: image.contentUrl, alt: 'Flame front photograph' } },
        { type: 'cell', attrs: { id: MODEL, kind: 'model', input: { name: 'Saddle-node', ...model } } },
        { type: 'cell', attrs: { id: BRANCH, kind: 'branch', input: { modelCellId: MODEL, task } } },
      ],
    };
    const { cached: _cached, ...output } = await api<Record<string, unknown>>('POST', `${entryApi}/cells/${BRANCH}/run`, { model, task });
    const revision = await api<{ id: string }>('POST', `${entryApi}/revisions`, {
      baseRevisionId: detail.head.id, title: 'Photographs of the flame front', entryDate: '2026-11-30', tags: ['files'], document, outputs: { [BRANCH]: output },
    });
    revisionId = revision.id;
    await page.goto(`${baseUrl}/notebooks/${notebookId}/entries/${entryId}`);
    const img = page.getByRole('img', { name: 'Flame front photograph' });
    await img.scrollIntoViewIfNeeded();
    await expect.poll(() => img.evaluate((el) => (el as HTMLImageElement).complete && (el as HTMLImageElement).naturalWidth), { timeout: 10_000 }).toBe(2);
  });

  it('attaches a branch plot as a figure and shows its PNG', async () => {
    const figure = await api<{ pngUrl: string; svgUrl: string; inputHash: string }>('POST', `${entryApi}/figures`, { revisionId, cellId: BRANCH, caption: 'Fold of the saddle-node' });
    expect(figure.inputHash).toMatch(/^[0-9a-f]{64}$/);
    const size = await page.evaluate(
      (src) =>
        new Promise<[number, number]>((resolve, reject) => {
          const el = new Image();
          el.onload = () => resolve([el.naturalWidth, el.naturalHeight]);
          el.onerror = () => reject(new Error('figure did not load'));
          el.src = src;
        }),
      figure.pngUrl,
    );
    expect(size[0]).toBeGreaterThan(1000);
  });

  it('prints the record to PDF with the print stylesheet', async () => {
    const record = await browser.context.newPage();
    try {
      await record.goto(`${baseUrl}${entryApi}/export/record?revisionId=${revisionId}`);
      await record.getByRole('heading', { name: 'Photographs of the flame front', level: 1 }).waitFor();
      await expect.poll(() => record.locator('figure img').evaluateAll((els) => els.every((e) => (e as HTMLImageElement).complete && (e as HTMLImageElement).naturalWidth > 0)), { timeout: 10_000 }).toBe(true);
      await record.emulateMedia({ media: 'print' });
      expect(await record.evaluate(() => getComputedStyle(document.body).maxWidth)).toBe('none');
      await saveScreenshot(record, 'entry-record-print');
      const pdf = await record.pdf({ format: 'A4', printBackground: true });
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      const pages = pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? [];
      expect(pages.length).toBeGreaterThanOrEqual(1);
      expect(pdf.length).toBeGreaterThan(20_000);
    } finally {
      await record.close();
    }
  });

  it('downloads the whole entry as a ZIP', async () => {
    const head = await page.evaluate(async (url) => {
      const res = await fetch(url);
      const bytes = new Uint8Array(await res.arrayBuffer());
      return { status: res.status, type: res.headers.get('content-type'), disposition: res.headers.get('content-disposition'), magic: [...bytes.slice(0, 4)], size: bytes.length };
    }, `${entryApi}/export/archive`);
    expect(head).toMatchObject({ status: 200, type: 'application/zip', magic: [0x50, 0x4b, 0x03, 0x04] });
    expect(head.disposition).toContain('photographs-of-the-flame-front-r2.zip');
    expect(head.size).toBeGreaterThan(3 * 1024);
  });
});
