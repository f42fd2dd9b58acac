/**
 * The review desk end to end, in Chromium: the surveyor sends the demo survey; the engineer finds
 * it in the queue, sees device and server agree, comments on a boundary, sets verdicts and a limit,
 * accepts it and sends the master a brief; the link arrives by mail, opens at 360 px (and prints on
 * at most two A4 pages), and dies when withdrawn; the surveyor's device shows the comment after sync.
 */
import { beforeAll, describe, expect, it, inject } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { screenshotPath } from '../support/browser';
import { readCaughtMail } from '../../scripts/lib/mail-catcher';
import { DEMO, signIn, startE2eFile } from '../support/e2e';

const baseUrl = inject('baseUrl');
const SURVEYOR = DEMO.surveyor;
const ENGINEER = DEMO.engineer;
const DEMO_SURVEY_ID = '5eed0000-0000-4000-8000-000000000001';
const VESSEL = 'MV Corran Tide';
const BOUNDARY = 'No. 2/3 hold bulkhead';
const COMMENT = 'Confirm the stiffener spacing on this bulkhead: 700 or 750 mm?';
const MASTER = 'master.corran-tide@ship.example';

const e2e = startE2eFile();
let surveyorCtx: BrowserContext;
let engineerCtx: BrowserContext;
let surveyor: Page;
let engineer: Page;

beforeAll(async () => {
  surveyorCtx = await e2e.browser.newContext({ viewport: { width: 360, height: 760 } });
  engineerCtx = await e2e.browser.newContext({ viewport: { width: 1280, height: 900 } });
  surveyor = await surveyorCtx.newPage();
  engineer = await engineerCtx.newPage();
});

const noSideScroll = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

describe('review desk and master’s brief', () => {
  let briefUrl = '';

  it('the surveyor sends the demo survey for review', async () => {
    await signIn(surveyor, SURVEYOR, `/surveys/${DEMO_SURVEY_ID}`);
    const status = surveyor.getByTestId('survey-review-status');
    await expect.poll(() => status.textContent(), { timeout: 60_000 }).toBe('Draft');
    await surveyor.getByRole('button', { name: 'Send for review' }).click();
    // the demo rests on assumed figures (default permeabilities and densities): sending lists them first
    await surveyor.getByRole('button', { name: 'Send for review with these assumptions' }).click();
    await expect.poll(() => status.textContent(), { timeout: 30_000 }).toBe('Sent for review');
  });

  it('the engineer finds it in the queue and sees device and server agree', async () => {
    await signIn(engineer, ENGINEER, '/review');
    const item = engineer.getByTestId('queue-item').filter({ hasText: VESSEL });
    await item.waitFor({ timeout: 30_000 });
    await expect(item.textContent()).resolves.toContain('Ines Achterberg');
    await expect(item.textContent()).resolves.toContain('Sent for review');
    await engineer.screenshot({ path: screenshotPath('review-queue-1280'), fullPage: true });
    await engineer.setViewportSize({ width: 360, height: 760 });
    expect(await noSideScroll(engineer)).toBeLessThanOrEqual(0);
    await engineer.screenshot({ path: screenshotPath('review-queue-360'), fullPage: true });
    await engineer.setViewportSize({ width: 1280, height: 900 });

    await item.click();
    await engineer.getByTestId('review-desk').waitFor();
    const check = engineer.getByTestId('numbers-check');
    await expect.poll(() => check.getAttribute('data-state'), { timeout: 30_000 }).toBe('agree');
    await expect(engineer.getByTestId('numbers-verdict').textContent()).resolves.toContain('agree on every number');
  });

  it('the engineer comments on a boundary, sets verdicts and a limit, and accepts', async () => {
    await engineer.getByLabel('On', { exact: true }).selectOption({ label: `Boundary: ${BOUNDARY}` });
    await engineer.getByLabel('Comment', { exact: true }).fill(COMMENT);
    await engineer.getByRole('button', { name: 'Add comment' }).click();
    await engineer.getByTestId('comment-list').getByText(COMMENT).waitFor();

    await engineer.getByRole('button', { name: 'Start review' }).click();
    await engineer.getByTestId('review-desk').locator('[data-status="in_review"]').first().waitFor();

    const row = engineer.getByTestId('boundary-verdict').filter({ hasText: BOUNDARY });
    await row.getByLabel(`Note on ${BOUNDARY}`).fill('Shores at frames 62 and 64 first.');
    await row.getByRole('combobox').selectOption('sound_if_shored');
    await expect.poll(() => row.getByRole('combobox').inputValue()).toBe('sound_if_shored');
    await expect.poll(() => row.getAttribute('class')).toContain('border-caution');

    await engineer.getByLabel('On the survey as a whole').selectOption('proceed_within_limits');
    await engineer.getByRole('button', { name: 'Save survey verdict' }).click();
    await engineer.getByTestId('survey-verdict-saved').waitFor();

    await engineer.getByLabel('New limit').selectOption('no_pumping_until_shored');
    await engineer.getByLabel('Compartment', { exact: true }).selectOption({ label: 'No. 2 hold' });
    await engineer.getByLabel('Boundary', { exact: true }).selectOption({ label: BOUNDARY });
    await engineer.getByLabel('More words (optional)').fill('Keep both salvage pumps on standby.');
    await engineer.getByRole('button', { name: 'Add limit' }).click();
    const limit = `Do not pump out No. 2 hold until ${BOUNDARY} is shored.`;
    await engineer.getByTestId('limit-list').getByText(limit, { exact: false }).waitFor();

    await engineer.screenshot({ path: screenshotPath('review-desk-1280'), fullPage: true });
    await engineer.getByRole('button', { name: 'Accept', exact: true }).click();
    // three of the demo's boundaries are over capacity: accepting asks first, naming them
    const ask = engineer.getByTestId('accept-over-capacity');
    await ask.waitFor();
    await expect(ask.textContent()).resolves.toContain('No. 2/3 hold bulkhead');
    await engineer.getByRole('button', { name: 'Accept with them over capacity' }).click();
    await engineer.getByTestId('review-desk').locator('[data-status="accepted"]').first().waitFor();
  });

  it('the engineer sends a brief; the mail arrives; the link opens at 360 px with verdicts and limits', async () => {
    const started = Date.now();
    await engineer.getByLabel('Master’s e-mail').fill(MASTER);
    await engineer.getByLabel('US (ft, psi, kip, LT)').check();
    await engineer.getByRole('button', { name: 'Send brief link' }).click();
    const shown = await engineer.getByTestId('brief-url').textContent({ timeout: 20_000 });
    expect(shown).toMatch(/\/brief\/[A-Za-z0-9_-]{43}$/);

    const dir = inject('testEnv').DEV_MAIL_DIR;
    await expect
      .poll(() => readCaughtMail(dir).find((m) => m.to.includes(MASTER) && Date.parse(m.receivedAt) >= started - 1000), { timeout: 20_000 })
      .toBeTruthy();
    const mail = readCaughtMail(dir).find((m) => m.to.includes(MASTER))!;
    briefUrl = /(https?:\/\/\S+\/brief\/[A-Za-z0-9_-]{43})/.exec(mail.text)![1]!;
    expect(briefUrl).toBe(shown);

    const master = await e2e.browser.newContext({ viewport: { width: 360, height: 740 } });
    const page = await master.newPage();
    const res = await page.goto(briefUrl);
    expect(res?.status()).toBe(200);
    expect(res?.headers()['cache-control']).toBe('no-store');
    const text = await page.locator('body').innerText();
    expect(text).toContain(VESSEL);
    expect(text).toContain('Sound once shored');
    expect(text).toContain('Shores at frames 62 and 64 first.');
    expect(text).toContain(`Do not pump out No. 2 hold until ${BOUNDARY} is shored. Keep both salvage pumps on standby.`);
    expect(text).toContain('proceed only within the limits below');
    expect(text).toContain('Never enter a flooded or closed space');
    expect(text).toContain('Tomas Varga');
    expect(text).toMatch(/kip|psi/);
    expect(await noSideScroll(page)).toBeLessThanOrEqual(0);
    expect(await page.evaluate(() => document.scripts.length)).toBe(0);
    await page.screenshot({ path: screenshotPath('review-brief-360'), fullPage: true });
    await page.setViewportSize({ width: 1280, height: 900 });
    await page.screenshot({ path: screenshotPath('review-brief-1280'), fullPage: true });
    const pdf = await page.pdf({ format: 'A4', printBackground: true });
    const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
    expect(pages).toBeGreaterThan(0);
    // the ship's response, the forecast's nearest limit and downflooding times, and each boundary's
    // structural checks now share the brief: at most four A4 pages
    expect(pages).toBeLessThanOrEqual(4);
    await master.close();
  });

  it('withdrawing the link turns it into a 404', async () => {
    await engineer.reload();
    await engineer.getByRole('button', { name: 'Withdraw link' }).click();
    await engineer.getByTestId('brief-list').locator('[data-state="withdrawn"]').waitFor();
    const res = await fetch(briefUrl);
    expect(res.status).toBe(404);
    expect(await res.text()).not.toContain(VESSEL);
  });

  it('the surveyor’s device shows the comment after sync', async () => {
    await surveyor.reload();
    const status = surveyor.getByTestId('survey-review-status');
    await expect.poll(() => status.textContent(), { timeout: 60_000 }).toBe('Accepted');
    await surveyor.getByText(/Reviewer’s notes \(/).click();
    const notes = surveyor.getByTestId('review-notes');
    await notes.getByText(COMMENT).waitFor({ timeout: 30_000 });
    await expect(notes.textContent()).resolves.toContain(BOUNDARY);
    await expect(notes.textContent()).resolves.toContain('Sound once shored');
    expect(await noSideScroll(surveyor)).toBeLessThanOrEqual(0);
    await surveyor.screenshot({ path: screenshotPath('review-notes-surveyor-360'), fullPage: true });
    // The survey list names the engineer who reviewed it.
    await surveyor.goto(`${baseUrl}/surveys`);
    const row = surveyor.getByRole('row').filter({ hasText: 'MV Corran Tide' });
    await expect.poll(() => row.first().textContent(), { timeout: 30_000 }).toContain('Tomas Varga');
  });

  it('the review desk reads on a phone', async () => {
    await engineer.setViewportSize({ width: 360, height: 760 });
    await engineer.goto(`${baseUrl}/review/${DEMO_SURVEY_ID}`);
    await engineer.getByTestId('review-desk').waitFor();
    await expect.poll(() => engineer.getByTestId('numbers-check').getAttribute('data-state'), { timeout: 30_000 }).toBe('agree');
    expect(await noSideScroll(engineer)).toBeLessThanOrEqual(0);
    await engineer.screenshot({ path: screenshotPath('review-desk-360'), fullPage: true });
  });
});
