/**
 * Nothing typed is lost (#13 item 7): a value typed and, within 50 ms, left for another section, a
 * closed page or a dropped link is kept on the device and reaches the server; a verdict note typed
 * right after choosing the verdict survives the verdict's save coming back. On a 390 px phone for the
 * surveyor, at 1280 px for the engineer.
 */
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest';
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { screenshotPath } from '../support/browser';
import { createOrgWithMembers, type TestOrg } from '../support/auth';
import { storeSurvey } from '../support/surveys';
import { surveyInStatus } from '../support/review';
import { localDoc, signIn, startE2eFile } from '../support/e2e';
import type { Survey } from '@shared/schemas/survey';

const baseUrl = inject('baseUrl');

let org: TestOrg;

const file = startE2eFile({ db: true });
beforeAll(async () => {
  org = await createOrgWithMembers(file.db);
});

/**
 * Types `value` into `field` as a person does (Playwright's fill: focus, input events), the last
 * character in the page itself, followed by a tap on `away` in the same moment (and on each of
 * `then` one turn of the event loop later: a section left and reopened before its save can land);
 * returns the milliseconds between that last input event and the tap, as the page saw them.
 */
async function typeThenTap(field: Locator, value: string, away: Locator, ...then: Locator[]): Promise<number> {
  await field.fill(value.slice(0, -1));
  for (const [i, target] of [away, ...then].entries()) await target.evaluate((b, n) => b.setAttribute(`data-tap-${n}`, ''), i);
  return field.evaluate(
    async (el, [v, taps]) => {
      const buttons = Array.from({ length: taps }, (_, n) => {
        const b = document.querySelector<HTMLElement>(`[data-tap-${n}]`);
        b?.removeAttribute(`data-tap-${n}`);
        return b;
      });
      let tappedAt = NaN;
      buttons[0]?.addEventListener('click', () => (tappedAt = performance.now()), { once: true, capture: true });
      const proto = el instanceof HTMLTextAreaElement ? HTMLTextAreaElement.prototype : HTMLInputElement.prototype;
      Object.getOwnPropertyDescriptor(proto, 'value')?.set?.call(el, v);
      el.dispatchEvent(new Event('input', { bubbles: true }));
      const typedAt = performance.now();
      buttons[0]?.click();
      for (const b of buttons.slice(1)) {
        // one turn of the event loop: React has drawn the first tap (its updates wait for a
        // microtask), while the save it started is still on its way to IndexedDB
        await new Promise((r) => setTimeout(r, 0));
        b?.click();
      }
      return tappedAt - typedAt;
    },
    [value, 1 + then.length] as const,
  );
}

const section = (page: Page, name: string) => page.getByRole('navigation', { name: 'Workspace sections' }).getByRole('button', { name, exact: true });

async function docOnDevice(page: Page, id: string): Promise<Survey> {
  return localDoc(page, id);
}

const serverDoc = async (id: string): Promise<Survey> => (await file.db('surveys').where({ id }).first()).doc as Survey;

function soundingOf(doc: Survey, compartmentName: string): number | undefined {
  const comp = doc.compartments.find((c) => c.name === compartmentName);
  const cond = doc.conditions.find((c) => c.id === doc.activeConditionId);
  const level = cond?.contents.find((k) => k.compartmentId === comp?.id)?.layers[0]?.level;
  return level && 'soundingM' in level ? level.soundingM : undefined;
}

describe('nothing typed is lost', () => {
  let ctx: BrowserContext;
  let page: Page;
  let survey: Survey;

  beforeAll(async () => {
    survey = await storeSurvey(file.db, org.surveyor);
    ctx = await file.browser.newContext({ viewport: { width: 390, height: 844 } });
    page = await ctx.newPage();
    await signIn(page, org.surveyor, `/surveys/${survey.id}`);
    await page.getByTestId('workspace').waitFor({ timeout: 60_000 });
  });
  afterAll(async () => {
    await ctx?.close();
  });

  it('keeps a title, a vessel name and a sounding typed just before tapping another section', async () => {
    await section(page, 'Ship').click();
    const gaps: number[] = [];
    // Ship left and reopened at once: the new form is filled from the copy the title's save has not
    // reached yet, and saving the vessel name typed there must not put the old title back
    gaps.push(await typeThenTap(page.getByLabel('Survey title'), 'Kept title one', section(page, 'Readings'), section(page, 'Ship')));
    gaps.push(await typeThenTap(page.getByLabel('Vessel name'), 'MV Kept Name', section(page, 'Spaces')));

    await section(page, 'Contents').click();
    await page.getByRole('button', { name: 'No. 2 hold', exact: true }).click();
    gaps.push(await typeThenTap(page.getByLabel(/^Sounding \(/).first(), '4.15', section(page, 'Boundaries')));
    for (const gap of gaps) expect(gap).toBeLessThan(50);

    await expect.poll(async () => (await docOnDevice(page, survey.id)).title, { timeout: 10_000 }).toBe('Kept title one');
    const doc = await docOnDevice(page, survey.id);
    expect(doc.vessel.name).toBe('MV Kept Name');
    expect(soundingOf(doc, 'No. 2 hold')).toBe(4.15);
    // and the server gets them (the push of each edit)
    await expect.poll(async () => soundingOf(await serverDoc(survey.id), 'No. 2 hold'), { timeout: 30_000 }).toBe(4.15);
    const onServer = await serverDoc(survey.id);
    expect([onServer.title, onServer.vessel.name]).toEqual(['Kept title one', 'MV Kept Name']);
  });

  it('keeps a value typed just before the link drops', async () => {
    await section(page, 'Ship').click();
    const field = page.getByLabel('Survey title');
    await field.fill('Typed then offline');
    await ctx.setOffline(true);
    await expect.poll(async () => (await docOnDevice(page, survey.id)).title, { timeout: 10_000 }).toBe('Typed then offline');
    await page.screenshot({ path: screenshotPath('typed-kept-offline-390') });
    await ctx.setOffline(false);
    await expect.poll(async () => (await serverDoc(survey.id)).title, { timeout: 30_000 }).toBe('Typed then offline');
  });

  it('keeps a value typed just before the page is closed', async () => {
    await section(page, 'Ship').click();
    await page.getByLabel('Vessel name').fill('MV Closed Page');
    await page.close({ runBeforeUnload: true });
    page = await ctx.newPage();
    await page.goto(`${baseUrl}/surveys`);
    await expect.poll(async () => (await docOnDevice(page, survey.id)).vessel.name, { timeout: 10_000 }).toBe('MV Closed Page');
  });
});

describe('the verdict note on the desk', () => {
  let ctx: BrowserContext;
  let page: Page;
  let survey: Survey;

  beforeAll(async () => {
    survey = await surveyInStatus(file.db, org, 'in_review');
    ctx = await file.browser.newContext({ viewport: { width: 1280, height: 900 } });
    page = await ctx.newPage();
    await signIn(page, org.engineer, `/review/${survey.id}`);
    await page.getByTestId('review-desk').waitFor({ timeout: 60_000 });
  });
  afterAll(async () => {
    await ctx?.close();
  });

  it('keeps the note typed right after choosing a verdict, through the save coming back', async () => {
    const name = survey.boundaries[0].name;
    const row = page.getByTestId('boundary-verdict').filter({ hasText: name }).first();
    const note = row.getByLabel(`Note on ${name}`);
    const surveyNote = page.getByLabel('Note on the survey verdict');
    await row.getByRole('combobox').selectOption('sound_if_shored');
    // typed while the verdict's save is on its way, then tapped away at once
    const gap = await typeThenTap(note, 'Shore at frame 62 first.', surveyNote);
    expect(gap).toBeLessThan(50);
    await surveyNote.fill('Proceed once the shores are in.');
    // both saves have come back (the row shows the verdict's colour) and nothing typed was wiped
    await expect.poll(() => row.getAttribute('class')).toContain('border-caution');
    // the note was saved with the verdict, and the desk has read its saves back
    await expect
      .poll(async () => (await file.db('review_verdicts').where({ survey_id: survey.id, boundary_id: survey.boundaries[0].id }).first())?.note, { timeout: 10_000 })
      .toBe('Shore at frame 62 first.');
    await page.waitForTimeout(1500);
    expect(await note.inputValue()).toBe('Shore at frame 62 first.');
    expect(await surveyNote.inputValue()).toBe('Proceed once the shores are in.');
    await page.reload();
    await page.getByTestId('review-desk').waitFor();
    expect(await page.getByTestId('boundary-verdict').filter({ hasText: name }).first().getByLabel(`Note on ${name}`).inputValue()).toBe('Shore at frame 62 first.');
  });
});
