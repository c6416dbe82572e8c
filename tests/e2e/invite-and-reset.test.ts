import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, saveScreenshot } from '../support/browser.ts';
import { DEMO_NOTEBOOKS } from '../../seeds/demo-people.ts';
import { signIn, signOut } from './helpers.ts';

const baseUrl = inject('baseUrl');
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let page: Page;

// A person who does not exist yet; the suffix keeps reruns against one database apart.
const suffix = Date.now().toString(36);
const newcomer = {
  name: 'Ada Newcombe',
  email: `ada.newcombe.${suffix}@vellharbour.example`,
  password: 'a-long-first-password',
  next: 'a-longer-second-password',
  third: 'the-third-password-of-ada',
  renamed: 'Ada M. Newcombe',
};

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.context.newPage();
});

// Each step starts signed out, whatever the one before left behind.
beforeEach(async () => {
  await browser.context.clearCookies();
});

afterEach(async (ctx) => {
  if (ctx.task.result?.state === 'fail')
    await saveScreenshot(page, `invite-and-reset-failure-${ctx.task.name.slice(0, 40).replace(/\W+/g, '-')}`);
});

afterAll(async () => {
  await browser?.close();
});

/** Opens the newest outbox message sent to `to` and returns the first link in it that starts with `prefix`. */
async function linkFromOutbox(to: string, prefix: string): Promise<string> {
  await page.goto(`${baseUrl}/dev/outbox`);
  const item = page.getByRole('list', { name: 'Messages' }).getByRole('link').filter({ hasText: to }).first();
  await item.waitFor({ timeout: 15_000 });
  await item.click();
  const body = page.getByTestId('message-text');
  await body.waitFor();
  const link = body
    .getByRole('link')
    .filter({ hasText: `${baseUrl}${prefix}` })
    .first();
  await link.waitFor();
  return (await link.getAttribute('href')) ?? '';
}

async function signInWith(email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

describe('inviting a new person', () => {
  it('the administrator invites by e-mail, with field messages for a bad address', async () => {
    await signIn(page, baseUrl, 'admin');
    await page.goto(`${baseUrl}/admin/invites`);
    const form = page.getByRole('form', { name: 'Invite someone' });
    await form.getByLabel('Name').fill(newcomer.name);
    await form.getByLabel('E-mail address').fill('ada at vell harbour');
    await form.getByRole('button', { name: 'Send invite' }).click();
    expect(await form.getByText('Enter a valid e-mail address').isVisible()).toBe(true);
    await form.getByLabel('E-mail address').fill(newcomer.email);
    await form.getByRole('button', { name: 'Send invite' }).click();
    await page.getByRole('status').getByText('Invite sent').waitFor();
    const row = page.getByRole('row').filter({ hasText: newcomer.email });
    await row.waitFor();
    expect(await row.getByText('Waiting').isVisible()).toBe(true);
    await saveScreenshot(page, 'admin-invites');
    await signOut(page);
  });

  it('the invitee follows the mailed link, chooses a password and is signed in', async () => {
    const href = await linkFromOutbox(newcomer.email, '/invite/');
    await saveScreenshot(page, 'outbox-invite');
    await page.getByTestId('message-text').getByRole('link', { name: href }).click();
    await page.getByRole('heading', { name: 'Join Bifolio' }).waitFor();
    expect(await page.getByLabel('E-mail address').inputValue()).toBe(newcomer.email);
    expect(await page.getByLabel('Your name').inputValue()).toBe(newcomer.name);

    await page.getByLabel('New password', { exact: true }).fill('short');
    await page.getByLabel('Repeat the new password').fill('different');
    await page.getByRole('button', { name: 'Create my account' }).click();
    expect(await page.getByText('Use at least 10 characters').isVisible()).toBe(true);
    expect(await page.getByText('The two passwords differ').isVisible()).toBe(true);

    await page.getByLabel('New password', { exact: true }).fill(newcomer.password);
    await page.getByLabel('Repeat the new password').fill(newcomer.password);
    await page.getByRole('button', { name: 'Create my account' }).click();
    await page.getByRole('heading', { name: 'Your notebooks' }).waitFor();
    await page.getByRole('heading', { name: 'No notebooks yet' }).waitFor();
    await signOut(page);
  });

  it('an invite link works once', async () => {
    const href = await linkFromOutbox(newcomer.email, '/invite/');
    await page.goto(href);
    await page.getByText('This invite link is not valid').waitFor();
  });

  it('the administrator sees the invite as accepted', async () => {
    await signIn(page, baseUrl, 'admin');
    await page.goto(`${baseUrl}/admin/invites`);
    const row = page.getByRole('row').filter({ hasText: newcomer.email });
    await row.waitFor();
    expect(await row.getByText('Accepted').isVisible()).toBe(true);
    await signOut(page);
  });
});

describe('resetting a forgotten password', () => {
  it('asks for a link from the sign-in page, sets a new password through it, and the old one stops working', async () => {
    await page.goto(`${baseUrl}/sign-in`);
    await page.getByRole('link', { name: 'Forgotten your password?' }).click();
    await page.getByRole('heading', { name: 'Reset your password' }).waitFor();
    await page.getByRole('button', { name: 'Send the link' }).click();
    expect(await page.getByText('Enter a valid e-mail address').isVisible()).toBe(true);
    await page.getByLabel('E-mail address').fill(newcomer.email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await page.getByText('a message with a link to choose a new password is on its way').waitFor();

    const href = await linkFromOutbox(newcomer.email, '/reset-password/');
    await page.getByTestId('message-text').getByRole('link', { name: href }).click();
    await page.getByRole('heading', { name: 'Choose a new password' }).waitFor();
    await page.getByLabel('New password', { exact: true }).fill(newcomer.next);
    await page.getByLabel('Repeat the new password').fill(newcomer.next);
    await page.getByRole('button', { name: 'Set the new password' }).click();
    await page.getByText('Your password has been changed').waitFor();

    await signInWith(newcomer.email, newcomer.password);
    await page.getByRole('alert').filter({ hasText: 'do not match' }).waitFor();
    await signInWith(newcomer.email, newcomer.next);
    await page.getByRole('heading', { name: 'Your notebooks' }).waitFor();
    await signOut(page);

    // the same link can't be used twice
    await page.goto(href);
    await page.getByLabel('New password', { exact: true }).fill('yet-another-password');
    await page.getByLabel('Repeat the new password').fill('yet-another-password');
    await page.getByRole('button', { name: 'Set the new password' }).click();
    await page.getByRole('alert').filter({ hasText: 'expired or has already been used' }).waitFor();
  });
});

describe('the account page', () => {
  it('changes the display name and the password, with the server message beside a wrong current password', async () => {
    await signInWith(newcomer.email, newcomer.next);
    await page.getByRole('heading', { name: 'Your notebooks' }).waitFor();
    await page.getByRole('button', { name: /account menu/ }).click();
    await page.getByRole('link', { name: 'Account' }).click();
    const nameForm = page.getByRole('form', { name: 'Your name' });
    await nameForm.getByLabel('Name').fill('');
    await nameForm.getByRole('button', { name: 'Save name' }).click();
    await nameForm.getByText('Enter a name').waitFor();
    await nameForm.getByLabel('Name').fill(newcomer.renamed);
    await nameForm.getByRole('button', { name: 'Save name' }).click();
    await page.getByRole('status').getByText('Name saved').waitFor();
    await page.getByRole('button', { name: new RegExp(`^${newcomer.renamed}`) }).waitFor();

    const pw = page.getByRole('form', { name: 'Change password' });
    await pw.getByLabel('Current password').fill('not-my-password');
    await pw.getByLabel('New password', { exact: true }).fill(newcomer.third);
    await pw.getByLabel('Repeat the new password').fill(newcomer.third);
    await pw.getByRole('button', { name: 'Change password' }).click();
    await pw.getByText('This is not your current password').waitFor();
    await pw.getByLabel('Current password').fill(newcomer.next);
    await pw.getByRole('button', { name: 'Change password' }).click();
    await page.getByRole('status').getByText('Password changed').waitFor();
    await saveScreenshot(page, 'account');
    await signOut(page);
    await signInWith(newcomer.email, newcomer.third);
    await page.getByRole('heading', { name: 'Your notebooks' }).waitFor();
    await signOut(page);
  });
});

describe('managing notebook members', () => {
  it('the PI adds the newcomer, changes their role, and removes them again', async () => {
    await signIn(page, baseUrl, 'pi');
    await page.getByRole('link', { name: new RegExp(DEMO_NOTEBOOKS.geneSwitch.title) }).click();
    const members = page.getByRole('list', { name: /^Members of/ });
    await members.waitFor();
    await page.getByRole('button', { name: 'Add member' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add a member' });
    await dialog.getByLabel('E-mail address').fill(newcomer.email);
    await dialog.getByLabel('Role').selectOption('reader');
    await dialog.getByRole('button', { name: 'Add member' }).click();
    await dialog.waitFor({ state: 'hidden' });
    const role = page.getByRole('combobox', { name: `Role of ${newcomer.renamed}` });
    await role.waitFor();
    expect(await role.inputValue()).toBe('reader');

    await role.selectOption('researcher');
    await page.reload();
    await role.waitFor();
    expect(await role.inputValue()).toBe('researcher');

    await page.getByRole('button', { name: `Remove ${newcomer.renamed}` }).click();
    await page
      .getByRole('dialog', { name: `Remove ${newcomer.renamed}?` })
      .getByRole('button', { name: 'Remove from notebook' })
      .click();
    await members.getByText(newcomer.renamed, { exact: true }).waitFor({ state: 'detached' });
    await signOut(page);
  });
});

describe('deactivating an account', () => {
  it('the administrator deactivates the newcomer after asking, and they can no longer sign in', async () => {
    await signIn(page, baseUrl, 'admin');
    await page.goto(`${baseUrl}/admin/users`);
    const row = page.getByRole('row').filter({ hasText: newcomer.email });
    await row.waitFor();
    await row.getByRole('button', { name: `Deactivate ${newcomer.renamed}` }).click();
    const dialog = page.getByRole('dialog', { name: `Deactivate ${newcomer.renamed}?` });
    await dialog.waitFor();
    // Escape backs out without changing anything
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'hidden' });
    expect(await row.getByText('Active', { exact: true }).isVisible()).toBe(true);
    await row.getByRole('button', { name: `Deactivate ${newcomer.renamed}` }).click();
    await dialog.getByRole('button', { name: 'Deactivate' }).click();
    await row.getByText('Deactivated').waitFor();
    await signOut(page);

    // the password that worked a moment ago no longer lets them in
    await signInWith(newcomer.email, newcomer.third);
    await page.getByRole('alert').filter({ hasText: 'do not match an active account' }).waitFor();
  });
});
