/**
 * The people around the numbers, in Chromium at 390 px and 1440 px: a new survey shows no loads
 * until its readings are entered; the calculation report prints to PDF with every boundary; the
 * master acknowledges the brief on a page with no script, and the engineer sees it on the desk. On a
 * German-language phone: times typed in one style whatever the locale, units in their true case,
 * downflooding points in words, old readings' age in days, an empty new breach, and a photo whose
 * file the server lost said as such.
 */
import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it, inject } from 'vitest';
import { screenshotPath } from '../support/browser';
import { demoSurvey } from '../../seeds/demo-survey';
import { DEMO_SUBMITTED_SURVEY_ID } from '../../seeds/demo-survey';
import { issueSecret } from '../../server/services/secrets';
import { DEMO_ORG, DEMO_USERS } from '../../seeds/demo-people';
import { DEMO, section, signIn, startE2eFile, waitSaved } from '../support/e2e';
import { seriousA11yViolations } from '../support/axe';
import { storeSurvey } from '../support/surveys';
import { insertPhoto } from '../../server/db/repositories/photos';

const baseUrl = inject('baseUrl');
const SURVEYOR = DEMO.surveyor;
const ENGINEER = DEMO.engineer;
const WIDTHS = [390, 1440] as const;

const e2e = startE2eFile({ db: true });

describe.each(WIDTHS)('at %i px', (width) => {
  it('a new survey shows no loads until its readings are entered', async () => {
    const context = await e2e.browser.newContext({ viewport: { width, height: 900 } });
    const page = await context.newPage();
    await signIn(page, SURVEYOR);
    await page.goto(`${baseUrl}/surveys`);
    await page.getByRole('button', { name: '+ New survey' }).click();
    await page.getByTestId('workspace').waitFor();

    await section(page, 'Readings');
    // readings start empty: nothing that could pass for a draft
    await expect(page.getByLabel(/^Aft \(/).inputValue()).resolves.toBe('');
    await expect(page.getByLabel(/^Forward \(/).inputValue()).resolves.toBe('');
    await expect(page.getByLabel('Heel (inclinometer)').inputValue()).resolves.toBe('');
    await page.screenshot({ path: screenshotPath(`people-readings-empty-${width}`), fullPage: true });

    await section(page, 'Spaces');
    await page.getByRole('button', { name: '+ Add compartment' }).click();
    await page.getByRole('form', { name: 'Compartment Space 1' }).waitFor();
    await page.getByLabel('Name', { exact: true }).fill('No. 2 hold');
    await waitSaved(page);
    // the permeability left empty is the space type's default, marked assumed until confirmed
    await expect(page.locator('[data-mark="assumed"]').first().textContent()).resolves.toContain('assumed');

    await section(page, 'Contents');
    await page.getByRole('button', { name: 'Enter contents of No. 2 hold' }).click();
    await expect(page.getByLabel(/^Sounding \(/).inputValue()).resolves.toBe('');
    await page.getByTestId('contents-withheld').waitFor();
    await expect(page.getByTestId('contents-withheld').textContent()).resolves.toContain('enter the draft aft, draft forward, heel');

    await section(page, 'Loads');
    const notice = page.getByTestId('withheld-notice');
    await notice.waitFor();
    await expect(notice.textContent()).resolves.toContain('sounding in No. 2 hold');
    await expect(page.getByTestId('total-flood-water').textContent()).resolves.toMatch(/^0(\.0+)? t$/);
    await page.screenshot({ path: screenshotPath(`people-loads-withheld-${width}`), fullPage: true });

    await section(page, 'Readings');
    await page.getByLabel(/^Aft \(/).fill('6.2');
    await page.getByLabel(/^Forward \(/).fill('5.8');
    await page.getByLabel('Heel (inclinometer)').fill('1.5');
    await waitSaved(page);
    await section(page, 'Contents');
    await page.getByLabel(/^Sounding \(/).fill('3.5');
    await waitSaved(page);
    await page.getByTestId('contents-summary').waitFor();

    await section(page, 'Loads');
    await expect(page.getByTestId('withheld-notice').count()).resolves.toBe(0);
    await expect.poll(() => page.getByTestId('total-flood-water').textContent()).not.toMatch(/^0(\.0+)? t$/);
    await page.screenshot({ path: screenshotPath(`people-loads-shown-${width}`), fullPage: true });
    await context.close();
  });

  it('the calculation report prints to PDF with every boundary', async () => {
    const context = await e2e.browser.newContext({ viewport: { width, height: 900 } });
    const page = await context.newPage();
    await signIn(page, ENGINEER);
    await page.goto(`${baseUrl}/review/${DEMO_SUBMITTED_SURVEY_ID}`);
    await page.getByTestId('review-desk').waitFor({ timeout: 30_000 });
    const [tab] = await Promise.all([context.waitForEvent('page'), page.getByTestId('report-button').click()]);
    await tab.waitForURL((u) => u.protocol === 'blob:', { timeout: 30_000 });
    await tab.getByRole('heading', { name: /MV Lunga Sound/ }).waitFor();
    await tab.screenshot({ path: screenshotPath(`people-report-${width}`), fullPage: width === 390 });
    const names = demoSurvey().boundaries.map((b) => b.name);
    for (const name of names) expect(await tab.locator('[data-boundary]').filter({ hasText: name }).count()).toBeGreaterThan(0);

    const dir = mkdtempSync(path.join(tmpdir(), 'report-'));
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = await tab.pdf({ format, printBackground: true });
      const file = path.join(dir, `report-${format}.pdf`);
      writeFileSync(file, pdf);
      // pdftotext / pdfinfo (poppler-utils) read the printed file as a reader would
      const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))?.[1]);
      expect(pages).toBeGreaterThanOrEqual(3);
      expect(pages).toBeLessThan(30);
      const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
      for (const name of names) expect(text).toContain(name);
      expect(text).toContain('Signature and date');
      expect(text).toContain('Methods and sources');
    }
    await context.close();
  });

  it('the master acknowledges the brief with no script, and the engineer sees it', async () => {
    // a link made as the desk makes one (token hashed), for the survey under review
    const { token, hash } = issueSecret();
    const engineer = DEMO_USERS.find((u) => u.email === ENGINEER.email)!;
    await e2e.db('brief_links').insert({
      survey_id: DEMO_SUBMITTED_SURVEY_ID,
      organisation_id: DEMO_ORG.id,
      token_hash: hash,
      recipient_email: `master-${width}@lunga.example`,
      units: 'si',
      revision: 1,
      expires_at: new Date(Date.now() + 86_400_000),
      created_by: engineer.id,
    });
    const master = await e2e.browser.newContext({ viewport: { width, height: 900 }, javaScriptEnabled: false });
    const page = await master.newPage();
    await page.goto(`${baseUrl}/brief/${token}`);
    await page.getByText("ship's time (UTC+01:00)").first().waitFor();
    await expect(page.locator('body').textContent()).resolves.toContain('Tomas Varga');
    await page.getByLabel('Your name and rank').fill(`A. Rennie, Master (${width})`);
    await page.getByRole('button', { name: 'Received and understood' }).click();
    await page.getByText(`Acknowledged by A. Rennie, Master (${width})`).waitFor();
    await page.screenshot({ path: screenshotPath(`people-brief-acknowledged-${width}`), fullPage: true });
    await master.close();

    const context = await e2e.browser.newContext({ viewport: { width, height: 900 } });
    const desk = await context.newPage();
    await signIn(desk, ENGINEER);
    await desk.goto(`${baseUrl}/review/${DEMO_SUBMITTED_SURVEY_ID}`);
    await desk.getByTestId('review-desk').waitFor({ timeout: 30_000 });
    const ack = desk.getByTestId('brief-acknowledged').filter({ hasText: `A. Rennie, Master (${width})` });
    await ack.waitFor({ timeout: 30_000 });
    await desk.screenshot({ path: screenshotPath(`people-desk-${width}`), fullPage: true });
    await context.close();
  });
});

describe('on a German-language phone at 390 px', () => {
  it('types times in the ship’s clock, says points, units and ages plainly, starts a breach empty and names a lost photo file', async () => {
    // a copy of the demo (readings of 14 Mar 2025, ship's clock UTC+01:00) with a photo whose file is gone
    const photoId = randomUUID();
    const bulkhead = demoSurvey().boundaries[0];
    const survey = await storeSurvey(e2e.db, SURVEYOR, {
      title: `Locale check ${photoId.slice(0, 6)}`,
      photos: [{ id: photoId, entity: { kind: 'boundary', id: bulkhead.id }, caption: 'Lost file', contentType: 'image/jpeg' }],
    });
    await insertPhoto(e2e.db, { id: photoId, orgId: SURVEYOR.orgId, surveyId: survey.id, entityKind: 'boundary', entityId: bulkhead.id, caption: 'Lost file', contentType: 'image/jpeg', sizeBytes: 1234, sha256: '0'.repeat(64), storageKey: `${SURVEYOR.orgId}/${survey.id}/never-stored.jpg`, uploadedBy: SURVEYOR.id });

    const context = await e2e.browser.newContext({ viewport: { width: 390, height: 844 }, locale: 'de-DE', timezoneId: 'Europe/Berlin' });
    context.setDefaultTimeout(60_000);
    const page = await context.newPage();
    await signIn(page, SURVEYOR, `/surveys/${survey.id}?s=readings`);
    await page.getByTestId('workspace').waitFor();

    // Readings: a text field in ship's time, 24 h, ISO-like, never the browser's German date picker
    const time = page.getByLabel(/^Time of readings \(ship’s time, UTC\+01:00\)/);
    await expect(time.getAttribute('type')).resolves.toBe('text');
    await expect(time.inputValue()).resolves.toBe('2025-03-14 08:30');
    await time.fill('14.03.2025, 09:45');
    await page.getByText('Enter the date and time as YYYY-MM-DD HH:MM (24 h)').waitFor();
    await expect(time.inputValue()).resolves.toBe('14.03.2025, 09:45');
    await time.fill('2025-03-14 09:45');
    await waitSaved(page);
    await expect.poll(async () => (await e2e.db('surveys').where({ id: survey.id }).first()).doc.conditions[0].time as string, { timeout: 60_000 }).toBe('2025-03-14T08:45:00.000Z');
    await page.screenshot({ path: screenshotPath('people-readings-de-390'), fullPage: true });
    expect(await seriousA11yViolations(page)).toEqual([]);

    // Stability: headers keep their units' case; downflooding points in words
    await section(page, 'Stability');
    const response = page.getByTestId('ship-response');
    await response.waitFor();
    const shouting = await response.evaluate((el) => [...el.querySelectorAll('*')].filter((e) => getComputedStyle(e).textTransform === 'uppercase').map((e) => e.textContent));
    expect(shouting).toEqual([]);
    const where = page.getByTestId('downflooding-position').first();
    await expect(where.textContent()).resolves.toMatch(/^\d+\.\d m (fwd|aft) of AP, (\d+\.\d+ m to (port|stbd)|on the centreline), \d+\.\d+ m (above|below) base$/);
    await page.screenshot({ path: screenshotPath('people-stability-de-390'), fullPage: true });

    // Flooding: readings 600-odd days old are said in days; a new breach starts with no figures in it
    await section(page, 'Flooding');
    const caution = page.getByTestId('forecast-caution');
    await caution.waitFor();
    await expect(caution.textContent()).resolves.toMatch(/, \d+ days ago\./);
    const breach = page.getByRole('form', { name: 'Add a breach' }).first();
    for (const label of ['Centre x', 'Centre y', 'Centre z']) await expect(breach.getByLabel(label).inputValue()).resolves.toBe('');
    await breach.getByRole('button', { name: '+ Add breach' }).click();
    await expect.poll(() => breach.getByText('Enter a number.').count()).toBeGreaterThanOrEqual(3);
    await page.screenshot({ path: screenshotPath('people-flooding-de-390'), fullPage: true });

    // Photos: the server has the row but not the file, and the card says so with what to do
    await section(page, 'Photos');
    const state = page.getByTestId('photo-state').filter({ hasText: /File missing on the server/ });
    await state.waitFor();
    await expect(state.textContent()).resolves.toContain('attach the photo again');
    await page.screenshot({ path: screenshotPath('people-photos-missing-390'), fullPage: true });
    expect(await seriousA11yViolations(page)).toEqual([]);
    await context.close();
  }, 300_000);
});
