/**
 * The big survey on a phone (#18): the generated cargo ship of 200 spaces and 2,000 boundaries, imported
 * through the survey list as a surveyor would, and the few steps the browser test and the browser bench
 * (`scripts/bench-browser.ts`) both take on it.
 */
import type { Page } from 'playwright-core';
import type { Survey } from '@shared/schemas/survey';
import { generateVessel } from '../../scripts/bench-engine';

/** 200 spaces, 2,000 boundaries (the bench vessel with 20 boxes along instead of 40). */
export function bigSurvey(): Survey {
  return generateVessel({ columns: 20 });
}

/** A space of the big survey whose contents start with a sounding (C1-0: sea water, sounding 4.4 m). */
export const SOUNDED_SPACE = 'C1-0';

/** Imports the survey through the list's "Import file", waits for its workspace and returns the id it got. */
export async function importSurvey(page: Page, baseUrl: string, survey: Survey): Promise<string> {
  await page.goto(`${baseUrl}/surveys`);
  await page.getByTestId('import-input').setInputFiles({ name: 'big-ship.brineline.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(survey)) });
  await page.waitForURL(/\/surveys\/[^/]+$/, { timeout: 120_000 });
  await page.getByTestId('state-strip').waitFor({ timeout: 120_000 });
  return decodeURIComponent(new URL(page.url()).pathname.split('/').pop()!);
}

/** Opens the Contents form of one space (its button in the Contents section's list of spaces). */
export async function openContentsOf(page: Page, space: string): Promise<void> {
  await page.getByRole('navigation', { name: 'Workspace sections' }).getByRole('button', { name: 'Contents', exact: true }).click();
  await page.getByRole('list', { name: 'Compartment' }).getByRole('button', { name: space, exact: true }).click();
  await page.locator('input[name="layers.0.reading"]').waitFor();
}

/** Elements in the document now (what "DOM nodes" counts in the bench and the test). */
export function elementCount(page: Page): Promise<number> {
  return page.evaluate(() => document.getElementsByTagName('*').length);
}
