/**
 * Flooding on the phone, offline: the surveyor opens the demo survey, loses the signal, enters a
 * breach and a pump in the steering gear flat, and reads a time-to-limit that matches the engine's
 * forecast of the same document computed here. Bad input gets a field error that keeps what was typed.
 */
import { describe, expect, it, inject } from 'vitest';
import { screenshotPath } from '../support/browser';
import { forecastFlooding } from '@shared/engine';
import { hmm } from '@shared/api/cautions';
import { durationWords } from '@shared/review/forecast-words';
import { formatShipTime } from '@shared/review/time-words';
import { DEMO, localDoc, makeChangesIfAsked, signIn, startE2eFile } from '../support/e2e';

const baseUrl = inject('baseUrl');
const DEMO_SURVEY_ID = '5eed0000-0000-4000-8000-000000000001';
const STEERING = '5eed0000-0000-4000-8000-000000000011';

const file = startE2eFile();

describe('flooding forecast on the phone, offline', () => {
  it('enters a breach and a pump and reads the time-to-limit the engine gives', async () => {
    const context = await file.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await signIn(page, DEMO.surveyor);
    await page.goto(`${baseUrl}/surveys/${DEMO_SURVEY_ID}?s=flooding`);
    await page.getByTestId('flooding-section').waitFor({ timeout: 60_000 });
    // the app is held by its service worker, then the signal goes
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker.ready.then(() => true)), { timeout: 30_000 }).toBe(true);
    await page.reload();
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), { timeout: 30_000 }).toBe(true);
    await makeChangesIfAsked(page);
    await context.setOffline(true);
    await page.getByTestId('flooding-section').waitFor({ timeout: 30_000 });

    await page.getByLabel('Space', { exact: true }).first().selectOption(STEERING);
    const breach = page.getByRole('form', { name: 'Add a breach' });
    // a new breach starts empty (nothing that could pass for a reading): every field is typed
    expect(await breach.getByLabel('Centre x').inputValue()).toBe('');
    await breach.getByLabel('Centre x').fill('8');
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
    // said in ship's time (the demo's clock is UTC+01:00), as the brief says it
    expect(await row.locator('td').first().textContent()).toBe(formatShipTime(new Date(Date.parse(f.readingsTime) + later!.atS * 1000), doc.vessel.shipTimeOffsetMin!));
    expect(await page.getByTestId('forecast-caution').textContent()).toContain('New soundings replace it');

    // a what if composed on the same screen: the new pump stopped and the new breach reduced to 0.01 m²
    const whatIf = page.getByRole('form', { name: 'Add a change to the what if' });
    const portable = doc.compartments.find((c) => c.id === STEERING)!.pumps![0];
    const hole = doc.compartments.find((c) => c.id === STEERING)!.breaches![0];
    await whatIf.getByLabel('Change').selectOption('pump-stopped');
    await whatIf.getByLabel('Pump').selectOption(portable.id);
    await whatIf.getByRole('button', { name: '+ Add to the what if' }).click();
    await whatIf.getByLabel('Change').selectOption('breach-reduced');
    await whatIf.getByLabel('Breach').selectOption(hole.id);
    // a negative area is refused under its field, and what was typed stays
    await whatIf.getByLabel(/Area left open/).fill('-0.01');
    await whatIf.getByRole('button', { name: '+ Add to the what if' }).click();
    await whatIf.getByText('Must not be negative.').waitFor({ timeout: 10_000 });
    expect(await whatIf.getByLabel(/Area left open/).inputValue()).toBe('-0.01');
    await whatIf.getByLabel(/Area left open/).fill('0.01');
    await whatIf.getByRole('button', { name: '+ Add to the what if' }).click();
    const wf = forecastFlooding(doc, {
      variant: [
        { kind: 'pump-stopped', pumpId: portable.id },
        { kind: 'breach-reduced', breachId: hole.id, remainingFraction: 0.01 / hole.areaM2 },
      ],
    });
    const wl = wf.limits[0];
    await expect.poll(() => page.getByTestId('what-if-nearest').textContent(), { timeout: 20_000 }).toContain(wl ? (wl.atS === 0 ? 'already over' : `(in ${durationWords(wl.atS)})`) : 'no boundary reaches its limit');
    await page.getByTestId('forecast-chart').first().waitFor({ timeout: 20_000 });
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
    await page.screenshot({ path: screenshotPath('flooding-390'), fullPage: true });

    // soundings out of time order are refused (No. 2 hold's log ends about an hour before the demo was seeded)
    await page.getByLabel('Space', { exact: true }).first().selectOption('5eed0000-0000-4000-8000-00000000000d');
    const sounding = page.getByRole('form', { name: 'Add a sounding' });
    const hold = () => localDoc(page, DEMO_SURVEY_ID).then((d) => d.compartments.find((c) => c.id === '5eed0000-0000-4000-8000-00000000000d')!.soundingLog!);
    const lastReading = Date.parse((await hold()).readings.at(-1)!.time);
    await sounding.getByLabel(/Time of the reading/).fill('2025-03-14T01:00');
    await sounding.getByLabel(/Sounding/).fill('3.7');
    await sounding.getByRole('button', { name: '+ Add sounding' }).click();
    await sounding.getByText(/Out of time order/).waitFor({ timeout: 10_000 });
    expect(await sounding.getByLabel(/Sounding/).inputValue()).toBe('3.7');
    expect(await sounding.getByLabel(/Time of the reading/).inputValue()).toBe('2025-03-14T01:00');
    // a later ship's time (UTC+01:00), typed as the ship's log writes it (24 h), is taken and stored as UTC
    const nextReading = new Date(lastReading + 75 * 60_000);
    const shipClock = new Date(nextReading.getTime() + 60 * 60_000).toISOString();
    await sounding.getByLabel(/Time of the reading/).fill(`${shipClock.slice(0, 10)} ${shipClock.slice(11, 16)}`);
    await sounding.getByRole('button', { name: '+ Add sounding' }).click();
    await expect.poll(async () => (await hold()).readings.at(-1)?.time).toBe(nextReading.toISOString());
    // the pipe is editable; a bottom outside the space is refused and kept
    const pipe = page.getByRole('form', { name: 'Sounding pipe' });
    await pipe.getByLabel(/Pipe bottom z/).fill('-30');
    await pipe.getByRole('button', { name: 'Save pipe' }).click();
    await pipe.getByText(/Outside the space/).waitFor({ timeout: 10_000 });
    expect(await pipe.getByLabel(/Pipe bottom z/).inputValue()).toBe('-30');
    await pipe.getByLabel(/Pipe x/).fill('85.5');
    await pipe.getByLabel(/Pipe bottom z/).fill(String((await hold()).pipe.bottomZM));
    await pipe.getByRole('button', { name: 'Save pipe' }).click();
    await expect.poll(async () => (await hold()).pipe.x).toBe(85.5);
    await page.screenshot({ path: screenshotPath('flooding-sounding-390'), fullPage: true });
    await context.close();
  }, 240_000);
});
