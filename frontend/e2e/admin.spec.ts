import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { demo, DESKTOP, PHONE, signIn, startStack, type Stack } from './support/stack';

/**
 * The owner sets up a branch and invites a salesperson; the salesperson sets a password from the
 * e-mail, signs in and sees no admin menu. A manager and the office roles see only what they may use.
 */
describe('journey: owner sets up a branch and invites a salesperson', () => {
  let stack: Stack;
  const code = `T${Date.now().toString(36).slice(-5).toUpperCase()}`;
  const invitee = { name: 'Wren Halloway', email: `wren.halloway.${Date.now()}@teasel-marl.test` };

  beforeAll(async () => {
    stack = await startStack('admin');
  });
  afterAll(() => stack?.close());

  async function choose(page: Page, label: string, option: string) {
    await page.getByLabel(label, { exact: true }).click();
    await page.getByRole('option', { name: option, exact: true }).click();
  }

  it('runs from the owner to the salesperson', async () => {
    const owner = demo('owner');
    const ctx = await stack.newContext(DESKTOP);
    const page = await ctx.newPage();

    await page.goto('/sign-in');
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    await stack.shot(page, 'sign-in');
    await signIn(page, owner.email, owner.password);
    await expect.poll(() => page.getByText(owner.name).first().isVisible()).toBe(true);
    await stack.shot(page, 'owner-home');

    // A new branch.
    await page.getByRole('link', { name: 'Branches' }).first().click();
    await page.getByRole('button', { name: 'New branch' }).click();
    await page.getByLabel('Code', { exact: true }).fill(code);
    await page.getByLabel('Name', { exact: true }).fill('Wickerby Flats');
    await page.getByLabel('Street address').fill('9 Loam Terrace');
    await page.getByLabel('City').fill('Wickerby');
    await choose(page, 'State', 'FL');
    await page.getByLabel('ZIP code').fill('32555');
    await page.getByLabel('Phone').fill('555-0177');
    await choose(page, 'Time zone', 'America/New_York');
    await page.getByLabel('Margin floor %').fill('36');
    await page.getByLabel('Salesperson discount limit %').fill('7');
    await page.getByLabel('Manager discount limit %').fill('15');
    await page.getByLabel('Sales tax rate %').fill('6');
    await stack.shot(page, 'branch-form');
    await page.getByRole('button', { name: 'Save branch' }).click();
    await expect.poll(() => page.getByRole('cell', { name: code, exact: true }).isVisible()).toBe(true);
    await stack.shot(page, 'branches');

    // Invite a salesperson into it.
    await page.getByRole('link', { name: 'People' }).first().click();
    await page.getByRole('button', { name: 'Invite person' }).click();
    await page.getByLabel('Name', { exact: true }).fill(invitee.name);
    await page.getByLabel('E-mail', { exact: true }).fill(invitee.email);
    await choose(page, 'Role', 'Salesperson');
    await page.getByLabel('Branches', { exact: true }).click();
    await page.getByRole('option', { name: new RegExp(code) }).click();
    await page.keyboard.press('Escape');
    await stack.shot(page, 'invite-dialog');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => page.getByRole('cell', { name: invitee.email }).isVisible()).toBe(true);
    await expect.poll(() => page.getByText('Invitation pending').first().isVisible()).toBe(true);
    await stack.shot(page, 'people');
    await ctx.close();

    // The salesperson follows the link in the e-mail, in a browser of their own.
    const mail = await stack.mail.lastTo(invitee.email);
    const link = mail.text.match(/https?:\/\/\S+\/set-password\?token=[\w%-]+/)?.[0];
    expect(link, mail.text).toBeTruthy();
    const phone = await stack.newContext(PHONE);
    const p2 = await phone.newPage();
    await p2.goto(link!);
    await expect.poll(() => p2.getByText(invitee.email).first().isVisible()).toBe(true);
    await p2.getByLabel('New password').fill('short');
    await p2.getByLabel('Repeat password').fill('short');
    await stack.shot(p2, 'set-password-too-short');
    await p2.getByLabel('New password').fill('wet clay heaves in spring');
    await p2.getByLabel('Repeat password').fill('wet clay heaves in spring');
    await p2.getByRole('button', { name: 'Set password and sign in' }).click();
    await p2.waitForURL((url) => !url.pathname.startsWith('/set-password'));
    await expect.poll(() => p2.getByText(invitee.name).first().isVisible()).toBe(true);
    await stack.shot(p2, 'salesperson-home-phone');
    expect(await p2.getByRole('link', { name: 'People' }).count()).toBe(0);
    expect(await p2.getByRole('link', { name: 'Branches' }).count()).toBe(0);
    // The admin page itself refuses them, with a clear message.
    await p2.goto('/admin/users');
    await expect
      .poll(() =>
        p2
          .getByText(/role doesn.t include this/i)
          .first()
          .isVisible(),
      )
      .toBe(true);
    await stack.shot(p2, 'salesperson-forbidden');

    // The link works once.
    await p2.goto(link!);
    await expect
      .poll(() =>
        p2
          .getByText(/already been used/)
          .first()
          .isVisible(),
      )
      .toBe(true);
    await stack.shot(p2, 'link-used');
    await phone.close();
  });

  it('a branch manager sees the people of their branch only and cannot create branches', async () => {
    const manager = demo('branch_manager', 'MRW');
    const ctx = await stack.newContext(DESKTOP);
    const page = await ctx.newPage();
    await signIn(page, manager.email, manager.password);
    await page.getByRole('link', { name: 'People' }).first().click();
    await expect
      .poll(() => page.getByRole('cell', { name: demo('salesperson', 'MRW').email }).isVisible())
      .toBe(true);
    expect(await page.getByRole('cell', { name: demo('salesperson', 'SBH').email }).count()).toBe(0);
    await stack.shot(page, 'manager-people');
    await page.getByRole('link', { name: 'Branches' }).first().click();
    await expect.poll(() => page.getByRole('cell', { name: 'MRW', exact: true }).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'New branch' }).count()).toBe(0);
    await stack.shot(page, 'manager-branches');
    await ctx.close();
  });

  it('wrong password shows the server’s message on the sign-in page', async () => {
    const ctx = await stack.newContext(PHONE);
    const page = await ctx.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(demo('bookkeeper').email);
    await page.getByLabel('Password', { exact: true }).fill('definitely not it');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByText(/do not match an active account/).isVisible()).toBe(true);
    await stack.shot(page, 'sign-in-failed-phone');
    await ctx.close();
  });
});
