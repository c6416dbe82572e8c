import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE } from '../../seeds/demo-people.ts';
import { launchBrowser, saveScreenshot } from '../support/browser.ts';
import {
  inBothThemes,
  listedNotebookTitles,
  notebookTitlesOf,
  seriousAxeViolations,
  signIn,
  signOut,
} from './helpers.ts';

const baseUrl = inject('baseUrl');
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let context: BrowserContext;
let page: Page;
/** Notebook title → its page URL, read from the PI's list (the PI belongs to all three). */
const notebookUrl = new Map<string, string>();

beforeAll(async () => {
  browser = await launchBrowser();
  context = browser.context;
  page = await context.newPage();
  await signIn(page, baseUrl, 'pi');
  // The list loads after the heading: wait until every one of the PI's notebooks is listed.
  const links = page.locator('ul[aria-label="Your notebooks"] a');
  const expected = notebookTitlesOf('pi').length;
  await links.nth(expected - 1).waitFor();
  for (const link of await links.all()) {
    notebookUrl.set(
      (await link.locator('h3').textContent()) ?? '',
      new URL((await link.getAttribute('href')) ?? '', baseUrl).href,
    );
  }
  await signOut(page);
});

afterAll(async () => {
  await browser?.close();
});

/** Each group of tests starts from a fresh session as one person. */
function as(who: Parameters<typeof signIn>[2]) {
  beforeAll(async () => {
    await context.clearCookies();
    await signIn(page, baseUrl, who);
  });
}

describe('signing in', () => {
  beforeEach(async () => {
    await context.clearCookies();
  });

  it('shows field messages from the shared rules and refuses a wrong password', async () => {
    await page.goto(`${baseUrl}/sign-in`);
    await page.getByRole('button', { name: 'Sign in' }).click();
    expect(await page.getByText('Enter a valid e-mail address').isVisible()).toBe(true);
    expect(await page.getByText('Enter your password').isVisible()).toBe(true);
    await page.getByLabel('E-mail address').fill(DEMO_PEOPLE.reader.email);
    await page.getByLabel('Password', { exact: true }).fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('alert').filter({ hasText: 'do not match' }).waitFor();
  });

  it('sends a visitor to sign-in and back to the page they asked for', async () => {
    const url = notebookUrl.get(DEMO_NOTEBOOKS.stirredTank.title)!;
    await page.goto(url);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).searchParams.get('redirectTo')).toBe(new URL(url).pathname);
    await page.getByLabel('E-mail address').fill(DEMO_PEOPLE.reader.email);
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PEOPLE.reader.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: DEMO_NOTEBOOKS.stirredTank.title }).waitFor();
    expect(page.url()).toBe(url);
  });
});

describe('the site administrator', () => {
  as('admin');

  it('sees only their own notebooks and can manage people', async () => {
    expect(await listedNotebookTitles(page)).toEqual(notebookTitlesOf('admin'));
    await page.getByRole('link', { name: 'People' }).click();
    await page.getByRole('table').waitFor();
    const names = await page.locator('tbody tr td:first-child').allTextContents();
    for (const person of Object.values(DEMO_PEOPLE)) expect(names.join('|')).toContain(person.name);
    // sorting by name: ascending first, then descending on a second press
    const nameHeader = page.locator('th', { hasText: 'Name' });
    expect(await nameHeader.getAttribute('aria-sort')).toBe('ascending');
    await nameHeader.getByRole('button').click();
    expect(await nameHeader.getAttribute('aria-sort')).toBe('descending');
    const desc = await page.locator('tbody tr td:first-child').allTextContents();
    expect(desc).toEqual([...names].reverse());
    expect(await page.getByRole('button', { name: 'Invite someone' }).isVisible()).toBe(true);
    expect(
      await page.getByRole('button', { name: `Deactivate ${DEMO_PEOPLE.reader.name}` }).isVisible(),
    ).toBe(true);
    // the administrator can't demote or deactivate themself from this page
    expect(
      await page.getByRole('combobox', { name: `Site role of ${DEMO_PEOPLE.admin.name}` }).isDisabled(),
    ).toBe(true);
    await saveScreenshot(page, 'admin-users');
    await signOut(page);
  });
});

describe('the principal investigator', () => {
  as('pi');

  it('sees their notebooks and the member-management controls', async () => {
    expect(await listedNotebookTitles(page)).toEqual(notebookTitlesOf('pi'));
    await page.goto(notebookUrl.get(DEMO_NOTEBOOKS.stirredTank.title)!);
    await page.getByRole('heading', { name: 'Members' }).waitFor();
    await page.getByRole('list', { name: /^Members of/ }).waitFor();
    expect(await page.getByRole('button', { name: 'Add member' }).isVisible()).toBe(true);
    expect(
      await page.getByRole('combobox', { name: `Role of ${DEMO_PEOPLE.researcher.name}` }).isEnabled(),
    ).toBe(true);
    expect(await page.getByRole('button', { name: `Remove ${DEMO_PEOPLE.reader.name}` }).isVisible()).toBe(
      true,
    );
    // the notebook's log sits beside the members; a PI may write in it
    await page.getByRole('heading', { name: 'Log', exact: true }).waitFor();
    expect(await page.getByRole('button', { name: 'New entry' }).isVisible()).toBe(true);
  });

  it('gets field messages when adding a member badly, beside the field, also from the server', async () => {
    await page.getByRole('button', { name: 'Add member' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add a member' });
    await dialog.getByRole('button', { name: 'Add member' }).click();
    expect(await dialog.getByText('Enter a valid e-mail address').isVisible()).toBe(true);
    await dialog.getByLabel('E-mail address').fill('nobody.here@vellharbour.example');
    await dialog.getByRole('button', { name: 'Add member' }).click();
    // the server's field message lands beside the field it names
    const email = dialog.getByLabel('E-mail address');
    await dialog.getByText(/No active account has this e-mail address/).waitFor();
    expect(await email.getAttribute('aria-invalid')).toBe('true');
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'hidden' });
  });

  it('is refused the administration pages', async () => {
    await page.goto(`${baseUrl}/admin/users`);
    await page.getByRole('heading', { name: 'Not available to you' }).waitFor();
    expect(await page.getByRole('table').count()).toBe(0);
    expect(await page.getByRole('link', { name: 'People' }).count()).toBe(0);
  });
});

describe('a researcher', () => {
  as('researcher');

  it('sees their notebooks only and gets "not found" for a notebook they are not in', async () => {
    const mine = notebookTitlesOf('researcher');
    expect(mine).not.toContain(DEMO_NOTEBOOKS.shallowLake.title);
    expect(await listedNotebookTitles(page)).toEqual(mine);
    await page.goto(notebookUrl.get(DEMO_NOTEBOOKS.shallowLake.title)!);
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
    expect(await page.getByText(DEMO_NOTEBOOKS.shallowLake.title).count()).toBe(0);
  });

  it('is refused /admin/users', async () => {
    await page.goto(`${baseUrl}/admin/users`);
    await page.getByRole('heading', { name: 'Not available to you' }).waitFor();
  });

  it('sees a not-found page for an address that does not exist', async () => {
    await page.goto(`${baseUrl}/no/such/page`);
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
  });
});

describe('the reader', () => {
  as('reader');

  it('sees their notebooks, the members, and no member-management controls', async () => {
    expect(await listedNotebookTitles(page)).toEqual(notebookTitlesOf('reader'));
    await page.goto(notebookUrl.get(DEMO_NOTEBOOKS.stirredTank.title)!);
    const members = page.getByRole('list', { name: /^Members of/ });
    await members.waitFor();
    expect(await members.getByText(DEMO_PEOPLE.pi.name).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'Add member' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Remove / }).count()).toBe(0);
    expect(await page.getByRole('combobox', { name: /^Role of/ }).count()).toBe(0);
    expect(await page.getByText('Only the principal investigator can add members').isVisible()).toBe(true);
    // readers read the log but don't write in it
    await page.getByRole('heading', { name: 'Log', exact: true }).waitFor();
    expect(await page.getByRole('button', { name: 'New entry' }).count()).toBe(0);
  });

  it('signs out, and the signed-in pages are then closed to them', async () => {
    await signOut(page);
    await page.goto(`${baseUrl}/`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    const res = await page.request.get(`${baseUrl}/api/auth/me`);
    expect(res.status()).toBe(401);
  });
});

describe('accessibility and look', () => {
  beforeAll(async () => {
    await context.clearCookies();
  });

  it('has no serious or critical axe violations on sign-in, notebooks and notebook pages, light and dark', async () => {
    const found: Record<string, unknown> = {};
    await page.goto(`${baseUrl}/sign-in`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await inBothThemes(page, async (theme) => {
      found[`sign-in ${theme}`] = await seriousAxeViolations(page);
      await saveScreenshot(page, `sign-in-${theme}`);
    });
    await signIn(page, baseUrl, 'pi');
    await inBothThemes(page, async (theme) => {
      found[`notebooks ${theme}`] = await seriousAxeViolations(page);
      await saveScreenshot(page, `notebooks-${theme}`);
    });
    await page.goto(notebookUrl.get(DEMO_NOTEBOOKS.stirredTank.title)!);
    await page.getByRole('list', { name: /^Members of/ }).waitFor();
    await inBothThemes(page, async (theme) => {
      found[`notebook ${theme}`] = await seriousAxeViolations(page);
      await saveScreenshot(page, `notebook-${theme}`);
    });
    expect(found).toEqual({
      'sign-in light': [],
      'sign-in dark': [],
      'notebooks light': [],
      'notebooks dark': [],
      'notebook light': [],
      'notebook dark': [],
    });
  });

  it('can be used from the keyboard, with a visible focus ring on every stop', async () => {
    await context.clearCookies();
    await page.goto(`${baseUrl}/sign-in`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.locator('body').focus();
    const stops: string[] = [];
    for (let i = 0; i < 8; i++) {
      await page.keyboard.press('Tab');
      const stop = await page.evaluate(() => {
        const el = document.activeElement as HTMLElement | null;
        if (!el || el === document.body) return null;
        const style = getComputedStyle(el);
        return {
          name: el.getAttribute('aria-label') ?? el.textContent?.trim() ?? el.tagName,
          ring: style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) >= 2,
        };
      });
      if (!stop) continue;
      stops.push(stop.name);
      expect(stop.ring, `focus ring on ${stop.name}`).toBe(true);
    }
    expect(stops.length).toBeGreaterThanOrEqual(5);
    // and a person can sign in with the keyboard alone
    await page.getByLabel('E-mail address').focus();
    await page.keyboard.type(DEMO_PEOPLE.reader.email);
    await page.keyboard.press('Tab');
    await page.keyboard.type(DEMO_PEOPLE.reader.password);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Your notebooks' }).waitFor();
  });

  it('loads nothing from any outside host', async () => {
    const outside: string[] = [];
    const watch = (url: string) => {
      if (!url.startsWith(baseUrl) && !url.startsWith('data:') && !url.startsWith('blob:')) outside.push(url);
    };
    page.on('request', (r) => watch(r.url()));
    await page.goto(`${baseUrl}/`);
    await page.getByRole('heading', { name: 'Your notebooks' }).waitFor();
    await page.waitForLoadState('networkidle');
    expect(outside).toEqual([]);
    // the interface and long-text faces came from the app itself
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family.replace(/"/g, ''));
    });
    expect(fonts).toEqual(expect.arrayContaining(['IBM Plex Sans', 'Merriweather']));
  });

  it('remembers an explicit theme choice', async () => {
    await page.getByRole('button', { name: /account menu/ }).click();
    await page.getByRole('radio', { name: 'Dark' }).click();
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('dark');
    await page.reload();
    await page.getByRole('heading', { name: 'Your notebooks' }).waitFor();
    expect(
      await page.evaluate(() => [
        document.documentElement.dataset.theme,
        localStorage.getItem('bifolio.theme'),
      ]),
    ).toEqual(['dark', 'dark']);
    await page.evaluate(() => localStorage.removeItem('bifolio.theme'));
  });
});
