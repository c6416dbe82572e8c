import { randomUUID } from 'node:crypto';
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { launchBrowser, saveScreenshot, SCREENSHOTS_DIR } from '../support/browser.ts';
import { seriousAxeViolations, signIn, signOut, pageApi } from './helpers.ts';

/**
 * The review flow end to end: the researcher records two revisions in which the fold of
 * x' = μ − x² moves (Strogatz, Nonlinear Dynamics and Chaos, §3.1: fold at μ = 0; with +0.01 it
 * sits at μ = −0.01) and submits; the PI finds the request in the outbox, reads the comparison
 * (the moved fold in words, the overlaid plots), comments on the branch cell and requests
 * changes; the researcher revises and submits again; the PI approves with their password and
 * the record shows the signature and "reproduced". Revisions are recorded through the API (the
 * editor has its own browser test); every review step is clicked through the review screens.
 */
const baseUrl = inject('baseUrl');
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let page: Page;
let notebookId = '';
let entryId = '';
const title = `Saddle-node of the feed balance ${randomUUID().slice(0, 8)}`;
const reviewUrl = () => `${baseUrl}/notebooks/${notebookId}/entries/${entryId}/review`;

const api = <T,>(method: string, url: string, body?: unknown) => pageApi<T>(page, method, url, body);

const MODEL_ID = randomUUID();
const BRANCH_ID = randomUUID();
const task = { kind: 'continuation', parameter: 'mu', start: { x: 1 }, bounds: { min: -1, max: 1 } };

/** Record a revision whose branch cell follows x' = <rhs>, with the output the server computed. */
async function recordRevision(rhs: string, text: string, message: string) {
  const entryPath = `/api/notebooks/${notebookId}/entries/${entryId}`;
  const detail = await api<{ head: { id: string } }>('GET', entryPath);
  const model = { variables: [{ name: 'x', rhs }], parameters: [{ name: 'mu', value: 1 }], definitions: [] };
  const run = await api<Record<string, unknown>>('POST', `${entryPath}/cells/${BRANCH_ID}/run`, { model, task });
  delete run.cached;
  const document = {
    type: 'doc',
    content: [
      { type: 'heading', attrs: { level: 2 }, content: [{ type: 'text', text: 'Where the feed balance tips' }] },
      { type: 'paragraph', content: [{ type: 'text', text: 'We follow the equilibria of the feed balance as the supply rate changes.' }] },
      { type: 'paragraph', content: [{ type: 'text', text }] },
      { type: 'paragraph', content: [{ type: 'text', text: 'Below the fold no equilibrium is left and the tank runs away.' }] },
      { type: 'paragraph', content: [{ type: 'text', text: 'Calibration of the probes follows the usual protocol.' }] },
      { type: 'paragraph', content: [{ type: 'text', text: 'Temperatures are logged every second.' }] },
      { type: 'cell', attrs: { id: MODEL_ID, kind: 'model', input: { name: 'Feed balance', variables: [{ name: 'x', rhs }], parameters: [{ name: 'mu', value: 1 }], definitions: [] } } },
      { type: 'cell', attrs: { id: BRANCH_ID, kind: 'branch', input: { modelCellId: MODEL_ID, task } } },
    ],
  };
  await api('POST', `${entryPath}/revisions`, {
    baseRevisionId: detail.head.id,
    title,
    entryDate: '2026-12-01',
    tags: ['folds'],
    document,
    outputs: { [BRANCH_ID]: run },
    message,
  });
}

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await page.setViewportSize({ width: 1360, height: 1000 });
  await signIn(page, baseUrl, 'researcher');
  const { notebooks } = await api<{ notebooks: { id: string; title: string }[] }>('GET', '/api/notebooks');
  notebookId = notebooks.find((n) => n.title === DEMO_NOTEBOOKS.stirredTank.title)!.id;
  const created = await api<{ entry: { id: string } }>('POST', `/api/notebooks/${notebookId}/entries`, { title, entryDate: '2026-12-01', tags: ['folds'] });
  entryId = created.entry.id;
  await recordRevision('mu - x^2', 'The fold sits at mu = 0 for the nominal feed.', 'First branch');
  await recordRevision('mu + 0.01 - x^2', 'The fold sits at mu = -0.01 once the leak is included.', 'Leak term added');
});

afterEach(async (ctx) => {
  if (ctx.task.result?.state === 'fail') await saveScreenshot(page, `review-flow-failure-${ctx.task.name.slice(0, 30).replace(/\W+/g, '-')}`);
});

afterAll(async () => {
  await browser?.close();
});

describe('review of an entry', () => {
  it('the researcher submits the entry for review with a note', async () => {
    await page.goto(reviewUrl());
    await page.getByRole('heading', { name: title }).waitFor();
    await page.getByRole('button', { name: 'Submit for review' }).click();
    const dialog = page.getByRole('dialog', { name: 'Submit for review' });
    await dialog.getByLabel('Note for the reviewer').fill('The leak term moves the fold; please check the new branch.');
    await dialog.getByRole('button', { name: 'Submit' }).click();
    await page.getByText('Awaiting review · submitted by Kofi Mensah').waitFor();
    await signOut(page);
  });

  it('the PI gets the request by mail', async () => {
    await signIn(page, baseUrl, 'pi');
    const item = page.getByRole('list', { name: 'Messages' }).getByRole('link').filter({ hasText: DEMO_PEOPLE.pi.email }).filter({ hasText: `Review requested: ${title}` });
    // The mail leaves through the outbox queue: look again until it has been delivered.
    for (let i = 0; ; i++) {
      await page.goto(`${baseUrl}/dev/outbox`);
      await page.getByRole('heading', { level: 1 }).first().waitFor();
      if ((await item.count()) > 0) break;
      if (i > 30) throw new Error('The review request never reached the outbox');
      await page.waitForTimeout(500);
    }
    await item.first().click();
    await expect(page.getByTestId('message-text').textContent()).resolves.toContain('The leak term moves the fold');
  });

  it('the PI opens the comparison from the queue and reads the moved fold in words, with the plots overlaid', async () => {
    await page.goto(`${baseUrl}/reviews`);
    await page.getByRole('link', { name: title }).click();
    await page.getByRole('heading', { name: title }).waitFor();
    const comparison = page.getByTestId('revision-comparison');
    await comparison.waitFor();
    // Word-level text change, collapsed unchanged stretch, input change, result change in words.
    await comparison.locator('ins').filter({ hasText: '-0.01' }).first().waitFor();
    await comparison.getByRole('button', { name: /Show \d+ unchanged blocks/ }).waitFor();
    await comparison.getByText('Equation for x′ changed: x′ = mu - x^2 → x′ = mu + 0.01 - x^2').waitFor();
    await comparison.getByText('Fold moved from μ = 0.0000 to μ = −0.0100 (−0.0100)').waitFor();
    const plot = comparison.getByTestId('overlay-plot');
    await plot.scrollIntoViewIfNeeded();
    await plot.locator('svg, canvas').first().waitFor({ timeout: 20_000 });
    await saveScreenshot(page, 'review-page');
    expect(await seriousAxeViolations(page)).toEqual([]);
    await plot.screenshot({ path: `${SCREENSHOTS_DIR}review-overlay.png` });
  });

  it('the PI comments on the branch cell and requests changes', async () => {
    await page.getByRole('button', { name: /Comment on the cell Branch of equilibria/ }).click();
    const panel = page.getByRole('complementary', { name: 'Comments' });
    await panel.getByRole('textbox', { name: 'Write a comment' }).fill('Please extend the branch to μ = 2 so the upper branch is clearer.');
    await panel.getByRole('button', { name: 'Add comment' }).click();
    await panel.getByTestId('comment-thread').filter({ hasText: 'extend the branch' }).waitFor();
    await page.getByRole('button', { name: 'Request changes' }).click();
    const dialog = page.getByRole('dialog', { name: 'Request changes' });
    await dialog.getByRole('button', { name: 'Request changes' }).click();
    await dialog.getByText('Say what should change').waitFor();
    await dialog.getByLabel('What should change').fill('State the fold shift in the text as a number with its sign.');
    await dialog.getByRole('button', { name: 'Request changes' }).click();
    await page.getByText('Changes requested · submitted by Kofi Mensah').waitFor();
    await saveScreenshot(page, 'review-changes-requested');
    await signOut(page);
  });

  it('the researcher revises and submits again', async () => {
    await signIn(page, baseUrl, 'researcher');
    await recordRevision('mu + 0.01 - x^2', 'The fold moves by −0.01 to mu = -0.01 once the leak is included.', 'Fold shift stated');
    await page.goto(reviewUrl());
    await page.getByRole('button', { name: 'Submit again for review' }).click();
    const dialog = page.getByRole('dialog', { name: 'Submit for review' });
    await dialog.getByRole('button', { name: 'Submit' }).click();
    await page.getByText('Awaiting review · submitted by Kofi Mensah').waitFor();
    await signOut(page);
  });

  it('the PI approves with their password; the record shows the signature and "reproduced"', async () => {
    await signIn(page, baseUrl, 'pi');
    await page.goto(reviewUrl());
    await page.getByRole('heading', { name: title }).waitFor();
    await page.getByTestId('revision-comparison').locator('ins').filter({ hasText: '−0.01' }).first().waitFor();
    // The PI looked at revision #3 when requesting changes: the comparison starts there.
    await expect(page.getByRole('button', { name: 'Since you last looked' }).getAttribute('aria-pressed')).resolves.toBe('true');
    await page.getByRole('button', { name: 'Approve…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Approve and sign' });
    await dialog.getByText(DEMO_PEOPLE.pi.name).waitFor();
    await dialog.getByTestId('reproducibility').getByText('Reproduced').waitFor({ timeout: 30_000 });
    // A wrong password is refused in the dialog.
    await dialog.getByLabel('Your password').fill('not-the-password');
    await dialog.getByRole('button', { name: 'Sign and approve' }).click();
    await dialog.getByText('That password is not right').waitFor();
    await dialog.getByLabel('Your password').fill(DEMO_PEOPLE.pi.password);
    await dialog.getByRole('button', { name: 'Sign and approve' }).click();
    const signature = page.getByTestId('signature-block').first();
    await signature.waitFor();
    const text = (await signature.textContent()) ?? '';
    expect(text).toContain(`Approved — electronically signed by ${DEMO_PEOPLE.pi.name}`);
    expect(text).toMatch(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
    expect(text).toContain('meaning: approved');
    expect(text).toContain('reproduced ✓');
    await page.getByText('Approved · submitted by Kofi Mensah').waitFor();
    await saveScreenshot(page, 'review-signature');
  });

  it('the compare page compares any two revisions picked from the list', async () => {
    await page.goto(`${baseUrl}/notebooks/${notebookId}/entries/${entryId}/compare`);
    const comparison = page.getByTestId('revision-comparison');
    await comparison.waitFor();
    // Default: the newest revision against the one before it (only the text changed).
    await comparison.getByText('0 cells changed', { exact: false }).waitFor();
    await page.getByLabel('Older revision').selectOption({ label: (await page.getByLabel('Older revision').locator('option', { hasText: '#2 ·' }).textContent()) ?? '' });
    await comparison.getByText('Fold moved from μ = 0.0000 to μ = −0.0100 (−0.0100)').waitFor();
    expect(page.url()).toContain('from=');
    // The newer revision is signed: its signature is shown with it.
    await comparison.getByTestId('signature-block').getByText('reproduced ✓').waitFor();
  });

  it('the audit trail of the entry lists the review and the signature, with a CSV export', async () => {
    await page.goto(`${baseUrl}/audit?entryId=${entryId}`);
    const table = page.getByRole('table');
    await table.waitFor();
    await table.getByText('review: approved').first().waitFor();
    await table.getByText('review: signature failed').first().waitFor();
    const csv = await page.getByRole('link', { name: 'Download CSV' }).getAttribute('href');
    expect(csv).toContain(`entryId=${entryId}`);
    expect(csv).toContain('format=csv');
    await saveScreenshot(page, 'audit-entry');
  });
});
