/**
 * The response screens on the demo casualty, aground under No. 1 hold, at 390 px (a phone) and
 * 1440 px (the desk): the Stability panel shows the attitude, GM fluid aground, the ground reaction
 * and GM afloat, each with its unit and matching the engine on the survey the device holds (whose
 * figures tests/reference/grounding.test.ts checks against the texts), the grounding and refloating
 * warnings and the stability caution; Loads at the predicted attitude says so, with its figures and
 * the caution. Nothing scrolls sideways. Screenshots land in test-results/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { computeSurvey, shipResponseOf } from '@shared/engine';
import { STABILITY_CAUTION } from '@shared/api/cautions';
import { launchBrowser, screenshotPath } from '../support/browser';
import { DEMO, localDoc, section, signIn } from '../support/e2e';

const baseUrl = inject('baseUrl');
const DEMO_SURVEY_ID = '5eed0000-0000-4000-8000-000000000001';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** The number in a figure like "0.4015 m" or "1,344 t", and its unit. */
function figure(text: string | null): { value: number; unit: string } {
  const m = /^(−|-)?([\d,]+(?:\.\d+)?)\s+(\S+)$/.exec((text ?? '').trim());
  if (!m) throw new Error(`not a figure with a unit: ${text}`);
  return { value: (m[1] ? -1 : 1) * Number(m[2].replace(/,/g, '')), unit: m[3] };
}

async function noSidewaysScroll(page: Page) {
  const over = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(over).toBeLessThanOrEqual(0);
}

describe('the ship’s response of the demo casualty, aground', () => {
  for (const width of [390, 1440]) {
    it(`Stability and Loads at the predicted attitude at ${width} px`, async () => {
      const context = await browser.newContext({ viewport: { width, height: width === 390 ? 844 : 900 } });
      const page = await context.newPage();
      try {
        await signIn(page, DEMO.surveyor);
        await page.goto(`${baseUrl}/surveys/${DEMO_SURVEY_ID}`);
        await page.getByTestId('workspace').waitFor({ timeout: 60_000 });
        const doc = await localDoc(page, DEMO_SURVEY_ID);
        const r = shipResponseOf(doc, computeSurvey(doc))!;
        expect(r.ground?.afloat).toBe(false);

        await section(page, 'Stability');
        const panel = page.getByTestId('ship-response');
        await panel.waitFor();
        await page.getByTestId('gm-fluid').waitFor();
        const gm = figure(await page.getByTestId('gm-fluid').textContent());
        expect(gm.unit).toBe('m');
        expect(gm.value).toBeCloseTo(r.gmFluidM, 3);
        await expect(panel.getByText('GM fluid aground').count()).resolves.toBe(1);
        const reaction = figure(await page.getByTestId('ground-reaction').textContent());
        expect(reaction.unit).toBe('t');
        expect(Math.abs(reaction.value - r.ground!.reactionKg / 1000)).toBeLessThan(1);
        const afloat = figure(await page.getByTestId('gm-afloat').textContent());
        expect(afloat.unit).toBe('m');
        expect(afloat.value).toBeCloseTo(r.ground!.free.gmFluidM, 3);
        const heel = `${Math.abs(r.attitude.heelDeg).toFixed(1)}° ${r.attitude.heelDeg > 0.05 ? 'stbd' : 'port'}`;
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

        await section(page, 'Loads');
        await page.getByTestId('loads-attitude-choice').getByLabel(/Predicted/).check();
        const inUse = page.getByTestId('attitude-in-use');
        await inUse.and(page.locator('[data-attitude="predicted"]')).waitFor();
        const words = (await inUse.textContent()) ?? '';
        expect(words).toContain('These loads use the PREDICTED attitude');
        expect(words).toContain(`heel ${heel}`);
        // a GM with its sign and unit (the demo's static prediction after the tank-contents change is negative; see the #15 note)
        expect(words).toMatch(/GM fluid -?\d+\.\d+ m/);
        expect(words).toContain(STABILITY_CAUTION);
        // the totals at the predicted attitude say where their heel comes from
        await page.getByRole('region', { name: 'Ship totals' }).getByText('predicted (ship’s response)').waitFor();
        await noSidewaysScroll(page);
        await inUse.screenshot({ path: screenshotPath(`stability-demo-loads-predicted-${width}`) });
        await page.getByRole('region', { name: 'Ship totals' }).screenshot({ path: screenshotPath(`stability-demo-loads-totals-${width}`) });
      } finally {
        await context.close();
      }
    }, 180_000);
  }
});
