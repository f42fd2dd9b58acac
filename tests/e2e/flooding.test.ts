/**
 * Flooding on the phone, offline: the surveyor opens the demo survey, loses the signal, enters a
 * breach and a pump in the steering gear flat, and reads a time-to-limit that matches the engine's
 * forecast of the same document computed here. Bad input gets a field error that keeps what was typed.
 */
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, screenshotPath } from '../support/browser';
import { forecastFlooding } from '@shared/engine';
import { hmm } from '@shared/api/cautions';
import { DEMO, localDoc, signIn } from '../support/e2e';

const baseUrl = inject('baseUrl');
const DEMO_SURVEY_ID = '5eed0000-0000-4000-8000-000000000001';
const STEERING = '5eed0000-0000-4000-8000-000000000011';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('flooding forecast on the phone, offline', () => {
  it('enters a breach and a pump and reads the time-to-limit the engine gives', async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await signIn(page, DEMO.surveyor);
    await page.goto(`${baseUrl}/surveys/${DEMO_SURVEY_ID}?s=flooding`);
    await page.getByTestId('flooding-section').waitFor({ timeout: 60_000 });
    // the app is held by its service worker, then the signal goes
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker.ready.then(() => true)), { timeout: 30_000 }).toBe(true);
    await page.reload();
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), { timeout: 30_000 }).toBe(true);
    await context.setOffline(true);
    await page.getByTestId('flooding-section').waitFor({ timeout: 30_000 });

    await page.getByLabel('Space', { exact: true }).first().selectOption(STEERING);
    const breach = page.getByRole('form', { name: 'Add a breach' });
    await breach.getByLabel('Centre y').fill('-8');
    await breach.getByLabel('Centre z').fill('3.5');
    // a negative size is refused under its field, and what was typed stays
    await breach.getByLabel('Diameter').fill('-0.2');
    await breach.getByRole('button', { name: '+ Add breach' }).click();
    await breach.getByText('Must be more than 0.').waitFor({ timeout: 10_000 });
    expect(await breach.getByLabel('Diameter').inputValue()).toBe('-0.2');
    await breach.getByLabel('Diameter').fill('0.2');
    await breach.getByRole('button', { name: '+ Add breach' }).click();
    await expect.poll(async () => (await localDoc(page, DEMO_SURVEY_ID)).compartments.find((c) => c.id === STEERING)?.breaches?.length ?? 0).toBe(1);

    const pump = page.getByRole('form', { name: 'Add a pump' });
    await pump.getByLabel('Pump').fill('Portable pump');
    await pump.getByLabel(/Capacity/).fill('50');
    // a suction above the space (8 m high) is refused
    await pump.getByLabel(/Suction above the bottom/).fill('20');
    await pump.getByRole('button', { name: '+ Add pump' }).click();
    await pump.getByText(/Above the space/).waitFor({ timeout: 10_000 });
    expect(await pump.getByLabel(/Suction above the bottom/).inputValue()).toBe('20');
    await pump.getByLabel(/Suction above the bottom/).fill('0.2');
    await pump.getByRole('button', { name: '+ Add pump' }).click();
    await expect.poll(async () => (await localDoc(page, DEMO_SURVEY_ID)).compartments.find((c) => c.id === STEERING)?.pumps?.length ?? 0).toBe(1);

    // a plan step with no pump chosen is refused
    const plan = page.getByRole('form', { name: 'Add a plan step' });
    await plan.getByRole('button', { name: '+ Add step' }).click();
    await plan.getByText('Choose a pump of this survey.').waitFor({ timeout: 10_000 });

    // the time-to-limit on screen matches the engine's forecast of the document on the device
    const doc = await localDoc(page, DEMO_SURVEY_ID);
    const f = forecastFlooding(doc);
    const later = f.limits.find((l) => l.atS > 0);
    expect(later, 'a boundary reaches its limit after the readings').toBeDefined();
    const row = page.getByTestId('limits-table').locator(`tr[data-boundary-id="${later!.boundaryId}"]`);
    await expect.poll(() => row.getByTestId('limit-hmm').textContent(), { timeout: 20_000 }).toBe(hmm(later!.atS));
    expect(await page.getByTestId('forecast-caution').textContent()).toContain('New soundings replace it');
    await page.getByTestId('forecast-chart').waitFor({ timeout: 20_000 });
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
    await page.screenshot({ path: screenshotPath('flooding-390'), fullPage: true });

    // soundings out of time order are refused (No. 2 hold's log ends 07:30 UTC)
    await page.getByLabel('Space', { exact: true }).first().selectOption('5eed0000-0000-4000-8000-00000000000d');
    const sounding = page.getByRole('form', { name: 'Add a sounding' });
    await sounding.getByLabel('Ship’s time').fill('2025-03-14T01:00');
    await sounding.getByLabel(/Sounding/).fill('3.7');
    await sounding.getByRole('button', { name: '+ Add sounding' }).click();
    await sounding.getByText(/Out of time order/).waitFor({ timeout: 10_000 });
    expect(await sounding.getByLabel(/Sounding/).inputValue()).toBe('3.7');
    await context.close();
  }, 240_000);
});
