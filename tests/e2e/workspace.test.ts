/**
 * The surveyor's workspace as a new user meets it: sign in, lose the signal, build a survey from
 * nothing, read the bulkhead load the engine gives for the same inputs, see the 3D model, attach a
 * photo, come back online and find survey and photo on the server.
 */
import { describe, expect, it, inject } from 'vitest';
import { screenshotPath } from '../support/browser';
import { computeSurvey } from '@shared/engine';
import { SurveySchema } from '@shared/schemas/survey';
import { formatNumber, fromSi } from '@shared/units/units';
import { makePng } from '../support/photos';
import { demoSurvey } from '../../seeds/demo-survey';
import { DEMO, localDoc, offlineReady, section, signIn, startE2eFile, waitSaved } from '../support/e2e';

const baseUrl = inject('baseUrl');

const e2e = startE2eFile({ db: true });

async function pollUntil<T>(fn: () => Promise<T | undefined>, timeoutMs = 60_000): Promise<T> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const v = await fn();
    if (v !== undefined) return v;
    if (Date.now() > end) throw new Error('timed out waiting for the server');
    await new Promise((r) => setTimeout(r, 500));
  }
}

describe('the workspace, offline from the start', () => {
  let surveyId = '';

  it('builds a survey from nothing offline, matches the engine, renders 3D, takes a photo and syncs it all', async () => {
    const context = await e2e.browser.newContext({ viewport: { width: 360, height: 800 } });
    const page = await context.newPage();
    await signIn(page, DEMO.surveyor);
    await page.goto(`${baseUrl}/surveys`);
    await page.getByRole('heading', { name: 'Surveys' }).waitFor();
    await offlineReady(page);
    await page.getByRole('heading', { name: 'Surveys' }).waitFor();

    await context.setOffline(true);
    await page.getByRole('button', { name: '+ New survey' }).click();
    await page.getByTestId('workspace').waitFor();
    surveyId = decodeURIComponent(new URL(page.url()).pathname.split('/').pop()!);

    const t0 = Date.now();
    const step = (name: string) => process.env.WS_DEBUG && console.log(`${((Date.now() - t0) / 1000).toFixed(1)} s: ${name}`);
    step('ship');
    await page.getByLabel('Survey title').fill('Flooding after grounding');
    await page.getByLabel('Vessel name').fill('Test Carrier');
    await page.getByLabel('Length between perpendiculars').fill('100');
    await page.getByLabel('Breadth').fill('16');
    await page.getByLabel(/^Depth \(/).fill('10');
    // a wrong value is kept in its field and explained, and nothing is saved
    await page.getByLabel('Breadth').fill('-3');
    await page.getByText('Must be more than 0 m.').waitFor();
    await expect(page.getByLabel('Breadth').inputValue()).resolves.toBe('-3');
    await page.getByLabel('Breadth').fill('16');
    await waitSaved(page);

    // Readings
    step('Readings');
    await section(page, 'Readings');
    await page.getByLabel(/^Aft \(/).fill('6.2');
    await page.getByLabel(/^Forward \(/).fill('5.8');
    await page.getByLabel('Heel (inclinometer)').fill('2');
    await waitSaved(page);

    // Spaces: two holds, the second forward of the first
    step('Spaces: two holds');
    await section(page, 'Spaces');
    await page.getByRole('button', { name: '+ Add compartment' }).click();
    await page.getByRole('form', { name: 'Compartment Space 1' }).waitFor();
    await page.getByLabel('Name', { exact: true }).fill('No. 1 hold');
    await waitSaved(page);
    await page.getByRole('button', { name: '+ Add compartment' }).click();
    await page.getByRole('form', { name: 'Compartment Space 2' }).waitFor();
    await page.getByLabel('Name', { exact: true }).fill('No. 2 hold');
    await waitSaved(page);

    // Contents: sea water in No. 1; oil over water in No. 2
    step('Contents: sea water');
    await section(page, 'Contents');
    await page.getByRole('button', { name: 'No. 1 hold', exact: true }).click();
    await page.getByRole('button', { name: 'Enter contents of No. 1 hold' }).click();
    await page.getByLabel(/^Sounding \(/).fill('5.5');
    await waitSaved(page);
    await page.getByRole('button', { name: 'No. 2 hold', exact: true }).click();
    await page.getByRole('button', { name: 'Enter contents of No. 2 hold' }).click();
    await page.getByLabel(/^Sounding \(/).fill('2.5');
    await waitSaved(page);
    await page.getByRole('button', { name: '+ Oil layer' }).click();
    await page.getByLabel(/^Sounding \(/).nth(1).fill('3.6');
    await waitSaved(page);

    // Plates: the bulkhead between them, from No. 1 hold's forward face
    step('Plates: the bulkhead');
    await section(page, 'Boundaries');
    await page.getByLabel('Face', { exact: true }).selectOption('forward');
    await page.getByLabel('Space of the face').selectOption({ label: 'No. 1 hold' });
    await page.getByRole('button', { name: 'Create' }).click();
    await page.getByRole('button', { name: /Forward bulkhead of No\. 1 hold/ }).first().waitFor();

    // Loads, against the engine run here on the same document
    step('Loads, against');
    const doc = await localDoc(page, surveyId);
    expect(doc.compartments).toHaveLength(2);
    const bulkhead = doc.boundaries[0];
    expect(bulkhead.sideB).toEqual({ kind: 'compartment', compartmentId: doc.compartments[1].id });
    expect(doc.conditions[0].contents.find((c) => c.compartmentId === doc.compartments[1].id)?.layers.map((l) => l.fluidId)).toEqual(['sea-water', 'dma']);
    const expected = computeSurvey(doc).boundaries.find((b) => b.id === bulkhead.id)!;
    expect(Math.abs(expected.net.forceN)).toBeGreaterThan(1000);

    await section(page, 'Loads');
    const cell = page.getByTestId(`net-force-${bulkhead.id}`);
    await expect(cell.textContent()).resolves.toBe(formatNumber(fromSi(expected.net.forceN, 'kN'), 4));
    await page.screenshot({ path: screenshotPath('workspace-new-loads-si-360'), fullPage: true });
    // the same load in US customary units
    await page.getByRole('group', { name: 'Units' }).getByRole('button', { name: 'US' }).click();
    await expect(cell.textContent()).resolves.toBe(formatNumber(fromSi(expected.net.forceN, 'kip'), 4));
    await page.getByRole('group', { name: 'Units' }).getByRole('button', { name: 'SI' }).click();

    // 3D: a canvas with a drawn picture, not a blank box
    step('3D: a canvas');
    await section(page, '3D');
    const canvas = page.getByTestId('model-canvas').locator('canvas');
    await canvas.waitFor({ timeout: 60_000 });
    await page.waitForTimeout(1500);
    const variance = await canvas.evaluate((c: HTMLCanvasElement) => {
      const copy = document.createElement('canvas');
      copy.width = c.width;
      copy.height = c.height;
      const ctx = copy.getContext('2d')!;
      ctx.drawImage(c, 0, 0);
      const data = ctx.getImageData(0, 0, copy.width, copy.height).data;
      let n = 0, sum = 0, sq = 0;
      for (let i = 0; i < data.length; i += 16) {
        const v = (data[i] + data[i + 1] + data[i + 2]) / 3;
        n++;
        sum += v;
        sq += v * v;
      }
      return sq / n - (sum / n) ** 2;
    });
    expect(variance).toBeGreaterThan(50);
    await page.screenshot({ path: screenshotPath('workspace-new-3d-360'), fullPage: true });

    // Photo, taken offline
    step('Photo, taken offline');
    await section(page, 'Photos');
    await page.getByLabel('Of', { exact: true }).selectOption({ label: 'Boundary: Forward bulkhead of No. 1 hold' });
    await page.getByLabel('Caption').fill('Bulkhead seen from No. 1 hold');
    await page.getByTestId('photo-input').setInputFiles({ name: 'bulkhead.png', mimeType: 'image/png', buffer: makePng(64, 48) });
    await page.getByText('On this device, waiting to upload').waitFor();
    const photoId = (await localDoc(page, surveyId)).photos?.[0]?.id;
    expect(photoId).toBeTruthy();

    // Back online: the survey, then the photo, reach the server
    step('Back online');
    await context.setOffline(false);
    const row = await pollUntil(async () => (await e2e.db('surveys').where({ id: surveyId }).first()) ?? undefined);
    const serverDoc = SurveySchema.parse(row.doc);
    await pollUntil(async () => {
      const r = await e2e.db('surveys').where({ id: surveyId }).first();
      return SurveySchema.parse(r.doc).boundaries.length === 1 && (SurveySchema.parse(r.doc).photos?.length ?? 0) === 1 ? true : undefined;
    });
    expect(serverDoc.vessel.name).toBe('Test Carrier');
    const photo = await pollUntil(async () => (await e2e.db('photos').where({ id: photoId }).first()) ?? undefined);
    expect(photo).toMatchObject({ survey_id: surveyId, entity_kind: 'boundary', entity_id: bulkhead.id, content_type: 'image/png' });
    await page.getByTestId('photo-state').filter({ hasText: 'Uploaded' }).waitFor({ timeout: 30_000 });
    await page.screenshot({ path: screenshotPath('workspace-new-photos-360'), fullPage: true });

    // A photo taken by mistake is removed: asked first, then gone from the survey on the server too
    step('Remove the photo');
    await page.getByRole('button', { name: 'Remove photo: Bulkhead seen from No. 1 hold' }).click();
    const ask = page.getByRole('group', { name: 'Remove this photo?' });
    await expect(ask.innerText()).resolves.toContain('stays on the server');
    await page.screenshot({ path: screenshotPath('workspace-photo-remove-360'), fullPage: true });
    await ask.getByRole('button', { name: 'Remove photo' }).click();
    await page.getByText('No photos yet.').waitFor();
    await pollUntil(async () => {
      const r = await e2e.db('surveys').where({ id: surveyId }).first();
      return (SurveySchema.parse(r.doc).photos?.length ?? 0) === 0 ? true : undefined;
    });
    await context.close();
  }, 300_000);

  for (const width of [360, 1280]) {
    it(`shows every screen of the demo casualty at ${width} px without sideways scrolling`, async () => {
      const context = await e2e.browser.newContext({ viewport: { width, height: 900 } });
      const page = await context.newPage();
      const calls: string[] = [];
      page.on('response', (r) => {
        const u = new URL(r.url());
        if (u.pathname.startsWith('/api/')) calls.push(`${r.request().method()} ${u.pathname} ${r.status()}`);
      });
      await signIn(page, DEMO.surveyor);
      await page.goto(`${baseUrl}/surveys`);
      const list = page.getByTestId('survey-list');
      await list.waitFor({ timeout: 60_000 }).catch(async (err: unknown) => {
        // Say what the page showed instead, and what the app asked the API.
        await page.screenshot({ path: screenshotPath(`workspace-list-failed-${width}`), fullPage: true }).catch(() => undefined);
        const body = await page.locator('body').innerText({ timeout: 1000 }).catch(() => '(no body)');
        throw new Error(`No survey list. The page shows: ${body.slice(0, 600)}\nAPI calls: ${calls.join('; ')}`, { cause: err });
      });
      await page.screenshot({ path: screenshotPath(`workspace-list-${width}`), fullPage: true });
      const demo = await e2e.db('surveys').where({ id: demoSurvey().id }).first('id');
      expect(demo, 'the demo survey is seeded').toBeTruthy();
      await page.goto(`${baseUrl}/surveys/${demo.id}`);
      await page.getByTestId('workspace').waitFor({ timeout: 30_000 });
      for (const s of ['Ship', 'Readings', 'Spaces', 'Contents', 'Boundaries', 'Loads', '3D', 'Photos']) {
        await section(page, s);
        if (s === '3D') {
          await page.getByTestId('model-canvas').locator('canvas').waitFor({ timeout: 60_000 });
          await page.waitForTimeout(1500);
        }
        if (s === 'Spaces') await page.getByRole('list', { name: 'Compartments' }).getByRole('button').first().click();
        if (s === 'Boundaries') await page.getByRole('list', { name: 'Boundaries' }).getByRole('button').first().click();
        if (s === 'Loads') await page.getByTestId('boundary-row').first().click();
        const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
        expect(overflow, `${s} scrolls sideways at ${width} px`).toBeLessThanOrEqual(0);
        await page.screenshot({ path: screenshotPath(`workspace-demo-${s.toLowerCase()}-${width}`), fullPage: true });
      }
      await context.close();
    }, 300_000);
  }
});
