import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
export { SCREENSHOTS_DIR as SCREENSHOT_DIR } from '../support/browser.ts';
import { DEMO_NOTEBOOKS, DEMO_PEOPLE, type DemoPersonKey } from '../../seeds/demo-people.ts';

/** Browser-test helpers shared by the e2e files: signing in, the demo notebooks, accessibility checks, themes. */
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

export async function signIn(page: Page, baseUrl: string, who: DemoPersonKey): Promise<void> {
  const person = DEMO_PEOPLE[who];
  await page.goto(`${baseUrl}/sign-in`);
  // A session can outlive clearCookies when a late response sets its cookie again: end it first.
  const form = page.getByRole('form', { name: 'Sign in' });
  const menu = page.getByRole('button', { name: /account menu/ });
  await form.or(menu).first().waitFor();
  if (await menu.isVisible()) await signOut(page);
  await page.getByLabel('E-mail address').fill(person.email);
  await page.getByLabel('Password', { exact: true }).fill(person.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { name: 'Your notebooks' }).waitFor();
}

export async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: /account menu/ }).click();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
}

/** Titles of the demo notebooks a person belongs to, from the seed (not retyped). */
export function notebookTitlesOf(who: DemoPersonKey): string[] {
  return Object.values(DEMO_NOTEBOOKS)
    .filter((nb) => nb.members.some((m) => m.person === who))
    .map((nb) => nb.title)
    .sort();
}

/** Titles shown on the notebooks page, once it has loaded. */
export async function listedNotebookTitles(page: Page): Promise<string[]> {
  await page.locator('ul[aria-label="Your notebooks"], h3:text("No notebooks yet")').first().waitFor();
  return (await page.locator('ul[aria-label="Your notebooks"] h3').allTextContents()).sort();
}

export type AxeViolation = { id: string; impact: string | null; help: string; nodes: { target: string[] }[] };

/** Runs axe-core (WCAG 2.x A/AA rules) in the page; returns the serious and critical violations. */
export async function seriousAxeViolations(page: Page): Promise<AxeViolation[]> {
  // The app's CSP forbids inline scripts, so page.addScriptTag can't add axe; evaluating the
  // source through the DevTools protocol is not subject to the page's CSP.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: { run: (ctx: Document, opts: object) => Promise<{ violations: AxeViolation[] }> };
      }
    ).axe;
    const result = await axe.run(document, {
      runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
    });
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.map((n) => ({ target: n.target })),
    }));
  });
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

/** Light, then dark, as the system preference (the default theme choice follows it). */
export async function inBothThemes(
  page: Page,
  each: (theme: 'light' | 'dark') => Promise<void>,
): Promise<void> {
  for (const theme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: theme, reducedMotion: 'reduce' });
    // (waitForFunction would need eval, which the app's CSP forbids)
    for (let i = 0; (await page.evaluate(() => document.documentElement.dataset.theme)) !== theme; i++) {
      if (i > 50) throw new Error(`The page did not switch to the ${theme} theme`);
      await page.waitForTimeout(50);
    }
    await each(theme);
  }
  await page.emulateMedia({ colorScheme: 'light' });
}

/**
 * Calls the API from inside the signed-in page (its session cookie, the CSRF token for writes),
 * for test set-up steps that the test is not about. Throws with the status and body on failure.
 */
export async function pageApi<T>(page: Page, method: string, url: string, body?: unknown): Promise<T> {
  return page.evaluate(
    async ({ method, url, body }) => {
      const headers: Record<string, string> = { accept: 'application/json', 'content-type': 'application/json' };
      if (method !== 'GET') {
        const csrf = (await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string };
        headers['x-csrf-token'] = csrf.csrfToken;
      }
      const res = await fetch(url, { method, headers, body: body === undefined ? undefined : JSON.stringify(body) });
      if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${await res.text()}`);
      return (await res.json()) as T;
    },
    { method, url, body },
  ) as Promise<T>;
}
