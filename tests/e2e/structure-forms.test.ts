/**
 * The plating check and a rating by direction entered on a 390 px phone, offline: a hatch cover
 * over a pressed-up tank takes its plate thickness (a mistyped one is refused and kept), allowable
 * stress and a rating upwards and downwards; the Loads section must show the plating utilisation
 * and each rating's utilisation, with its direction, as the engine (shared/engine) gives them for
 * the same survey computed here. The hand check of the same figures (ρ g h on the cover, Roark /
 * Timoshenko coefficient 0.2874 for a square panel) is in tests/reference/check-rows.test.ts.
 */
import { describe, expect, it, inject } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { screenshotPath } from '../support/browser';
import { DEMO, section, signIn, startE2eFile } from '../support/e2e';
import { computeSurvey } from '@shared/engine';
import { SurveySchema, type Survey } from '@shared/schemas/survey';

const baseUrl = inject('baseUrl');

const file = startE2eFile();

/** A 2 m × 2 m hatch cover at z = 2 m over a tank pressed up to 1 m of head in its pipe (water at z = 3 m). */
function hatchSurvey(): Survey {
  const cond = crypto.randomUUID(), tank = crypto.randomUUID();
  return SurveySchema.parse({
    schemaVersion: 2,
    id: crypto.randomUUID(),
    title: 'Pressed-up tank under a hatch',
    casualtyDescription: 'Invented scenario for a test.',
    vessel: { name: 'Test Lighter 4', lbpM: 40, breadthM: 10, depthM: 4, draughtMarks: { aftXM: 0, forwardXM: 40 } },
    conditions: [
      {
        id: cond,
        time: '2026-12-02T06:00:00Z',
        drafts: { aftM: 1, forwardM: 1 },
        heelDeg: 0,
        seaDensityKgM3: 1025,
        contents: [{ compartmentId: tank, gas: { kind: 'vented' }, layers: [{ id: crypto.randomUUID(), fluidId: 'sea-water', level: { kind: 'point', point: { x: 1, y: 1, z: 3 } } }] }],
      },
    ],
    activeConditionId: cond,
    fluids: [],
    compartments: [{ id: tank, name: 'Fore peak tank', spaceType: 'tank', geometry: { kind: 'box', min: { x: 0, y: 0, z: 0 }, max: { x: 2, y: 2, z: 2 } } }],
    boundaries: [
      {
        id: crypto.randomUUID(),
        name: 'Tank hatch',
        kind: 'hatch-cover',
        geometry: { kind: 'rectangle', origin: { x: 0, y: 0, z: 2 }, edgeU: { x: 2, y: 0, z: 0 }, edgeV: { x: 0, y: 2, z: 0 } },
        sideA: { kind: 'compartment', compartmentId: tank },
        sideB: { kind: 'air' },
      },
    ],
  });
}

async function waitSaved(page: Page) {
  await page.waitForTimeout(300);
  await page.getByTestId('save-state').filter({ hasText: 'Saved on this device' }).first().waitFor({ timeout: 10_000 });
}

/** As the results views print a fraction (client/src/lib/unit-system.ts `percent`). */
const pct = (u: number) => `${(u * 100).toFixed(0)} %`;

describe('plating and ratings by direction, on a phone, offline', () => {
  it('are entered with field errors that keep what was typed, and their utilisations match the engine', async () => {
    const context = await file.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await signIn(page, DEMO.surveyor);
    await page.goto(`${baseUrl}/surveys`);
    await page.getByRole('heading', { name: 'Surveys' }).waitFor();
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
    await page.reload();
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), { timeout: 30_000 }).toBe(true);
    await context.setOffline(true);

    const doc = hatchSurvey();
    await page.getByTestId('import-input').setInputFiles({ name: 'hatch.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(doc)) });
    await page.getByTestId('workspace').waitFor();

    await section(page, 'Boundaries');
    await page.getByRole('list', { name: 'Boundaries' }).getByRole('button', { name: /Tank hatch/ }).click();
    const form = page.getByRole('form', { name: 'Plate Tank hatch' });

    // plating: switched on, a mistyped thickness refused and kept, then the real one
    await form.getByLabel('Check the plating (the whole plate as one panel)').check();
    const thick = form.getByLabel(/^Plate thickness/);
    await thick.fill('1o');
    await form.getByText('Enter a number, for example 12.5.').waitFor();
    await expect(thick.inputValue()).resolves.toBe('1o');
    await thick.fill('10');
    await form.getByLabel(/^Corrosion allowance/).fill('1');
    await form.getByLabel(/^Yield stress/).fill('235');
    await form.getByLabel(/^Allowable bending stress/).fill('0');
    await form.getByText(/Must be more than 0/).first().waitFor();
    await expect(form.getByLabel(/^Allowable bending stress/).inputValue()).resolves.toBe('0');
    await form.getByLabel(/^Allowable bending stress/).fill('141');

    // a rating upwards (towards the open air, side B) and downwards (towards the tank, side A)
    await form.getByLabel('Rated by direction').selectOption('pressure');
    await form.getByLabel(/^Rated pressure towards side B/).fill('15');
    await form.getByLabel(/^Rated pressure towards side A/).fill('50');
    await waitSaved(page);
    await form.getByTestId('plating-fields').scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('structure-form-plating-390'), fullPage: false });
    await form.getByTestId('directional-rating').scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('structure-form-ratings-390'), fullPage: false });

    // the same survey, with what was typed in SI, through the engine
    const typed: Survey = {
      ...doc,
      boundaries: [
        {
          ...doc.boundaries[0],
          plating: { thicknessM: 0.01, corrosionAllowanceM: 0.001, yieldStressPa: 235e6, allowableStressPa: 141e6, edges: 'simply-supported' },
          directionalCapacity: { kind: 'pressure', towardsB: 15e3, towardsA: 50e3 },
        },
      ],
    };
    const b = computeSurvey(typed).boundaries[0];
    const plating = b.plating!.maxUtilisation!;
    const up = b.capacities.find((c) => c.direction === 'towards-B')!;
    const down = b.capacities.find((c) => c.direction === 'towards-A')!;
    // the water pushes the cover up, towards the open air: the downward rating carries nothing
    expect(up.utilisation).toBeGreaterThan(0.5);
    expect(down.utilisation).toBe(0);

    await section(page, 'Loads');
    await page.getByTestId('boundary-results').getByRole('button', { name: /Tank hatch/ }).click();
    const detail = page.getByTestId('boundary-detail');
    // figures keep their unit on the line with a no-break space: compared as plain spaces
    const plain = async (l: Locator) => ((await l.textContent()) ?? '').replace(/[\u00a0\u202f]/g, ' ');
    await expect(plain(detail.getByTestId('plating-panel').first())).resolves.toContain(pct(plating));
    await expect(plain(detail.getByTestId('capacity-towards-B'))).resolves.toContain(`(${pct(up.utilisation)})`);
    await expect(plain(detail.getByTestId('capacity-towards-A'))).resolves.toContain('(0 %)');
    await detail.getByText('Rated pressure towards side B (Open air): pushing that way of rated').waitFor();
    await detail.getByText(/^Plating \(the whole plate as one panel\): 9\.0 mm net of corrosion allowance/).waitFor();
    await detail.getByTestId('plating-table').scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('structure-results-390'), fullPage: false });
    await context.close();
  });
});
