/**
 * Every screen of the app at 390 px and 1440 px (tests/support/screens.ts walks them: landing,
 * sign-in and a refused sign-in, forgotten and new password, invitation, not found, the master's
 * brief, the survey list, each workspace section and an open space, plate and plate detail, the
 * tapped 3D model, the calculation report, the review queue, the desk with each of its tabs,
 * members, the development mailbox). On each: axe-core finds no serious or critical WCAG 2.1
 * A/AA violation, and nothing scrolls sideways. On the phone: the header is one row, every
 * workspace section tab is in the first screen, the loads keep their utilisation column in view,
 * selects show their whole option, and e-mail addresses and points wrap only between their parts.
 * Screenshots of every screen land in test-results/screenshots/screen-*.png, to be looked at.
 */
import { describe, expect, it, inject } from 'vitest';
import type { Page } from 'playwright-core';
import { seriousA11yViolations } from '../support/axe';
import { walkEveryScreen } from '../support/screens';
import { startE2eFile } from '../support/e2e';
import { issueSecret } from '../../server/services/secrets';
import { DEMO_SUBMITTED_SURVEY_ID } from '../../seeds/demo-survey';
import { DEMO_ORG, DEMO_USERS } from '../../seeds/demo-people';

const baseUrl = inject('baseUrl');
const PHONE = 390;
const DESK = 1440;
/** The height of a 390 px wide phone's screen in portrait (a common handset: 390 × 844 CSS px). */
const PHONE_SCREEN_HEIGHT = 844;

const e2e = startE2eFile({ db: true });

async function briefLink(): Promise<string> {
  const { token, hash } = issueSecret();
  await e2e.db('brief_links').insert({
    survey_id: DEMO_SUBMITTED_SURVEY_ID,
    organisation_id: DEMO_ORG.id,
    token_hash: hash,
    recipient_email: 'master-screens@lunga.example',
    units: 'si',
    revision: 1,
    expires_at: new Date(Date.now() + 86_400_000),
    created_by: DEMO_USERS.find((u) => u.role === 'engineer')!.id,
  });
  return `${baseUrl}/brief/${token}`;
}

/** Selects whose chosen option is wider than the box shows (text measured in the select's own font). */
const cutSelects = (page: Page) =>
  page.evaluate(() => {
    const ctx = document.createElement('canvas').getContext('2d')!;
    return [...document.querySelectorAll('select')].flatMap((s) => {
      const r = s.getBoundingClientRect();
      if (r.width === 0) return [];
      const cs = getComputedStyle(s);
      ctx.font = `${cs.fontWeight} ${cs.fontSize} ${cs.fontFamily}`;
      const text = s.selectedOptions[0]?.text ?? '';
      // a select that writes its whole chosen name under itself (SelectInput) is read in full there
      const shown = s.dataset.chosenShown ? document.getElementById(s.dataset.chosenShown) : null;
      if (shown && shown.getBoundingClientRect().height > 0 && shown.textContent?.includes(text)) return [];
      // room for the text: the box less its padding, borders and the drop-down arrow (about 20 px)
      const room = r.width - parseFloat(cs.paddingLeft) - parseFloat(cs.paddingRight) - parseFloat(cs.borderLeftWidth) - parseFloat(cs.borderRightWidth) - 20;
      return ctx.measureText(text).width > room ? [`"${text}" in ${Math.round(r.width)} px`] : [];
    });
  });

/** Parts of e-mail addresses and points broken across two lines. */
const brokenWords = (page: Page) =>
  page.evaluate(() => {
    const out: string[] = [];
    for (const el of document.querySelectorAll('[data-wrap-parts]')) {
      for (const node of [el, ...el.querySelectorAll('*')]) {
        for (const t of node.childNodes) {
          if (t.nodeType !== Node.TEXT_NODE || !t.textContent?.trim()) continue;
          const range = document.createRange();
          range.selectNodeContents(t);
          const tops = new Set([...range.getClientRects()].filter((r) => r.width > 0).map((r) => Math.round(r.top)));
          if (tops.size > 1) out.push(t.textContent);
        }
      }
    }
    return out;
  });

describe('every screen', () => {
  // one width per test, each with its own time: the walk takes minutes on a loaded machine
  it.each([PHONE, DESK])('has no serious or critical accessibility violation at %i px, and lays out for a phone', async (width) => {
    const problems: Record<string, string[]> = {};
    const note = (name: string, list: string[]) => {
      if (list.length === 0) return;
      problems[name] = [...(problems[name] ?? []), ...list];
      console.error(`${name}: ${list.join(' | ')}`); // shown even if the walk is cut short
    };
    const walked = await walkEveryScreen(e2e.browser, { baseUrl, mailDir: inject('testEnv').DEV_MAIL_DIR, briefUrl: await briefLink() }, [width], async (page, name) => {
      note(name, await seriousA11yViolations(page));
      const sideways = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      if (sideways > 0) note(name, [`scrolls sideways by ${sideways} px`]);
      if (!name.endsWith(`-${PHONE}`)) return;
      note(name, (await cutSelects(page)).map((s) => `select cut short: ${s}`));
      note(name, (await brokenWords(page)).map((w) => `broken mid-word: ${w}`));
      const header = page.locator('header.sticky').first(); // the app's header (the brief's own <header> is content)
      if (await header.count()) {
        const h = (await header.boundingBox())?.height ?? 0;
        if (h > 72) note(name, [`the header is ${h} px high: more than one row`]);
      }
      if (name.startsWith('workspace-')) {
        await page.evaluate(() => window.scrollTo(0, 0));
        const tabs = page.getByRole('navigation', { name: 'Workspace sections' }).getByRole('button');
        for (const tab of await tabs.all()) {
          const b = await tab.boundingBox();
          if (!b || b.y + b.height > PHONE_SCREEN_HEIGHT || b.x < 0 || b.x + b.width > PHONE) note(name, [`section tab "${await tab.textContent()}" is not in the first screen`]);
        }
      }
      if (name.startsWith('workspace-loads')) {
        const util = page.getByTestId('boundary-results').getByRole('columnheader', { name: /Utilisation/ });
        const b = await util.boundingBox();
        if (!b || b.x + b.width > PHONE) note(name, ['the utilisation column is off the screen']);
      }
    });
    for (const screen of ['landing', 'sign-in', 'sign-in-refused', 'forgot-password', 'reset-password', 'accept-invitation', 'brief', 'survey-list', 'workspace-ship', 'workspace-loads', 'workspace-3d', 'workspace-3d-label', 'workspace-plate-form', 'report', 'review-queue', 'desk-results', 'desk-3d-model', 'desk-history', 'members', 'dev-mail']) {
      expect(walked, `the walk reached ${screen} at ${width} px`).toContain(`${screen}-${width}`);
    }
    expect(problems).toEqual({});
  }, 900_000);
});
