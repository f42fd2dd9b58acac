/**
 * A big ship on a small phone (#18): a surveyor imports a survey of 200 spaces and 2,000 boundaries
 * (the bench vessel, tests/support/big-survey.ts) on a 390 px screen and edits one sounding. The
 * space's loads must follow the edit, to the figure the engine gives for the edited survey computed
 * here, and no screen may hold 3,000 elements or more: long lists render only what is in view, and
 * nothing hidden is rendered. A count, not a timing (timings are `npm run bench -- browser`'s).
 */
import { describe, expect, it, inject } from 'vitest';
import { computeSurveySummary } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import { screenshotPath } from '../support/browser';
import { DEMO, localDoc, section, signIn, startE2eFile } from '../support/e2e';
import { bigSurvey, elementCount, importSurvey, openContentsOf, SOUNDED_SPACE } from '../support/big-survey';

const baseUrl = inject('baseUrl');
const MAX_ELEMENTS = 3000;
const SECTIONS = ['Ship', 'Readings', 'Spaces', 'Contents', 'Boundaries', 'Loads', 'Stability', 'Flooding', '3D', 'Photos'];

const e2e = startE2eFile();

/** The space's fill as the engine gives it for `doc`, in the words the contents form shows ("57 % full"). */
function fillWords(doc: Survey, spaceName: string): string {
  const id = doc.compartments.find((c) => c.name === spaceName)!.id;
  const c = computeSurveySummary(doc).compartments.find((x) => x.id === id)!;
  return `${(c.fillFraction * 100).toFixed(0)} % full`;
}

describe('the 2,000-boundary survey on a 390 px phone', () => {
  it('imports, takes a sounding edit with the loads following it, and keeps every screen under 3,000 elements', { timeout: 600_000 }, async () => {
    const context = await e2e.browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    try {
      await signIn(page, DEMO.surveyor);
      const survey = bigSurvey();
      expect([survey.compartments.length, survey.boundaries.length]).toEqual([200, 2000]);
      const id = await importSurvey(page, baseUrl, survey);

      await openContentsOf(page, SOUNDED_SPACE);
      const summary = page.getByTestId('contents-summary');
      const before = await localDoc(page, id);
      await expect.poll(() => summary.textContent(), { timeout: 60_000 }).toContain(fillWords(before, SOUNDED_SPACE));
      const floodBefore = await page.getByTestId('state-strip').textContent();

      const reading = page.locator('input[name="layers.0.reading"]');
      await reading.fill('7.25');
      // the device stores the sounding typed, and the space's loads become the engine's for it
      await expect.poll(async () => {
        const doc = await localDoc(page, id);
        const k = doc.conditions[0].contents.find((x) => x.compartmentId === doc.compartments.find((c) => c.name === SOUNDED_SPACE)!.id)!;
        return k.layers[0].level.kind === 'sounding' ? k.layers[0].level.soundingM : null;
      }, { timeout: 60_000 }).toBe(7.25);
      const after = await localDoc(page, id);
      const expected = fillWords(after, SOUNDED_SPACE);
      expect(expected).not.toBe(fillWords(before, SOUNDED_SPACE));
      await expect.poll(() => summary.textContent(), { timeout: 60_000 }).toContain(expected);
      await expect.poll(() => page.getByTestId('state-strip').textContent(), { timeout: 60_000 }).not.toBe(floodBefore);
      expect(await elementCount(page)).toBeLessThan(MAX_ELEMENTS);

      const counts: Record<string, number> = {};
      for (const name of SECTIONS) {
        await section(page, name);
        if (name === 'Loads') await page.getByTestId('boundary-row').first().waitFor({ timeout: 60_000 });
        if (name === '3D') await page.locator('[data-testid=model-canvas][data-drawn=true], [data-testid=model-fallback]').first().waitFor({ timeout: 120_000 });
        counts[name] = await elementCount(page);
      }
      await page.screenshot({ path: screenshotPath('big-survey-390'), fullPage: false });
      // a picker of 200 spaces holds only its chosen option until it is used; then all of them, and a choice sticks
      await section(page, 'Flooding');
      const spaces = page.locator('#flood-space');
      expect(await spaces.locator('option').count()).toBe(1);
      await spaces.focus();
      await expect.poll(() => spaces.locator('option').count()).toBe(200);
      await spaces.selectOption({ label: 'C3-1' });
      await spaces.blur();
      await expect.poll(() => spaces.locator('option').count()).toBe(1);
      expect(await spaces.locator('option').textContent()).toBe('C3-1');
      for (const [name, n] of Object.entries(counts)) expect([name, n < MAX_ELEMENTS, n]).toEqual([name, true, n]);
    } finally {
      await context.close();
    }
  });
});
