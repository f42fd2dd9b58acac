/**
 * The evidence on the desk, in Chromium at 390 px and 1440 px: the surveyor's sounding edits (several
 * autosaves) appear in the desk's history as one plain-words entry; the desk shows the inputs a
 * boundary's loads rest on, read-only, and links to them among all inputs; an engineer opening the
 * surveyor's workspace sees the figures but no field to change them.
 */
import { describe, expect, it, inject } from 'vitest';
import { screenshotPath } from '../support/browser';
import { demoSurvey } from '../../seeds/demo-survey';
import { DEMO, makeChangesIfAsked, signIn, startE2eFile } from '../support/e2e';

const baseUrl = inject('baseUrl');
const SURVEYOR = DEMO.surveyor;
const ENGINEER = DEMO.engineer;
const SURVEY_ID = demoSurvey().id;
// each width types its own final sounding, so the two runs never depend on each other's order
const CASES = [
  { width: 390, final: '5.40' },
  { width: 1440, final: '6.40' },
] as const;

const file = startE2eFile();

describe.each(CASES)('at $width px', ({ width, final }) => {
  it('history in plain words, inputs beside the results, and a read-only workspace for the engineer', async () => {
    // The surveyor types the No. 2 hold sounding in three steps; each autosaves and syncs.
    const s = await file.browser.newContext({ viewport: { width, height: 900 } });
    const sp = await s.newPage();
    await signIn(sp, SURVEYOR);
    await sp.goto(`${baseUrl}/surveys/${SURVEY_ID}?s=contents`);
    await makeChangesIfAsked(sp);
    await sp.getByRole('list', { name: 'Compartment' }).getByRole('button', { name: 'No. 2 hold' }).click();
    const sounding = sp.getByLabel(/^Sounding \(/).first();
    for (const v of ['4.9', '5.15', final]) {
      await sounding.fill(v);
      await sp.waitForTimeout(1500);
    }
    await sp.getByTestId('survey-sync').filter({ hasText: /^Synced/ }).waitFor({ timeout: 30_000 });
    await s.close();

    const e = await file.browser.newContext({ viewport: { width, height: 900 } });
    const page = await e.newPage();
    await signIn(page, ENGINEER);
    await page.goto(`${baseUrl}/review/${SURVEY_ID}`);
    await page.getByTestId('review-desk').waitFor({ timeout: 30_000 });

    // History: one entry for the sitting, the change said as a surveyor would say it, no field names.
    await page.getByRole('tab', { name: 'History' }).click();
    const latest = page.getByTestId('history-entry').first();
    await latest.waitFor();
    const text = await latest.innerText();
    expect(text).toMatch(new RegExp(`Sounding in No\\. 2 hold: [0-9.]+ m → ${final.replace('.', '\\.')} m`));
    expect(text).toMatch(/revisions \d+–\d+, \d+ saves/);
    expect(text).not.toMatch(/soundingM|contents|[{}[\]]|compartmentId/);
    await page.getByTestId('revision-list').screenshot({ path: screenshotPath(`desk-history-${width}`) });

    // Beside a boundary's results: the inputs its loads rest on, and a link to them among all inputs.
    await page.getByRole('tab', { name: 'Results' }).click();
    await page.getByRole('button', { name: 'No. 2/3 hold bulkhead' }).first().click();
    const beside = page.getByTestId('result-inputs');
    await beside.waitFor();
    expect(await beside.innerText()).toContain(`Sounding ${final} m`);
    expect(await beside.locator('input, select, textarea').count()).toBe(0);
    // The demo's photo of this bulkhead is on the server (the seed puts its file in the photo store): shown, not "connect to see it".
    const photo = beside.getByRole('img', { name: 'Shoring on the No. 3 side of the No. 2/3 bulkhead' });
    await photo.waitFor({ timeout: 15_000 });
    await expect.poll(() => photo.evaluate((img) => (img as HTMLImageElement).naturalWidth)).toBe(800);
    expect(await beside.getByTestId('photo-unavailable').count()).toBe(0);
    await beside.screenshot({ path: screenshotPath(`desk-result-inputs-${width}`) });
    await beside.getByRole('button', { name: 'No. 2 hold among all inputs' }).click();
    const card = page.getByTestId('survey-inputs').getByRole('region', { name: 'No. 2 hold', exact: true });
    await card.waitFor();
    await expect.poll(() => card.evaluate((el) => el === document.activeElement)).toBe(true);
    expect(await page.getByTestId('survey-inputs').locator('input, select, textarea').count()).toBe(0);
    await page.screenshot({ path: screenshotPath(`desk-inputs-${width}`) });

    // The surveyor's workspace, opened by the engineer: said read-only, and nothing to type in.
    await page.goto(`${baseUrl}/surveys`);
    await page.getByRole('link', { name: 'MV Corran Tide' }).first().waitFor({ timeout: 30_000 });
    await page.goto(`${baseUrl}/surveys/${SURVEY_ID}?s=contents`);
    await page.getByTestId('read-only-notice').waitFor();
    expect(await page.getByTestId('read-only-notice').innerText()).toMatch(/Read-only for you/);
    expect(await page.getByTestId('survey-inputs').innerText()).toContain(`Sounding ${final} m`);
    for (const s of ['Ship', 'Readings', 'Spaces', 'Contents', 'Boundaries', 'Photos']) {
      await page.getByRole('navigation', { name: 'Workspace sections' }).getByRole('button', { name: s, exact: true }).click();
      await page.getByTestId('survey-inputs').waitFor();
      expect(await page.locator('main input:not([type=search]), main select, main textarea').count(), s).toBe(0);
    }
    await page.getByRole('navigation', { name: 'Workspace sections' }).getByRole('button', { name: 'Stability', exact: true }).click();
    await page.waitForTimeout(300);
    const editable = await page.locator('main input:enabled, main select:enabled, main textarea:enabled').count();
    expect(editable).toBe(0);
    await page.getByRole('navigation', { name: 'Workspace sections' }).getByRole('button', { name: 'Readings', exact: true }).click();
    await page.screenshot({ path: screenshotPath(`engineer-workspace-${width}`) });
    await e.close();
  });
});
