/**
 * The response screens on the demo casualty, aground under No. 1 hold, at 390 px (a phone) and
 * 1440 px (the desk), on the test's own copy of the demo as seeded (other browser tests edit the
 * shared demo survey: one raises No. 2 hold's sounding to 6.40 m, which sends her GM aground below
 * zero). The Stability panel shows the attitude, GM fluid aground, the ground reaction and GM
 * afloat, each with its unit and matching the engine's GROUNDED response (whose figures
 * tests/reference/grounding.test.ts checks against the texts); Loads at the predicted attitude uses
 * that same grounded response (positive GM, drafts aground, not those she would float at free); the
 * forecast's attitude table gives the ground reaction; "Loads now" beside the form keeps to its
 * column at 1440 px. In US units every one of those figures is the engine's SI value converted here.
 * The particulars form takes nonsense in GM (and a negative GM, the ship at an angle of loll) with a
 * clear message, keeping what was typed. Screenshots land in test-results/screenshots/.
 */
import { randomUUID } from 'node:crypto';
import { describe, expect, it, inject } from 'vitest';
import type { Page } from 'playwright-core';
import { computeSurvey, forecastFlooding, shipResponseOf, type ShipResponse } from '@shared/engine';
import { STABILITY_CAUTION, hmm } from '@shared/api/cautions';
import type { Survey } from '@shared/schemas/survey';
import { screenshotPath } from '../support/browser';
import { DEMO, localDoc, section, signIn, startE2eFile, waitSaved } from '../support/e2e';
import { newSurvey, tokenFor } from '../support/surveys';
import { SimDevice } from '../support/sync-device';
import { demoSurvey } from '../../seeds/demo-survey';

const baseUrl = inject('baseUrl');
const env = inject('testEnv');
const file = startE2eFile();

// NIST Special Publication 811 (2008), Appendix B: 1 ft = 0.3048 m exactly; 1 long ton (2,240 lb) = 1,016.046 908 8 kg exactly.
const FT = 0.3048;
const LONG_TON = 1016.0469088;

/** A copy of the demo as seeded, in the demo firm, for one test. */
async function demoCopy(): Promise<Survey> {
  const token = await tokenFor(env.JWT_SECRET, DEMO.surveyor);
  const device = new SimDevice(baseUrl, token);
  const s = newSurvey({ title: `Demo aground ${randomUUID().slice(0, 6)}` });
  device.create(s);
  await device.sync();
  return s;
}

/** The number in a figure like "0.4015 m", "1344 t" or "7.506", and its unit (if any). */
function figure(text: string | null): { value: number; unit: string } {
  const m = /^(−|-)?([\d,]+(?:\.\d+)?)(?:\s+(\S+))?$/.exec((text ?? '').trim());
  if (!m) throw new Error(`not a figure: ${text}`);
  return { value: (m[1] ? -1 : 1) * Number(m[2].replace(/,/g, '')), unit: m[3] ?? '' };
}

/** |shown − expected| within half a unit of the last of `sig` significant digits. */
function nearSig(shown: number, expected: number, sig: number, what: string) {
  const step = 10 ** (Math.floor(Math.log10(Math.abs(expected))) - sig + 1);
  expect(Math.abs(shown - expected), `${what}: ${shown} against ${expected}`).toBeLessThanOrEqual(step / 2 + 1e-9);
}

const heelText = (deg: number) => `${Math.abs(deg).toFixed(1)}° ${deg > 0.05 ? 'stbd' : 'port'}`;

async function noSidewaysScroll(page: Page) {
  const over = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(over).toBeLessThanOrEqual(0);
}

async function openCopy(page: Page, id: string, units: 'SI' | 'US' = 'SI'): Promise<{ doc: Survey; r: ShipResponse }> {
  await signIn(page, DEMO.surveyor);
  await page.goto(`${baseUrl}/surveys/${id}`);
  await page.getByTestId('workspace').waitFor({ timeout: 60_000 });
  // the person's choice of units is remembered: say which
  await page.getByRole('group', { name: 'Units' }).first().getByRole('button', { name: units }).click();
  await expect.poll(async () => (await localDoc(page, id).catch(() => null))?.id, { timeout: 30_000 }).toBe(id);
  const doc = await localDoc(page, id);
  return { doc, r: shipResponseOf(doc, computeSurvey(doc))! };
}

describe('the ship’s response of the demo casualty, aground', () => {
  // the demo as seeded: the figures every check below rests on
  const seeded = demoSurvey();
  const grounded = shipResponseOf(seeded, computeSurvey(seeded))!;

  it('the seeded demo rests on the ground with a positive GM, unlike the afloat response', () => {
    expect(grounded.ground?.afloat).toBe(false);
    expect(grounded.gmFluidM).toBeGreaterThan(0);
    expect(Math.abs(grounded.attitude.draftAftM - grounded.ground!.free.attitude.draftAftM)).toBeGreaterThan(1);
  });

  for (const width of [390, 1440]) {
    it(`Stability, Loads at the predicted attitude and the forecast's reaction at ${width} px`, async () => {
      const copy = await demoCopy();
      const context = await file.browser.newContext({ viewport: { width, height: width === 390 ? 844 : 900 } });
      const page = await context.newPage();
      try {
        const { doc, r } = await openCopy(page, copy.id);
        // the copy is the demo as seeded
        expect(r.ground?.afloat).toBe(false);
        expect(r.gmFluidM).toBeCloseTo(grounded.gmFluidM, 9);
        expect(r.attitude.heelDeg).toBeCloseTo(grounded.attitude.heelDeg, 9);

        await section(page, 'Stability');
        const panel = page.getByTestId('ship-response');
        await panel.waitFor();
        await page.getByTestId('gm-fluid').waitFor();
        const gm = figure(await page.getByTestId('gm-fluid').textContent());
        expect(gm.unit).toBe('m');
        expect(gm.value).toBeGreaterThan(0);
        expect(gm.value).toBeCloseTo(r.gmFluidM, 3);
        await expect(panel.getByText('GM fluid aground').count()).resolves.toBe(1);
        const reaction = figure(await page.getByTestId('ground-reaction').textContent());
        expect(reaction.unit).toBe('t');
        expect(Math.abs(reaction.value - r.ground!.reactionKg / 1000)).toBeLessThan(1);
        const afloat = figure(await page.getByTestId('gm-afloat').textContent());
        expect(afloat.unit).toBe('m');
        expect(afloat.value).toBeCloseTo(r.ground!.free.gmFluidM, 3);
        const heel = heelText(r.attitude.heelDeg);
        await expect(page.getByTestId('predicted-heel').textContent()).resolves.toBe(heel);
        const aft = await page.getByTestId('predicted-draft-aft').textContent();
        expect(Number(aft)).toBeCloseTo(r.attitude.draftAftM, 2);
        // the grounding in words, the warning against refloating her as she is, and the caution
        const warnings = panel.getByRole('list', { name: 'Stability warnings' });
        await warnings.getByText(/^▲ ?Aground at 100\.0 m forward of the AP: ground reaction/).waitFor();
        await warnings.getByText(/Do not refloat her as she is/).waitFor();
        await expect(page.getByTestId('stability-caution').textContent()).resolves.toBe(STABILITY_CAUTION);
        expect(await page.getByTestId('stability-caution').isVisible()).toBe(true);
        // the grounding as entered, in the particulars form
        const ground = page.getByRole('group', { name: 'Aground at' });
        await expect(ground.getByLabel(/^x/).inputValue()).resolves.toBe('100');
        await expect(ground.getByLabel(/^y/).inputValue()).resolves.toBe('0');
        await noSidewaysScroll(page);
        await panel.screenshot({ path: screenshotPath(`stability-demo-response-${width}`) });
        await ground.screenshot({ path: screenshotPath(`stability-demo-aground-form-${width}`) });
        if (width === 1440) {
          // "Loads now" beside the form: boundary, utilisation and net force, nothing cut off at the side
          const aside = page.getByRole('complementary', { name: 'Loads at a glance' });
          await aside.waitFor();
          await expect(aside.locator('thead th').count()).resolves.toBe(3);
          const region = aside.getByRole('region', { name: /Loads on/ });
          expect(await region.evaluate((el) => el.scrollWidth - el.clientWidth)).toBeLessThanOrEqual(0);
          await page.screenshot({ path: screenshotPath('stability-demo-section-1440'), fullPage: true });
          await aside.screenshot({ path: screenshotPath('stability-demo-loads-now-1440') });
          // a boundary name is not broken a word to a line: "Engine room aft watertight door" takes at most two lines
          const name = aside.locator('tbody tr').first().locator('td').first().locator('.font-bold').first();
          const lines = await name.evaluate((el) => Math.round(el.getBoundingClientRect().height / parseFloat(getComputedStyle(el).lineHeight)));
          expect(lines).toBeLessThanOrEqual(2);
        }

        await section(page, 'Loads');
        await page.getByTestId('loads-attitude-choice').getByLabel(/Predicted/).check();
        const inUse = page.getByTestId('attitude-in-use');
        await inUse.and(page.locator('[data-attitude="predicted"]')).waitFor();
        const words = (await inUse.textContent()) ?? '';
        expect(words).toContain('These loads use the PREDICTED attitude');
        expect(words).toContain(`heel ${heel}`);
        // the grounded response's drafts and its positive GM, not those she would have afloat
        const m = /drafts aft ([\d.]+) m, forward ([\d.]+) m, heel .*, GM fluid ([\d.]+) m\./.exec(words);
        expect(m, `the predicted attitude in words: ${words}`).not.toBeNull();
        nearSig(Number(m![1]), r.attitude.draftAftM, 3, 'draft aft');
        nearSig(Number(m![2]), r.attitude.draftForeM, 3, 'draft forward');
        nearSig(Number(m![3]), r.gmFluidM, 3, 'GM fluid');
        expect(Math.abs(Number(m![1]) - r.ground!.free.attitude.draftAftM)).toBeGreaterThan(1);
        expect(words).toContain(STABILITY_CAUTION);
        // the totals at the predicted attitude say where their heel comes from
        await page.getByRole('region', { name: 'Ship totals' }).getByText('predicted (ship’s response)').waitFor();
        await noSidewaysScroll(page);
        await inUse.screenshot({ path: screenshotPath(`stability-demo-loads-predicted-${width}`) });

        // the forecast's attitude table: the reaction at the readings and at the end, as the engine's forecast of this survey
        const f = forecastFlooding(doc);
        await section(page, 'Flooding');
        const table = page.getByTestId('forecast-attitude-table');
        await table.waitFor({ timeout: 60_000 });
        await expect(table.locator('thead').textContent()).resolves.toContain('Ground reaction (t)');
        const first = table.locator('tbody tr').first();
        await expect(first.locator('th').textContent()).resolves.toBe('readings');
        nearSig(figure(await first.getByTestId('forecast-ground-reaction').textContent()).value, f.attitude.groundReactionKg[0]! / 1000, 4, 'reaction at the readings');
        await noSidewaysScroll(page);
        await table.scrollIntoViewIfNeeded();
        await page.getByTestId('forecast-attitude').screenshot({ path: screenshotPath(`stability-demo-forecast-attitude-${width}`) });
      } finally {
        await context.close();
      }
    }, 240_000);
  }

  it('in US units at 390 px: draft, heel, GM and the reaction are the engine’s SI figures in ft and long tons', async () => {
    const copy = await demoCopy();
    const context = await file.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    try {
      const { doc, r } = await openCopy(page, copy.id, 'US');

      await section(page, 'Stability');
      await page.getByTestId('gm-fluid').waitFor();
      const gm = figure(await page.getByTestId('gm-fluid').textContent());
      expect(gm.unit).toBe('ft');
      nearSig(gm.value, r.gmFluidM / FT, 4, 'GM fluid aground, ft');
      const reaction = figure(await page.getByTestId('ground-reaction').textContent());
      expect(reaction.unit).toBe('LT');
      nearSig(reaction.value, r.ground!.reactionKg / LONG_TON, 4, 'ground reaction, LT');
      const afloat = figure(await page.getByTestId('gm-afloat').textContent());
      expect(afloat.unit).toBe('ft');
      nearSig(afloat.value, r.ground!.free.gmFluidM / FT, 4, 'GM afloat, ft');
      nearSig(figure(await page.getByTestId('predicted-draft-aft').textContent()).value, r.attitude.draftAftM / FT, 4, 'draft aft, ft');
      nearSig(figure(await page.getByTestId('predicted-mean-draft').textContent()).value, r.attitude.meanDraftM / FT, 4, 'mean draft, ft');
      await expect(page.getByTestId('predicted-heel').textContent()).resolves.toBe(heelText(r.attitude.heelDeg));
      await page.getByTestId('ship-response').screenshot({ path: screenshotPath('stability-demo-response-us-390') });

      await section(page, 'Loads');
      await page.getByTestId('loads-attitude-choice').getByLabel(/Predicted/).check();
      const inUse = page.getByTestId('attitude-in-use');
      await inUse.and(page.locator('[data-attitude="predicted"]')).waitFor();
      const words = (await inUse.textContent()) ?? '';
      const m = /drafts aft ([\d.]+) ft, forward ([\d.]+) ft, heel .*, GM fluid ([\d.]+) ft\./.exec(words);
      expect(m, `the predicted attitude in words: ${words}`).not.toBeNull();
      nearSig(Number(m![1]), r.attitude.draftAftM / FT, 3, 'draft aft, ft');
      nearSig(Number(m![2]), r.attitude.draftForeM / FT, 3, 'draft forward, ft');
      nearSig(Number(m![3]), r.gmFluidM / FT, 3, 'GM fluid, ft');

      // the forecast's attitude table in ft and LT: the readings and the last output time
      const f = forecastFlooding(doc);
      await section(page, 'Flooding');
      const table = page.getByTestId('forecast-attitude-table');
      await table.waitFor({ timeout: 60_000 });
      const head = (await table.locator('thead').textContent()) ?? '';
      expect(head).toContain('Mean draft (ft)');
      expect(head).toContain('GM fluid (ft)');
      expect(head).toContain('Ground reaction (LT)');
      const last = f.times.length - 1;
      for (const [k, label] of [[0, 'readings'], [last, hmm(f.times[last])]] as const) {
        const row = table.locator('tbody tr').filter({ has: page.locator('th', { hasText: new RegExp(`^${label}$`) }) });
        const cells = await row.locator('td').allTextContents();
        const a = f.attitude.series[k]!;
        nearSig(figure(cells[0]).value, a.meanDraftM / FT, 4, `mean draft at ${label}, ft`);
        expect(cells[2]).toBe(heelText(a.heelDeg));
        nearSig(figure(cells[3]).value, f.attitude.gmFluidM[k]! / FT, 3, `GM fluid at ${label}, ft`);
        const R = f.attitude.groundReactionKg[k]!;
        if (R === 0) expect(cells[4]).toBe('afloat');
        else nearSig(figure(cells[4]).value, R / LONG_TON, 4, `reaction at ${label}, LT`);
      }
      await noSidewaysScroll(page);
      await page.getByTestId('forecast-attitude').screenshot({ path: screenshotPath('stability-demo-forecast-attitude-us-390') });
    } finally {
      await context.close();
    }
  }, 240_000);

  it('GM given as nonsense is refused under its field and kept; a negative GM (the ship at an angle of loll) is taken and said', async () => {
    const copy = await demoCopy();
    const context = await file.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    try {
      await openCopy(page, copy.id);
      await section(page, 'Stability');
      const form = page.getByRole('form', { name: 'Hydrostatic particulars' });
      const kg = form.getByLabel(/^KG \(/);
      const gm = form.getByLabel(/^GM \(/);
      // a negative displacement (the "Done when"): refused under its field, kept, the response unchanged
      const disp = form.getByLabel(/^Displacement \(/);
      await disp.fill('-7800');
      await form.getByText('Displacement must be more than zero').waitFor();
      await expect(disp.inputValue()).resolves.toBe('-7800');
      await disp.fill('7800');
      await waitSaved(page);
      // both KG and GM: one of them, please
      await gm.fill('0.5');
      await form.getByText('give either KG or GM (one of them)').waitFor();
      await expect(kg.inputValue()).resolves.toBe('3.8');
      await kg.fill('');
      await form.getByLabel('KG from').fill('');
      for (const [typed, message] of [
        ['abc', 'Enter a number, for example 12.5.'],
        ['1e999', 'Enter a number, for example 12.5.'],
        ['--0.3', 'Enter a number, for example 12.5.'],
        ['-60', /Must be more than -50(\.0+)? m/],
        // neither: KG keeps its "from" note, so it is asked for
        ['', /Required: enter a value\.|give either KG or GM/],
      ] as const) {
        await gm.fill(typed);
        await form.getByText(message).first().waitFor({ timeout: 10_000 });
        await expect(gm.inputValue(), `"${typed}" is kept`).resolves.toBe(typed);
        await page.getByTestId('gm-fluid').waitFor(); // the response stays on the last good particulars
      }
      // zero, then a negative GM typed with a typographic minus: taken, and the panel says what it means
      await gm.fill('0');
      await waitSaved(page);
      await gm.fill('−0.3');
      await waitSaved(page);
      expect(['−0.3', '-0.3']).toContain(await gm.inputValue());
      const doc = await localDoc(page, copy.id);
      const stability = doc.conditions.find((c) => c.id === doc.activeConditionId)!.stability!;
      expect(stability.particulars.kind === 'booklet' && stability.particulars.gmM?.value).toBe(-0.3);
      const r = shipResponseOf(doc, computeSurvey(doc))!;
      expect(r.gmFluidM).toBeLessThan(0);
      await expect.poll(async () => figure(await page.getByTestId('gm-fluid').textContent()).value).toBeCloseTo(r.gmFluidM, 3);
      await expect(page.getByTestId('predicted-heel').textContent()).resolves.toBe(heelText(r.attitude.heelDeg));
      const warnings = page.getByTestId('ship-response').getByRole('list', { name: 'Stability warnings' });
      await warnings.getByText(/only the ground holds her upright/).waitFor();
      await page.getByTestId('ship-response').screenshot({ path: screenshotPath('stability-demo-negative-gm-390') });
    } finally {
      await context.close();
    }
  }, 240_000);
});
