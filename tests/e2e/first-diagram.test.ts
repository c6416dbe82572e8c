import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { DEMO_NOTEBOOKS } from '../../seeds/demo-people.ts';
import { launchBrowser, saveScreenshot, SCREENSHOTS_DIR } from '../support/browser.ts';
import { seriousAxeViolations, signIn } from './helpers.ts';

/**
 * A first branch diagram from a blank entry, counting what the researcher does: each click and
 * each typed-then-Enter field is one action. The defaults carry the rest: the empty model cell
 * offers a working example, the new branch cell follows that model in its first parameter over a
 * range around its value, and one click runs it. Screenshot: tests/e2e/screenshots/first-diagram.png.
 */
const baseUrl = inject('baseUrl');
/** At most this many actions from the notebook page to a drawn diagram with a fold. */
const MAX_ACTIONS = 8;

let browser: Awaited<ReturnType<typeof launchBrowser>>;
let page: Page;
const actions: string[] = [];

/** One user action, recorded by name so a failure says which step it was. */
async function act(name: string, step: () => Promise<unknown>): Promise<void> {
  actions.push(name);
  await step();
}

async function waitForStatus(c: Locator, status: string, timeout = 30_000): Promise<void> {
  const start = Date.now();
  while ((await c.getAttribute('data-status')) !== status) {
    if (Date.now() - start > timeout) throw new Error(`cell stayed "${await c.getAttribute('data-status')}", expected "${status}"`);
    await page.waitForTimeout(100);
  }
}

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await page.setViewportSize({ width: 1280, height: 900 });
  await signIn(page, baseUrl, 'researcher');
});

afterAll(async () => {
  await browser?.close();
});

describe('a first branch diagram', () => {
  it(`takes at most ${MAX_ACTIONS} actions from a blank entry to a diagram with a fold`, async () => {
    await page.goto(baseUrl);
    await page.getByRole('link', { name: DEMO_NOTEBOOKS.stirredTank.title }).click();
    // (opening the notebook is navigation, not part of the count)
    await page.getByRole('button', { name: 'New entry' }).waitFor();

    await act('open the new-entry dialog', () => page.getByRole('button', { name: 'New entry' }).click());
    await act('type a title and press Enter', async () => {
      await page.getByLabel('Title').fill('First diagram');
      await page.getByLabel('Title').press('Enter');
    });
    await page.getByRole('button', { name: '+ Add cell' }).waitFor();

    await act('open the add-cell menu', () => page.getByRole('button', { name: '+ Add cell' }).click());
    await act('choose a model cell', () => page.getByRole('menuitem', { name: /^Model/ }).click());
    const model = page.locator('[data-cell-kind="model"]').first();
    await act('pick the two-fold example', () => model.getByRole('button', { name: /Two folds/ }).click());
    await model.getByTestId('model-equations').locator('.katex').first().waitFor();

    await act('open the add-cell menu', () => page.getByRole('button', { name: '+ Add cell' }).click());
    await act('choose a branch cell', () => page.getByRole('menuitem', { name: /^Branch of equilibria/ }).click());
    const branch = page.locator('[data-cell-kind="branch"]').first();
    await act('run it', () => branch.getByRole('button', { name: 'Run', exact: true }).click());

    await waitForStatus(branch, 'up');
    await branch.getByTestId('plot').locator('svg').first().waitFor();
    const events = branch.locator('table tbody tr');
    await events.first().waitFor();
    const kinds = await events.allTextContents();
    expect(kinds.filter((k) => /fold/i.test(k)).length, `events: ${kinds.join(' | ')}`).toBe(2);

    await branch.scrollIntoViewIfNeeded();
    await saveScreenshot(page, 'first-diagram');
    await branch.screenshot({ path: `${SCREENSHOTS_DIR}first-diagram-cell.png` });
    expect(actions.length, actions.join(' → ')).toBeLessThanOrEqual(MAX_ACTIONS);
    expect(await seriousAxeViolations(page)).toEqual([]);
  });

  it('offers Undo after a cell is removed, and Undo brings it back', async () => {
    const branch = page.locator('[data-cell-kind="branch"]');
    await branch.first().getByRole('button', { name: 'Cell actions' }).click();
    await page.getByRole('menuitem', { name: 'Remove' }).click();
    expect(await branch.count()).toBe(0);
    await page.getByRole('status').getByRole('button', { name: 'Undo' }).click();
    await branch.first().waitFor();
    expect(await branch.count()).toBe(1);
  });

  it('loads an entry while the pointer rests on its link in the log', async () => {
    const entryPath = new URL(page.url()).pathname;
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Notebooks' }).click();
    await page.getByRole('link', { name: DEMO_NOTEBOOKS.stirredTank.title }).click();
    const link = page.getByRole('main').getByRole('link', { name: 'Ignition and extinction along the residence time' }).first();
    await link.waitFor();
    const href = await link.getAttribute('href');
    expect(href).not.toBe(entryPath);
    // The entry's own query is fetched on hover, before any click.
    const fetched = page.waitForResponse((r) => r.request().method() === 'GET' && new URL(r.url()).pathname === `/api${href}`, { timeout: 5000 });
    await link.hover();
    expect((await fetched).status()).toBe(200);
    expect(new URL(page.url()).pathname).not.toBe(href);
  });
});
