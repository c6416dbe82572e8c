import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE, type DemoPersonKey } from '../../seeds/demo-people.ts';
import { launchBrowser, saveScreenshot } from '../support/browser.ts';
import { seriousAxeViolations, signIn } from './helpers.ts';

/**
 * The demo walk: each demo role signs in and visits every main screen it can see, with a
 * full-page screenshot (tests/e2e/screenshots/walk-<role>-<screen>.png) and an accessibility
 * check on each (no serious or critical axe violations).
 */

const baseUrl = inject('baseUrl');
const NOTEBOOK = DEMO_NOTEBOOKS.stirredTank.title;
/** A seeded entry with a branch, equilibria and trajectory cells (all with plots). */
const ENTRY = 'Ignition and extinction along the residence time';
/** The seeded entry waiting in the PI's review queue. */
const PENDING = 'Fold map in residence time and heat of reaction';
/** A word of the seeded stirred-tank entries. */
const SEARCH_WORDS = 'ignition';

type Screen = { name: string; visit: (page: Page) => Promise<void> };

/** Lets the page's requests finish (fonts, queries) so the screenshot shows the settled page. */
async function settle(page: Page): Promise<void> {
  await page.waitForLoadState('networkidle', { timeout: 5000 }).catch(() => undefined);
}

async function mainHeading(page: Page, name: string | RegExp): Promise<void> {
  await page.getByRole('main').getByRole('heading', { level: 1, name }).first().waitFor();
}

/** Brings each plot on the page into view in turn and waits until vega has drawn it. */
async function loadPlots(page: Page): Promise<number> {
  const plots = page.getByTestId('plot');
  const count = await plots.count();
  for (let i = 0; i < count; i++) {
    await plots.nth(i).scrollIntoViewIfNeeded();
    await plots.nth(i).locator('svg').first().waitFor();
  }
  await page.evaluate(() => window.scrollTo(0, 0));
  return count;
}

const notebooksList: Screen = {
  name: 'notebooks',
  visit: async (page) => {
    await page.goto(baseUrl);
    await mainHeading(page, 'Your notebooks');
  },
};

const notebookPage: Screen = {
  name: 'notebook',
  visit: async (page) => {
    await page.goto(baseUrl);
    await page.getByRole('link', { name: NOTEBOOK }).click();
    await mainHeading(page, NOTEBOOK);
    await page.getByRole('link', { name: ENTRY }).first().waitFor();
  },
};

/** The entry with cells; leaves its URL behind for the compare screen. */
let entryUrl = '';
const entryPage: Screen = {
  name: 'entry',
  visit: async (page) => {
    await page.goto(baseUrl);
    await page.getByRole('link', { name: NOTEBOOK }).click();
    await page.getByRole('link', { name: ENTRY }).first().click();
    // (a writer's title is an editable field, a reader's a heading: wait for the cells instead)
    await page.getByTestId('model-equations').first().waitFor();
    expect(await loadPlots(page)).toBeGreaterThan(0);
    entryUrl = page.url();
  },
};

const comparePage: Screen = {
  name: 'compare',
  visit: async (page) => {
    expect(entryUrl, 'the entry screen runs first').not.toBe('');
    await page.goto(`${entryUrl}/compare`);
    await mainHeading(page, ENTRY);
    await page.getByTestId('revision-comparison').waitFor();
    await loadPlots(page);
  },
};

const reviewQueue: Screen = {
  name: 'review-queue',
  visit: async (page) => {
    await page.goto(`${baseUrl}/reviews`);
    await page.getByRole('main').getByRole('heading', { level: 1 }).first().waitFor();
  },
};

const reviewPage: Screen = {
  name: 'review',
  visit: async (page) => {
    await page.goto(`${baseUrl}/reviews`);
    await page.getByRole('link', { name: PENDING }).first().click();
    await mainHeading(page, PENDING);
    await page.getByTestId('revision-comparison').waitFor();
    expect(await loadPlots(page)).toBeGreaterThan(0);
  },
};

const auditPage: Screen = {
  name: 'audit',
  visit: async (page) => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My activity' }).click();
    await page.getByRole('main').getByRole('heading', { level: 1 }).first().waitFor();
    // (the table itself, or the empty state: the page's description also says "nothing")
    await page.getByRole('main').getByRole('table').or(page.getByRole('main').getByText('Nothing recorded')).first().waitFor();
    await settle(page);
  },
};

function searchPage(expectHits: boolean): Screen {
  return {
    name: 'search',
    visit: async (page) => {
      await page.goto(`${baseUrl}/search`);
      const form = page.getByRole('search', { name: 'Search entries' });
      await form.getByLabel(/Words or/).fill(SEARCH_WORDS);
      await form.getByLabel(/Words or/).press('Enter');
      const results = page.getByRole('region', { name: 'Search results' });
      await results.waitFor();
      if (expectHits) await results.getByRole('link').first().waitFor();
      else await results.getByText('Nothing found.').waitFor();
    },
  };
}

const methodsPage: Screen = {
  name: 'methods',
  visit: async (page) => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Methods' }).click();
    await mainHeading(page, 'Methods');
    await page.getByRole('note', { name: 'Caution' }).waitFor();
    expect(await page.locator('.katex').count()).toBeGreaterThan(20);
    // The contents list jumps to its sections; the footer links here too.
    await page.getByRole('navigation', { name: 'Contents' }).getByRole('link', { name: 'Caution' }).click();
    expect(new URL(page.url()).hash).toBe('#caution');
    await page.getByRole('contentinfo').getByRole('link', { name: 'Methods' }).waitFor();
    await page.evaluate(() => window.scrollTo(0, 0));
  },
};

/** The Methods page again in the dark theme (its caution box and maths must keep their contrast). */
const methodsDark: Screen = {
  name: 'methods-dark',
  visit: async (page) => {
    await page.emulateMedia({ colorScheme: 'dark', reducedMotion: 'reduce' });
    await page.goto(`${baseUrl}/methods`);
    await mainHeading(page, 'Methods');
    // (waitForFunction would need eval, which the app's CSP forbids)
    for (let i = 0; (await page.evaluate(() => document.documentElement.dataset.theme)) !== 'dark'; i++) {
      if (i > 50) throw new Error('The Methods page did not switch to the dark theme');
      await page.waitForTimeout(50);
    }
    await page.getByRole('note', { name: 'Caution' }).waitFor();
  },
};

const accountPage: Screen = {
  name: 'account',
  visit: async (page) => {
    await page.goto(`${baseUrl}/account`);
    await page.getByRole('heading', { name: 'Password' }).waitFor();
  },
};

const adminPeople: Screen = {
  name: 'admin-people',
  visit: async (page) => {
    await page.goto(`${baseUrl}/admin/users`);
    await page.getByRole('main').getByRole('table').getByText(DEMO_PEOPLE.reader.email).waitFor();
  },
};

const member = (reviews: Screen[]): Screen[] => [
  notebooksList,
  notebookPage,
  entryPage,
  comparePage,
  ...reviews,
  auditPage,
  searchPage(true),
  methodsPage,
  accountPage,
];

const WALKS: { role: DemoPersonKey; screens: Screen[] }[] = [
  { role: 'pi', screens: member([reviewQueue, reviewPage]) },
  { role: 'researcher', screens: member([reviewQueue]) },
  { role: 'reader', screens: [...member([reviewQueue]), methodsDark] },
  {
    role: 'admin',
    screens: [notebooksList, reviewQueue, auditPage, searchPage(false), methodsPage, accountPage, adminPeople],
  },
];

for (const { role, screens } of WALKS) {
  describe(`the demo walk as ${DEMO_PEOPLE[role].name}`, () => {
    let browser: Awaited<ReturnType<typeof launchBrowser>>;
    let page: Page;

    beforeAll(async () => {
      browser = await launchBrowser();
      page = await browser.context.newPage();
      await page.setViewportSize({ width: 1280, height: 900 });
      await page.emulateMedia({ colorScheme: 'light', reducedMotion: 'reduce' });
      await signIn(page, baseUrl, role);
    });

    afterAll(async () => {
      await browser?.close();
    });

    for (const screen of screens) {
      it(`shows the ${screen.name} screen with no serious accessibility problems`, async () => {
        await screen.visit(page);
        await settle(page);
        await saveScreenshot(page, `walk-${role}-${screen.name}`);
        expect(await seriousAxeViolations(page)).toEqual([]);
      });
    }
  });
}
