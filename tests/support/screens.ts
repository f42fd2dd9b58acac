/**
 * Every screen of the app, opened as its user reaches it, at one width after another: the walk the
 * accessibility test (tests/e2e/screens.test.ts) runs axe on, and which saves a screenshot of each
 * screen to look at. One browser; one context per person, signed in once, resized between widths.
 */
import { randomUUID } from 'node:crypto';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { readCaughtMail } from '../../scripts/lib/mail-catcher';
import { demoSurvey, DEMO_SUBMITTED_SURVEY_ID } from '../../seeds/demo-survey';
import { screenshotPath } from './browser';
import { DEMO, signIn } from './e2e';

export interface Person {
  email: string;
  password: string;
}

/** What the walk needs from its caller: where the app is, where caught mail lands, a brief link. */
export interface WalkSetup {
  baseUrl: string;
  mailDir: string;
  /** A master's brief link (`/brief/<token>`), made as the desk makes one. */
  briefUrl: string;
}

/** Called on every screen once it has settled, with a name like `desk-results-390`. */
export type OnScreen = (page: Page, name: string) => Promise<void>;

async function waitForMail(dir: string, to: string, subject: string): Promise<string> {
  const deadline = Date.now() + 15_000;
  for (;;) {
    const mail = readCaughtMail(dir).find((m) => m.to.some((t) => t.toLowerCase() === to.toLowerCase()) && m.subject.includes(subject));
    const link = mail && /(https?:\/\/\S+?#[A-Za-z0-9_-]{43})/.exec(mail.text)?.[1];
    if (link) return link;
    if (Date.now() > deadline) throw new Error(`no "${subject}" e-mail to ${to} arrived`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

/**
 * Taps the drawn model at points of a grid, from the middle out, until a label names what was
 * tapped; returns the label's text. Throws when no tap lands on anything.
 */
export async function tapModelUntilLabelled(page: Page): Promise<string> {
  const canvas = page.getByTestId('model-canvas').locator('canvas');
  const box = await canvas.boundingBox();
  if (!box) throw new Error('no 3D canvas on the page');
  const spots = [0.5, 0.4, 0.6, 0.3, 0.7].flatMap((fy) => [0.5, 0.4, 0.6, 0.3, 0.7, 0.2, 0.8].map((fx) => [fx, fy] as const));
  for (const [fx, fy] of spots) {
    await canvas.click({ position: { x: box.width * fx, y: box.height * fy } });
    const label = page.getByTestId('model-label');
    if (await label.waitFor({ timeout: 1_000 }).then(() => true, () => false)) return (await label.textContent()) ?? '';
  }
  throw new Error('no tap on the model named a space or a plate');
}

/** Screens of one person: each a name and how to open it (on a page already at the right width). */
type Opener = (page: Page) => Promise<void>;

/** Clicks through every tab of a strip, naming each screen by the tab's text. */
async function eachTab(page: Page, strip: string, prefix: string, width: number, onScreen: OnScreen, settle: (page: Page) => Promise<void>): Promise<string[]> {
  const tabs = page.getByRole('navigation', { name: strip }).getByRole('button').or(page.getByRole('tablist', { name: strip }).getByRole('tab'));
  const labels = (await tabs.allTextContents()).map((t) => t.trim());
  for (const label of labels) {
    await tabs.filter({ hasText: label }).first().click();
    await settle(page);
    await onScreen(page, `${prefix}-${label.toLowerCase().replace(/[^a-z0-9]+/g, '-')}-${width}`);
  }
  return labels;
}

/**
 * Opens every screen at each width and calls `onScreen` on it. Returns the names walked, so a
 * test can check the walk reached what it meant to.
 */
export async function walkEveryScreen(browser: Browser, setup: WalkSetup, widths: readonly number[], onScreen: OnScreen): Promise<string[]> {
  const { baseUrl } = setup;
  const walked: string[] = [];
  const visit: OnScreen = async (page, name) => {
    walked.push(name);
    await page.screenshot({ path: screenshotPath(`screen-${name}`), fullPage: true });
    await onScreen(page, name);
  };
  const contexts: BrowserContext[] = [];
  const open = async (who?: Person, next?: string) => {
    const context = await browser.newContext({ viewport: { width: widths[0], height: 900 } });
    contexts.push(context);
    const page = await context.newPage();
    if (who) await signIn(page, who, next, baseUrl);
    return page;
  };
  try {
    const [anon, surveyor, engineer, admin] = [await open(), await open(DEMO.surveyor), await open(DEMO.engineer), await open(DEMO.admin)];

    // links that arrive by e-mail, asked for once through the screens that send them
    const invitee = `deckhand-${randomUUID().slice(0, 8)}@skerrow.example`;
    await admin.goto(`${baseUrl}/members`);
    await admin.getByRole('form', { name: 'Invite a member' }).getByLabel('E-mail').fill(invitee);
    await admin.getByRole('button', { name: 'Send invitation', exact: true }).click();
    const invitationUrl = await waitForMail(setup.mailDir, invitee, '');
    await anon.goto(`${baseUrl}/forgot-password`);
    await anon.getByLabel('E-mail').fill(DEMO.surveyor.email);
    await anon.getByRole('button', { name: 'Send me a link' }).click();
    await anon.getByRole('status').or(anon.getByRole('alert')).first().waitFor();
    const resetUrl = await waitForMail(setup.mailDir, DEMO.surveyor.email, 'password');

    const surveyId = demoSurvey().id;
    const heading = (page: Page) => page.getByRole('heading', { level: 1 }).first().waitFor({ timeout: 30_000 });
    const anonScreens: [string, Opener][] = [
      ['landing', async (p) => (await p.goto(`${baseUrl}/`), heading(p))],
      ['sign-in', async (p) => (await p.goto(`${baseUrl}/sign-in`), heading(p))],
      ['forgot-password', async (p) => (await p.goto(`${baseUrl}/forgot-password`), heading(p))],
      ['reset-password', async (p) => (await p.goto(resetUrl), p.getByLabel('New password', { exact: false }).first().waitFor())],
      ['accept-invitation', async (p) => (await p.goto(invitationUrl), p.getByText('Join ').first().waitFor())],
      ['not-found', async (p) => (await p.goto(`${baseUrl}/no-such-page`), heading(p))],
      ['brief', async (p) => (await p.goto(setup.briefUrl), heading(p))],
    ];
    // the 3D view loads its own chunk and draws: wait for the drawn scene or the plain message
    const settleModel = async (p: Page) => {
      if ((await p.getByText('Loading the 3D model…').count()) === 0 && (await p.getByTestId('model-canvas').count()) === 0) return;
      await p.locator('[data-testid="model-canvas"][data-drawn="true"]').or(p.getByTestId('model-fallback')).first().waitFor({ timeout: 60_000 });
      await p.waitForTimeout(300);
    };
    const settleWorkspace = async (p: Page) => {
      await p.getByTestId('workspace').waitFor({ timeout: 30_000 });
      await settleModel(p);
      // the flooding forecast arrives from its worker after the section opens: settled once it is shown
      await p.getByText('Working out the forecast…').waitFor({ state: 'detached', timeout: 60_000 });
      await p.waitForTimeout(300);
    };
    const settleDesk = async (p: Page) => {
      await p.getByTestId('review-desk').waitFor({ timeout: 30_000 });
      await p.waitForTimeout(300);
      await settleModel(p);
    };

    for (const width of widths) {
      for (const page of [anon, surveyor, engineer, admin]) await page.setViewportSize({ width, height: 900 });
      for (const [name, go] of anonScreens) {
        await go(anon);
        await visit(anon, `${name}-${width}`);
      }
      // a refused sign-in, its message tied to the field (an address nobody has, so no account is slowed)
      await anon.goto(`${baseUrl}/sign-in`);
      await anon.getByLabel('E-mail').fill('nobody@skerrow.example');
      await anon.getByLabel('Password').fill('not-the-password-1');
      await anon.getByRole('button', { name: 'Sign in' }).click();
      await anon.getByRole('alert').first().waitFor();
      await visit(anon, `sign-in-refused-${width}`);

      await surveyor.goto(`${baseUrl}/surveys`);
      await surveyor.getByRole('link', { name: new RegExp(demoSurvey().vessel.name) }).first().waitFor({ timeout: 30_000 });
      await visit(surveyor, `survey-list-${width}`);
      await surveyor.goto(`${baseUrl}/surveys/${surveyId}`);
      await settleWorkspace(surveyor);
      const sections = await eachTab(surveyor, 'Workspace sections', 'workspace', width, visit, settleWorkspace);
      if (sections.length < 8) throw new Error(`the workspace shows only ${sections.join(', ')}`);
      // an item open in each list: a space's form, a plate's form, a plate's loads in detail
      const demo = demoSurvey();
      for (const [name, query] of [
        ['workspace-space-form', `s=spaces&item=${demo.compartments[0].id}`],
        ['workspace-plate-form', `s=plates&item=${demo.boundaries[0].id}`],
        ['workspace-loads-detail', `s=loads&item=${demo.boundaries[0].id}`],
      ] as const) {
        await surveyor.goto(`${baseUrl}/surveys/${surveyId}?${query}`);
        await settleWorkspace(surveyor);
        await visit(surveyor, `${name}-${width}`);
      }
      // the model with a tapped space or plate named beside it
      await surveyor.goto(`${baseUrl}/surveys/${surveyId}?s=model`);
      await settleWorkspace(surveyor);
      await tapModelUntilLabelled(surveyor);
      await visit(surveyor, `workspace-3d-label-${width}`);
      // the calculation report, opened as the surveyor opens it (a new tab)
      await surveyor.goto(`${baseUrl}/surveys/${surveyId}`);
      await settleWorkspace(surveyor);
      const [report] = await Promise.all([surveyor.context().waitForEvent('page'), surveyor.getByTestId('report-button').first().click()]);
      await report.setViewportSize({ width, height: 900 });
      await report.waitForURL(/^blob:/, { timeout: 30_000 });
      await report.getByRole('heading', { level: 1 }).first().waitFor();
      await visit(report, `report-${width}`);
      await report.close();

      await engineer.goto(`${baseUrl}/review`);
      await heading(engineer);
      await engineer.getByRole('link').filter({ hasText: /./ }).first().waitFor();
      await visit(engineer, `review-queue-${width}`);
      await engineer.goto(`${baseUrl}/review/${DEMO_SUBMITTED_SURVEY_ID}`);
      await settleDesk(engineer);
      await engineer.getByTestId('boundary-row').first().click();
      await engineer.getByTestId('boundary-detail').waitFor();
      await eachTab(engineer, 'Survey views', 'desk', width, visit, settleDesk);

      await admin.goto(`${baseUrl}/members`);
      await admin.getByText(invitee).first().waitFor({ state: 'attached', timeout: 30_000 });
      await visit(admin, `members-${width}`);
      await admin.goto(`${baseUrl}/dev/mail`);
      await heading(admin);
      await admin.getByText(invitee).first().waitFor({ state: 'attached', timeout: 30_000 });
      await visit(admin, `dev-mail-${width}`);
    }
  } finally {
    for (const c of contexts) await c.close();
  }
  return walked;
}
