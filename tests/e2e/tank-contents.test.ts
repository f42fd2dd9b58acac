/**
 * A tank's own liquid entered on a 390 px phone, offline, in US units: a volume more than the tank
 * holds is refused and kept; the results then tell the tank's own oil from the flood water as the
 * engine does for the same survey, the ship totals carry a "Tanks' own liquid" tile, the all-liquid
 * centroid says where it is ("… ft fwd of AP"), and no fill percentage or density is split from its
 * unit; the signed net force and peak net pressure say which way is positive. The figures themselves are checked by hand statics in tests/reference/tank-contents.test.ts.
 */
import { describe, expect, it, inject } from 'vitest';
import { screenshotPath } from '../support/browser';
import { DEMO, section, signIn, startE2eFile, waitSaved } from '../support/e2e';
import { computeSurvey } from '@shared/engine';
import { tankWords } from '@shared/review/tank-words';
import { SurveySchema, type Survey } from '@shared/schemas/survey';

const baseUrl = inject('baseUrl');

const file = startE2eFile();

/** A 10 × 10 × 4 m double-bottom tank open to the sea at 3 m draft, beside a dry void. */
function tankSurvey(): Survey {
  const cond = crypto.randomUUID(), tank = crypto.randomUUID(), voidSpace = crypto.randomUUID();
  return SurveySchema.parse({
    schemaVersion: 2,
    id: crypto.randomUUID(),
    title: 'Holed fuel tank',
    casualtyDescription: 'Invented scenario for a test.',
    vessel: { name: 'Test Lighter 7', lbpM: 40, breadthM: 10, depthM: 6, draughtMarks: { aftXM: 0, forwardXM: 40 } },
    conditions: [{ id: cond, time: '2026-12-02T06:00:00Z', drafts: { aftM: 3, forwardM: 3 }, heelDeg: 0, seaDensityKgM3: 1025, contents: [] }],
    activeConditionId: cond,
    fluids: [],
    compartments: [
      { id: tank, name: 'No. 1 DB tank', spaceType: 'tank', openToSea: true, geometry: { kind: 'box', min: { x: 0, y: -5, z: 0 }, max: { x: 10, y: 5, z: 4 } } },
      { id: voidSpace, name: 'Void', spaceType: 'void', geometry: { kind: 'box', min: { x: 10, y: -5, z: 0 }, max: { x: 20, y: 5, z: 4 } } },
    ],
    boundaries: [
      {
        id: crypto.randomUUID(),
        name: 'Tank end bulkhead',
        kind: 'bulkhead',
        geometry: { kind: 'polygon', vertices: [{ x: 10, y: -5, z: 0 }, { x: 10, y: 5, z: 0 }, { x: 10, y: 5, z: 4 }, { x: 10, y: -5, z: 4 }] },
        sideA: { kind: 'compartment', compartmentId: tank },
        sideB: { kind: 'compartment', compartmentId: voidSpace },
      },
    ],
  });
}

describe("a tank's own liquid, on a phone, offline, in US units", () => {
  it('is entered with a field error that keeps what was typed, and the results split it from the flood water as the engine does', async () => {
    const context = await file.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await signIn(page, DEMO.surveyor);
    await page.goto(`${baseUrl}/surveys`);
    await page.getByRole('heading', { name: 'Surveys' }).waitFor();
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
    await page.reload();
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), { timeout: 30_000 }).toBe(true);
    await context.setOffline(true);

    const doc = tankSurvey();
    await page.getByTestId('import-input').setInputFiles({ name: 'tank.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(doc)) });
    await page.getByTestId('workspace').waitFor();
    await page.getByRole('group', { name: 'Units' }).first().getByRole('button', { name: 'US' }).click();

    await section(page, 'Spaces');
    await page.getByRole('list', { name: 'Compartments' }).getByRole('button', { name: /No\. 1 DB tank/ }).click();
    const form = page.getByRole('form', { name: 'Compartment No. 1 DB tank' });
    await form.getByLabel('The tank held').selectOption('part-full');
    await form.getByLabel('Its own liquid', { exact: true }).selectOption('dma');
    // the tank holds 0.95 × 400 m³ = 380 m³ = 13,420 ft³ (1 ft³ = 0.028316846592 m³): 20,000 ft³ is refused and kept
    const volume = form.getByLabel(/^Volume of its own liquid/);
    await volume.fill('20000');
    await form.getByText(/More than the tank holds: 1342\d ft³/).waitFor();
    await expect(volume.inputValue()).resolves.toBe('20000');
    // 95 m³ of its own diesel in ft³
    const ownFt3 = 95 / 0.028316846592;
    await volume.fill(ownFt3.toFixed(3));
    await waitSaved(page);
    await form.getByLabel('The tank held').scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('tank-contents-form-390'), fullPage: false });

    const typed: Survey = { ...doc, compartments: [{ ...doc.compartments[0], tankContents: { state: 'part-full', fluidId: 'dma', volumeM3: Number(ownFt3.toFixed(3)) * 0.028316846592 } }, doc.compartments[1]] };
    const r = computeSurvey(typed);
    const tank = r.compartments[0].tank!;
    expect(tank.ownVolumeM3).toBeCloseTo(95, 3);

    await section(page, 'Loads');
    const table = page.getByTestId('compartment-results');
    await expect(table.getByTestId('tank-split').textContent()).resolves.toBe(tankWords(tank, 'us'));
    await expect(page.getByTestId('total-tank-contents').textContent()).resolves.toMatch(/ LT$/);
    await expect(page.getByTestId('total-centroid').textContent()).resolves.toMatch(/^\d+(\.\d+)? ft fwd of AP$/);
    // signed loads say which way + is: the net force and the peak net pressure both push towards side B
    const heads = await page.getByTestId('boundary-results').locator('th').allTextContents();
    expect(heads.filter((h) => /\+ towards side B/.test(h))).toEqual([expect.stringMatching(/^Net force, \+ towards side B \(kip\)/), expect.stringMatching(/^Peak net pressure, \+ towards side B \(psi\)/)]);
    // every percentage and density in the table sits on one line with its unit
    const split = await table.evaluate((el) =>
      [...el.querySelectorAll('td')]
        .filter((td) => /%$|lb\/ft³\)/.test(td.textContent ?? ''))
        .flatMap((td) => [...td.querySelectorAll('span.whitespace-nowrap'), ...(td.textContent?.endsWith('%') ? [td] : [])])
        .filter((node) => {
          const range = document.createRange();
          range.selectNodeContents(node);
          return new Set([...range.getClientRects()].map((rect) => Math.round(rect.top))).size > 1;
        })
        .map((node) => node.textContent),
    );
    expect(split).toEqual([]);
    await table.scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('tank-contents-results-390'), fullPage: false });
    await context.close();
  });
});
