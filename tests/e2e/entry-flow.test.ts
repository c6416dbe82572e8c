import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { DEMO_NOTEBOOKS } from '../../seeds/demo-people.ts';
import { launchBrowser } from '../support/browser.ts';
import { SCREENSHOT_DIR, seriousAxeViolations, signIn, pageApi } from './helpers.ts';

/**
 * The researcher's path through one entry: text with maths, a model cell and analysis cells
 * run on the server, a parameter change that makes them stale, a rerun, a recorded revision,
 * and a reload that finds everything again. Screenshots of each cell kind land in
 * tests/e2e/screenshots/cell-*.png.
 */
const baseUrl = inject('baseUrl');
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let page: Page;
let entryUrl = '';

const api = <T,>(p: Page, method: string, url: string, body?: unknown) => pageApi<T>(p, method, url, body);

const cell = (kind: string) => page.locator(`[data-cell-kind="${kind}"]`).first();
const statusOf = (c: Locator) => c.getAttribute('data-status');

async function waitForStatus(c: Locator, status: string, timeout = 30_000) {
  const start = Date.now();
  while ((await statusOf(c)) !== status) {
    if (Date.now() - start > timeout)
      throw new Error(`cell stayed "${await statusOf(c)}", expected "${status}"`);
    await page.waitForTimeout(100);
  }
}

async function addCell(label: string) {
  await page.getByRole('button', { name: '+ Add cell' }).click();
  await page.getByRole('menuitem', { name: new RegExp(`^${label}`) }).click();
}

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await page.setViewportSize({ width: 1280, height: 900 });
  await signIn(page, baseUrl, 'researcher');
  const { notebooks } = await api<{ notebooks: { id: string; title: string }[] }>(
    page,
    'GET',
    '/api/notebooks',
  );
  const nb = notebooks.find((n) => n.title === DEMO_NOTEBOOKS.stirredTank.title)!;
  const detail = await api<{ entry: { id: string } }>(page, 'POST', `/api/notebooks/${nb.id}/entries`, {
    title: 'Ignition and extinction of the adiabatic tank',
    entryDate: '2026-11-30',
    tags: ['ignition', 'folds'],
  });
  entryUrl = `${baseUrl}/notebooks/${nb.id}/entries/${detail.entry.id}`;
});

afterAll(async () => {
  await browser?.close();
});

beforeEach((ctx) => {
  ctx.onTestFailed(async () => {
    await page.screenshot({ path: `${SCREENSHOT_DIR}entry-flow-failure.png`, fullPage: true });
  });
});

describe('an entry with cells', () => {
  it('takes text with maths and a model cell whose equations are typeset', async () => {
    await page.goto(entryUrl);
    const body = page.getByRole('textbox', { name: 'Entry body' });
    await body.click();
    await page.keyboard.type(
      'Heat balance of the tank, with reaction rate $Da\\,e^{x/(1+x/\\gamma)}$ and more.',
    );
    await page.locator('.katex').first().waitFor();

    await addCell('Model');
    const model = cell('model');
    await model.getByLabel('Model name').fill('Adiabatic tank');
    await model.getByLabel('Variable 1 name').fill('x');
    await model.getByLabel('Right-hand side of x').fill('-x + Da*(1 - x/B)*exp(x/(1 + x/g))');
    for (const [name, value] of [
      ['Da', '0.3'],
      ['B', '8'],
      ['g', '20'],
    ]) {
      await model.getByRole('button', { name: '+ parameter' }).click();
      const i = await model.locator('input[aria-label^="Parameter "][aria-label$=" name"]').count();
      await model.getByLabel(`Parameter ${i} name`).fill(name);
      await model.getByLabel(`Value of ${name}`).fill(value);
    }
    await model.getByTestId('model-equations').locator('.katex').first().waitFor();
    // a bad right-hand side gets its message under the field, from the engine's parser
    await model.getByLabel('Right-hand side of x').fill('-x + Da*(1 - x/B)*exp(x/(1 + x/g)');
    await model.locator('p.text-unstable').first().waitFor();
    await model.getByLabel('Right-hand side of x').fill('-x + Da*(1 - x/B)*exp(x/(1 + x/g))');
    await page.waitForTimeout(600);
    expect(await model.locator('p.text-unstable').count()).toBe(0);
  });

  it('runs a branch cell and draws the diagram with its folds', async () => {
    await addCell('Branch of equilibria');
    const branch = cell('branch');
    await branch.getByLabel('from', { exact: true }).fill('0.01');
    await branch.getByLabel('to', { exact: true }).fill('0.8');
    await branch.getByLabel('At most points').fill('2000');
    await branch.getByRole('button', { name: 'Run', exact: true }).click();
    await waitForStatus(branch, 'up');
    await branch.locator('svg').first().waitFor();
    const events = branch.locator('table tbody tr');
    expect(await events.count()).toBe(2);
    await events.first().click();
    expect(await events.first().getAttribute('data-selected')).toBe('true');
    await branch.screenshot({ path: `${SCREENSHOT_DIR}cell-branch.png` });
  });

  it('marks cells stale when a parameter changes and reruns them in order', async () => {
    const branch = cell('branch');
    await cell('model').getByLabel('Value of B').fill('7');
    await waitForStatus(branch, 'stale');
    await page.getByRole('button', { name: /^Rerun/ }).click();
    await waitForStatus(branch, 'up');
    expect(await branch.getByTestId('output-stamp').textContent()).toMatch(/engine .+ · input [0-9a-f]{10}/);
  });

  it('runs the other cell kinds', async () => {
    await addCell('Equilibria');
    const eq = cell('equilibria');
    await eq.getByLabel('x lower end').fill('0');
    await eq.getByLabel('x upper end').fill('8');
    await eq.getByRole('button', { name: 'Run', exact: true }).click();
    await waitForStatus(eq, 'up');
    await eq.locator('table').waitFor();
    await eq.screenshot({ path: `${SCREENSHOT_DIR}cell-equilibria.png` });

    await addCell('Trajectory');
    const tr = cell('trajectory');
    await tr.getByLabel('to time').fill('20');
    await tr.getByLabel('x', { exact: true }).fill('4');
    await tr.getByRole('button', { name: 'Run', exact: true }).click();
    await waitForStatus(tr, 'up');
    await tr.locator('svg').first().waitFor();
    await tr.screenshot({ path: `${SCREENSHOT_DIR}cell-trajectory.png` });

    await addCell('Fold map');
    const fm = cell('fold-map');
    await fm.getByLabel('Start from a fold found by a branch cell').selectOption({ index: 1 });
    await fm.getByLabel('Da lower end').fill('0');
    await fm.getByLabel('Da upper end').fill('0.8');
    await fm.getByLabel('B lower end').fill('3');
    await fm.getByLabel('B upper end').fill('12');
    await fm.getByLabel('At most points').fill('3000');
    await fm.getByRole('button', { name: 'Run', exact: true }).click();
    await waitForStatus(fm, 'up', 60_000);
    await fm.locator('svg').first().waitFor();
    await fm.screenshot({ path: `${SCREENSHOT_DIR}cell-fold-map.png` });
    await cell('model').screenshot({ path: `${SCREENSHOT_DIR}cell-model.png` });
  });

  it('records a revision, and a reload finds everything', async () => {
    await page.getByRole('button', { name: 'Record revision' }).click();
    const dialog = page.getByRole('dialog');
    await dialog
      .getByLabel('What changed (optional)')
      .fill('Branch, equilibria, trajectory and fold map of the adiabatic tank');
    await dialog.getByRole('button', { name: 'Record revision' }).click();
    await page.getByTestId('save-state').getByText('recorded', { exact: true }).waitFor();
    await page.screenshot({ path: `${SCREENSHOT_DIR}entry-page.png`, fullPage: true });
    await page.reload();
    // Plots load only when on screen: bring the branch cell into view first.
    await cell('branch').scrollIntoViewIfNeeded();
    await cell('branch').locator('svg').first().waitFor();
    expect(await page.getByRole('textbox', { name: 'Entry body' }).textContent()).toContain(
      'Heat balance of the tank',
    );
    for (const kind of ['model', 'branch', 'equilibria', 'trajectory', 'fold-map'])
      expect(await cell(kind).count()).toBe(1);
    expect(await statusOf(cell('branch'))).toBe('up');
    await page.getByRole('button', { name: /^History/ }).click();
    await page.getByRole('navigation', { name: 'Revision history' }).getByText('#2').waitFor();
  });

  it('has no serious accessibility problems with every cell kind and the history on the page', async () => {
    expect(await seriousAxeViolations(page)).toEqual([]);
  });

  it('rebases onto a revision recorded meanwhile instead of overwriting it', async () => {
    const body = page.getByRole('textbox', { name: 'Entry body' });
    await body
      .locator('p')
      .first()
      .click({ position: { x: 2, y: 8 } });
    await page.keyboard.press('End');
    await page.keyboard.type(' My local note.');
    // Meanwhile, another tab records a revision with a paragraph of its own.
    const [, , notebookId, , entryId] = new URL(entryUrl).pathname.split('/');
    type Detail = {
      head: {
        id: string;
        number: number;
        title: string;
        entryDate: string;
        tags: string[];
        document: { content: unknown[] };
        outputs: unknown;
      };
    };
    const detail = await api<Detail>(page, 'GET', `/api/notebooks/${notebookId}/entries/${entryId}`);
    const h = detail.head;
    await api(page, 'POST', `/api/notebooks/${notebookId}/entries/${entryId}/revisions`, {
      baseRevisionId: h.id,
      title: h.title,
      entryDate: h.entryDate,
      tags: h.tags,
      document: {
        type: 'doc',
        content: [
          ...h.document.content,
          { type: 'paragraph', content: [{ type: 'text', text: 'Added from another tab.' }] },
        ],
      },
      outputs: h.outputs,
      message: 'From another tab',
    });
    await page.getByRole('button', { name: 'Record revision' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Record revision' }).click();
    const conflict = page.getByRole('dialog', { name: 'Someone recorded a newer revision' });
    await conflict.getByText('Added from another tab.').first().waitFor();
    await conflict.getByRole('button', { name: `Rebase my changes onto #${h.number + 1}` }).click();
    await body.getByText('Added from another tab.').waitFor();
    expect(await body.textContent()).toContain('My local note.');
    await page.getByRole('button', { name: 'Record revision' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Record revision' }).click();
    await page.getByTestId('save-state').getByText('recorded', { exact: true }).waitFor();
    const after = await api<Detail>(page, 'GET', `/api/notebooks/${notebookId}/entries/${entryId}`);
    expect(after.head.number).toBe(h.number + 2);
  });
});
