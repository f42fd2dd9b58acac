/**
 * The review desk of the demo's submitted casualty (seeds/demo-survey.ts), at 1440 px:
 * - the results table's row for the hatch cover names the rating that governs it with its
 *   value, unit and the side it holds towards ("rated 17.5 kPa towards side B (…)"), as the engine's
 *   summary row says (the figure itself is checked against hand statics in
 *   tests/reference/check-rows.test.ts);
 * - switching from the 3D model to the Forecast tab (and back, and on to the other tabs) raises no
 *   page error and logs no React error (the 3D scene's labels are DOM nodes the scene adds beside
 *   its canvas, which once broke React's removal of the tab).
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { boundaryRows, computeSurveySummary } from '@shared/engine';
import { demoSubmittedSurvey, DEMO_SUBMITTED_SURVEY_ID } from '../../seeds/demo-survey';
import { screenshotPath } from '../support/browser';
import { DEMO, signIn, startE2eFile } from '../support/e2e';

const e2e = startE2eFile();

/** Uncaught errors and console errors of a page, from now on. */
function errorsOf(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' && !/Failed to load resource/.test(m.text())) errors.push(`console: ${m.text()}`);
  });
  return errors;
}

const tab = (page: Page, name: string) => page.getByRole('tablist', { name: 'Survey views' }).getByRole('tab', { name, exact: true });

describe('the review desk', () => {
  it('names the governing rating’s direction in the results row, and switches from the 3D model to the forecast without errors', { timeout: 240_000 }, async () => {
    const context = await e2e.browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    const errors = errorsOf(page);
    try {
      await signIn(page, DEMO.engineer, `/review/${DEMO_SUBMITTED_SURVEY_ID}`);
      await page.getByTestId('review-desk').waitFor({ timeout: 60_000 });

      // the hatch cover's rating towards side B governs it (the engine's own row says so)
      const hatch = boundaryRows(computeSurveySummary(demoSubmittedSurvey()).boundaries).find((r) => r.name === "No. 1 'tween deck hatch cover")!;
      expect(hatch.capacityDirection).toBe('towards-B');
      const governs = page.getByTestId(`governs-${hatch.id}`);
      await governs.waitFor({ timeout: 30_000 });
      const words = (await governs.textContent())!.replace(/\u00a0/g, ' ');
      expect(words).toMatch(new RegExp(`^rated ${((hatch.capacityRated ?? NaN) / 1000).toFixed(1)} kPa towards side B \\(.+\\)$`));
      expect(words).not.toContain('Unknown space');
      await governs.scrollIntoViewIfNeeded();
      await page.screenshot({ path: screenshotPath('desk-rating-direction-1440') });

      for (let round = 0; round < 2; round++) {
        await tab(page, '3D model').click();
        await expect.poll(() => page.getByTestId('model-canvas').getAttribute('data-drawn'), { timeout: 60_000 }).toBe('true');
        await page.getByTestId('scale-mark').first().waitFor({ timeout: 30_000 });
        await tab(page, 'Forecast').click();
        await expect.poll(() => tab(page, 'Forecast').getAttribute('aria-selected')).toBe('true');
        await page.waitForTimeout(500);
        expect(await page.getByTestId('model-canvas').count()).toBe(0);
      }
      await page.screenshot({ path: screenshotPath('desk-forecast-after-3d-1440') });
      for (const name of ['3D model', 'Results', '3D model', 'Inputs', '3D model', 'History']) {
        await tab(page, name).click();
        if (name === '3D model') await expect.poll(() => page.getByTestId('model-canvas').getAttribute('data-drawn'), { timeout: 60_000 }).toBe('true');
      }
      await page.waitForTimeout(1_000);
      expect(errors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
