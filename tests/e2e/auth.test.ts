import { beforeAll, describe, expect, it, inject } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshotPath } from '../support/browser';
import { createOrgWithMembers, uniqueEmail, TEST_PASSWORD, type TestOrg } from '../support/auth';
import { linkIn, waitForMail } from '../support/mail';
import { DEMO_USERS } from '../../seeds/demo-people';
import { startE2eFile } from '../support/e2e';

let org: TestOrg;
const baseUrl = inject('baseUrl');

const file = startE2eFile({ db: true });
beforeAll(async () => {
  org = await createOrgWithMembers(file.db);
});

async function signInThroughForm(page: Page, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Checks the header shows this person; on a phone the account menu is opened, read and closed. */
async function expectCurrentUser(page: Page, ...texts: string[]) {
  const toggle = page.locator('[aria-controls="account-panel"]');
  await page.locator('[aria-controls="account-panel"]:visible, [data-testid="current-user"]:visible').first().waitFor();
  const narrow = await toggle.isVisible();
  if (narrow) await toggle.click();
  const who = page.getByTestId('current-user').filter({ visible: true });
  for (const text of texts) await who.getByText(text).waitFor();
  if (narrow) await toggle.click();
}

const noSideScroll = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

describe('sign-in', () => {
  for (const width of [360, 1280]) {
    it(`signs in a demo person at ${width} px and shows them in the header`, async () => {
      const ctx = await file.browser.newContext({ viewport: { width, height: 800 } });
      const page = await ctx.newPage();
      await page.goto(`${baseUrl}/sign-in`);
      await page.getByRole('heading', { name: 'Sign in' }).waitFor();
      // Wrong password: a plain message, the typed address kept.
      const surveyor = DEMO_USERS.find((u) => u.role === 'surveyor')!;
      await page.getByLabel('E-mail').fill(surveyor.email);
      await page.getByLabel('Password', { exact: true }).fill('not-the-password');
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('alert').getByText('not right').waitFor();
      expect(await page.getByLabel('E-mail').inputValue()).toBe(surveyor.email);
      // …tied to the password field, which takes the focus to retype it.
      const password = page.getByLabel('Password', { exact: true });
      await expect(password.getAttribute('aria-invalid')).resolves.toBe('true');
      const describedBy = (await password.getAttribute('aria-describedby'))!;
      await expect(page.locator(`[id="${describedBy.split(' ').pop()}"]`).textContent()).resolves.toContain('not right');
      await expect(password.evaluate((el) => el === document.activeElement)).resolves.toBe(true);
      await page.screenshot({ path: screenshotPath(`auth-sign-in-${width}`), fullPage: true });
      expect(await noSideScroll(page)).toBeLessThanOrEqual(0);

      await page.getByLabel('Password', { exact: true }).fill(surveyor.password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(`${baseUrl}/surveys`);
      await expectCurrentUser(page, surveyor.name, 'Skerrow Marine Salvage · Surveyor');
      expect(await page.evaluate(() => JSON.stringify(localStorage))).not.toMatch(/eyJ|accessToken|refresh/);
      // A surveyor is not let into the members screen.
      await page.goto(`${baseUrl}/members`);
      await page.getByRole('heading', { name: 'Not for your role' }).waitFor();
      await ctx.close();
    });
  }

  it('keeps the person signed in across a reload (refresh on load) and signs out on request', async () => {
    const ctx = await file.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await ctx.newPage();
    await signInThroughForm(page, org.engineer.email, TEST_PASSWORD);
    await page.waitForURL(`${baseUrl}/surveys`);
    await page.reload();
    await expectCurrentUser(page, org.engineer.name);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('dialog').getByText('Your surveys stay on this device').waitFor();
    await page.getByRole('dialog').getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(`${baseUrl}/sign-in`);
    await page.goto(`${baseUrl}/members`);
    await page.waitForURL(/\/sign-in\?next=%2Fmembers/);
    await ctx.close();
  });

  it('stays signed in when the answer to a refresh is lost after the server rotated the token', async () => {
    const ctx = await file.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await ctx.newPage();
    await signInThroughForm(page, org.engineer.email, TEST_PASSWORD);
    await page.waitForURL(`${baseUrl}/surveys`);
    // The device's refresh reaches the server, which rotates the token, but the answer (with the new
    // cookie) never reaches the device: sent here from outside the browser, which keeps its cookie.
    // (the cookie store can lag the navigation on a busy host: wait for it)
    await expect.poll(async () => (await ctx.cookies()).some((c) => c.name === 'brineline_refresh'), { timeout: 15_000 }).toBe(true);
    const held = (await ctx.cookies()).find((c) => c.name === 'brineline_refresh');
    expect(held).toBeTruthy();
    const rotated = await fetch(`${baseUrl}/api/auth/refresh`, { method: 'POST', headers: { cookie: `${held!.name}=${held!.value}` } });
    expect(rotated.status).toBe(200);
    // On the next load the device presents the token it still holds, and is let in.
    const answer = page.waitForResponse((r) => r.url().endsWith('/api/auth/refresh'));
    await page.reload();
    expect((await answer).status()).toBe(200);
    await expectCurrentUser(page, org.engineer.name);
    await page.waitForTimeout(1000);
    expect(await page.getByTestId('session-expired').count()).toBe(0);
    await ctx.close();
  });

  it('works offline under the remembered identity, and asks to sign in again when the sign-in has ended', async () => {
    const ctx = await file.browser.newContext({ viewport: { width: 360, height: 800 } });
    const page = await ctx.newPage();
    await signInThroughForm(page, org.surveyor.email, TEST_PASSWORD);
    await page.waitForURL(`${baseUrl}/surveys`);

    // No network for the API: still the same person, no prompt.
    await page.route('**/api/**', (route) => route.abort('internetdisconnected'));
    await page.reload();
    await expectCurrentUser(page, org.surveyor.name);
    expect(await page.getByTestId('session-expired').count()).toBe(0);

    // The network is back but the sign-in ended (refresh revoked): a prompt, and the work stays.
    await page.unroute('**/api/**');
    await file.db('refresh_tokens').where({ user_id: org.surveyor.id }).update({ revoked_at: new Date() });
    await page.reload();
    await page.getByTestId('session-expired').waitFor();
    await expectCurrentUser(page, org.surveyor.name);
    await page.screenshot({ path: screenshotPath('auth-expired-360'), fullPage: true });
    await page.getByRole('button', { name: 'Sign in again' }).click();
    const dialog = page.getByRole('dialog');
    expect(await dialog.getByLabel('E-mail').inputValue()).toBe(org.surveyor.email);
    await dialog.getByLabel('Password', { exact: true }).fill(TEST_PASSWORD);
    await dialog.getByRole('button', { name: 'Sign in' }).click();
    await page.getByTestId('session-expired').waitFor({ state: 'detached' });
    expect(page.url()).toBe(`${baseUrl}/surveys`);
    await ctx.close();
  });
});

describe('members and invitations', () => {
  it('an admin invites by e-mail; the invitation arrives and is accepted in the browser', async () => {
    const adminCtx = await file.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await adminCtx.newPage();
    await signInThroughForm(page, org.admin.email, TEST_PASSWORD);
    await page.waitForURL(`${baseUrl}/surveys`);
    await page.getByRole('link', { name: 'Members' }).click();
    await page.getByRole('heading', { name: 'Members' }).waitFor();
    await page.getByRole('table', { name: 'Members' }).getByText(org.engineer.email).waitFor();

    const email = uniqueEmail('e2e-invite');
    const form = page.getByRole('form', { name: 'Invite a member' });
    await form.getByLabel('E-mail').fill('not an address');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await form.getByText('Enter an e-mail address like').waitFor();
    await form.getByLabel('E-mail').fill(email);
    await form.getByLabel('Role').selectOption('engineer');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await form.getByText(`Invitation sent to ${email}`).waitFor();
    await page.getByRole('table', { name: 'Members' }).getByText(email).waitFor();
    await page.screenshot({ path: screenshotPath('auth-members-1280'), fullPage: true });

    const mail = await waitForMail(email, { subject: 'Join' });
    const { url } = linkIn(mail);

    // The development mailbox shows the same message to the admin.
    await page.goto(`${baseUrl}/dev/mail`);
    await page.getByRole('button', { name: new RegExp(`Join ${org.name}`) }).first().click();
    await page.getByTestId('mail-text').getByText('/accept-invitation#').waitFor();

    await page.setViewportSize({ width: 360, height: 800 });
    await page.goto(`${baseUrl}/members`);
    await page.getByRole('list', { name: 'Members' }).getByText(email).waitFor();
    expect(await noSideScroll(page)).toBeLessThanOrEqual(0);
    await page.screenshot({ path: screenshotPath('auth-members-360'), fullPage: true });

    const guestCtx = await file.browser.newContext({ viewport: { width: 360, height: 800 } });
    const guest = await guestCtx.newPage();
    await guest.goto(url);
    await guest.getByRole('heading', { name: `Join ${org.name}` }).waitFor();
    await guest.getByText(email).waitFor();
    await guest.getByLabel('Your name').fill('Nadia Okafor');
    await guest.getByLabel('Choose a password').fill('short');
    await guest.getByLabel('The password again').fill('different');
    await guest.getByRole('button', { name: 'Join and sign in' }).click();
    await guest.getByText('Use at least 10 characters.').waitFor();
    await guest.getByText('The two passwords are not the same.').waitFor();
    expect(await guest.getByLabel('Your name').inputValue()).toBe('Nadia Okafor');
    await guest.getByLabel('Choose a password').fill('a-good-long-password');
    await guest.getByLabel('The password again').fill('a-good-long-password');
    await guest.getByRole('button', { name: 'Join and sign in' }).click();
    await guest.waitForURL(`${baseUrl}/surveys`);
    await expectCurrentUser(guest, 'Nadia Okafor');
    await expectCurrentUser(guest, `${org.name} · Engineer`);

    // The link was single-use.
    const again = await guestCtx.newPage();
    await again.goto(url);
    await again.getByTestId('invitation-problem').getByText('not valid any more').waitFor();
    await guestCtx.close();
    await adminCtx.close();
  });
});

describe('password reset', () => {
  it('asks for a link, follows it, sets a new password and signs in with it', async () => {
    const ctx = await file.browser.newContext({ viewport: { width: 360, height: 800 } });
    const page = await ctx.newPage();
    await page.goto(`${baseUrl}/sign-in`);
    await page.getByRole('link', { name: 'Forgotten your password?' }).click();
    await page.getByRole('heading', { name: 'Forgotten password' }).waitFor();
    const since = Date.now();
    await page.getByLabel('E-mail').fill(org.engineer.email);
    await page.getByRole('button', { name: 'Send me a link' }).click();
    await page.getByText('a link to choose a new password is on its way').waitFor();
    await page.screenshot({ path: screenshotPath('auth-forgot-360'), fullPage: true });

    const { url } = linkIn(await waitForMail(org.engineer.email, { subject: 'password', after: since }));
    await page.goto(url);
    await page.getByRole('heading', { name: 'Choose a new password' }).waitFor();
    await page.getByLabel('New password', { exact: true }).fill('x'.repeat(73));
    await page.getByLabel('New password again').fill('x'.repeat(73));
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByText('at most 72 bytes').waitFor();
    await page.getByLabel('New password', { exact: true }).fill('the-engineer-new-password');
    await page.getByLabel('New password again').fill('the-engineer-new-password');
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.waitForURL(/\/sign-in\?reset=done/);
    await page.getByText('Your new password is saved').waitFor();

    await page.getByLabel('E-mail').fill(org.engineer.email);
    await page.getByLabel('Password', { exact: true }).fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('alert').getByText('not right').waitFor();
    await page.getByLabel('Password', { exact: true }).fill('the-engineer-new-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${baseUrl}/surveys`);

    // The same link does not work twice.
    await page.goto(url);
    await page.getByLabel('New password', { exact: true }).fill('yet-another-password');
    await page.getByLabel('New password again').fill('yet-another-password');
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByRole('alert').getByText('already been used').waitFor();
    await ctx.close();
  });
});
