/**
 * The ship's response on a 390 px phone, offline: a box barge survey (an older version 1 file) is
 * imported, says its response is not computed, takes particulars for a box-shaped vessel (refusing a
 * negative draft and a missing value while keeping what was typed, warning but keeping KM below KG),
 * then a starboard wing tank is flooded by a sounding; the draft, heel and GM shown must match the
 * box-barge closed forms worked out here (KB = T/2, BM = B²/12T, free surface ρ·l·b³/12,
 * tan φ = w·y / (Δ·GM_fluid); standard ship-stability texts, e.g. Barrass & Derrett).
 */
import { describe, expect, it, inject } from 'vitest';
import { screenshotPath } from '../support/browser';
import { formatNumber } from '@shared/units/units';
import { DEMO, offlineReady, section, signIn, startE2eFile, waitSaved } from '../support/e2e';

const baseUrl = inject('baseUrl');

const file = startE2eFile();

// The barge: L = 60 m, B = 12 m, D = 5 m, floating at 2.00 m with KG 3.00 m in sea water of 1025 kg/m³.
// The wing tank: x 20–30 m, 4 m wide from the starboard side (y −6 to −2 m), full depth, permeability 1.
const L = 60, B = 12, T0 = 2, KG0 = 3, RHO = 1025;
const tank = { xa: 20, xf: 30, ya: -6, yb: -2 };
const SOUNDING = 3; // m above the tank bottom, upright: the water stands 3 m deep (the form starts at half height, 2.5 m)

function bargeFile(): string {
  const id = crypto.randomUUID(), cond = crypto.randomUUID(), comp = crypto.randomUUID();
  return JSON.stringify({
    schemaVersion: 1,
    id,
    title: 'Barge wing tank holed',
    casualtyDescription: 'Invented scenario for a test.',
    vessel: { name: 'Box Barge 7', lbpM: L, breadthM: B, depthM: 5, draughtMarks: { aftXM: 0, forwardXM: L } },
    conditions: [{ id: cond, time: '2026-12-02T06:00:00Z', drafts: { aftM: T0, forwardM: T0 }, heelDeg: 0, seaDensityKgM3: RHO, contents: [] }],
    activeConditionId: cond,
    fluids: [],
    compartments: [
      {
        id: comp,
        name: 'Wing tank 3 S',
        spaceType: 'tank',
        permeability: 1,
        geometry: { kind: 'box', min: { x: tank.xa, y: tank.ya, z: 0 }, max: { x: tank.xf, y: tank.yb, z: 5 } },
      },
    ],
    boundaries: [],
  });
}

/** The response by hand from the box closed forms. */
function expected() {
  const l = tank.xf - tank.xa, b = tank.yb - tank.ya;
  const d0 = RHO * L * B * T0;
  const w = RHO * l * b * SOUNDING;
  const yw = (tank.ya + tank.yb) / 2, zw = SOUNDING / 2;
  const d = d0 + w;
  const T = d / (RHO * L * B);
  const km = T / 2 + (B * B) / (12 * T);
  const kg = (d0 * KG0 + w * zw) / d;
  const fsc = (RHO * l * b ** 3) / 12 / d;
  const gmFluid = km - kg - fsc;
  // heel: the weight is to starboard (y < 0), so starboard goes down (positive heel)
  const heelDeg = (Math.atan((-w * yw) / (d * gmFluid)) * 180) / Math.PI;
  return { T, gmFluid, heelDeg };
}

describe('the ship’s response on a phone, offline', () => {
  it('box barge particulars, a flooded wing tank, and draft, heel and GM as the closed forms give them', async () => {
    const context = await file.browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await signIn(page, DEMO.surveyor);
    await page.goto(`${baseUrl}/surveys`);
    await page.getByRole('heading', { name: 'Surveys' }).waitFor();
    await offlineReady(page);
    await context.setOffline(true);

    await page.getByTestId('import-input').setInputFiles({ name: 'barge.json', mimeType: 'application/json', buffer: Buffer.from(bargeFile()) });
    await page.getByTestId('workspace').waitFor();

    await section(page, 'Stability');
    // a survey without particulars works as before and says the response is not computed
    await page.getByTestId('response-not-computed').waitFor();
    await section(page, 'Loads');
    await page.getByTestId('attitude-in-use').filter({ hasText: 'Predicted attitude not computed' }).waitFor();
    await section(page, 'Stability');

    const form = page.getByRole('form', { name: 'Hydrostatic particulars' });
    await form.getByLabel('Particulars from').selectOption('box');
    await expect(form.getByLabel(/^Length/).inputValue()).resolves.toBe('60');
    await form.getByLabel(/^Draft \(intact\)/).fill('-2');
    await form.getByLabel(/^KG/).fill('3');
    await page.getByText('Draft must be more than zero').waitFor();
    await expect(form.getByLabel(/^Draft \(intact\)/).inputValue()).resolves.toBe('-2');
    await expect(form.getByLabel(/^KG/).inputValue()).resolves.toBe('3');
    await form.getByLabel(/^Draft \(intact\)/).fill('');
    await form.getByText('Required: enter a value.').first().waitFor();
    await expect(form.getByLabel(/^KG/).inputValue()).resolves.toBe('3');
    await page.getByTestId('response-not-computed').waitFor();
    // KM below KG: a warning, not a refusal (box at 2 m: KM = 1 + 144/24 = 7 m)
    await form.getByLabel(/^Draft \(intact\)/).fill('2');
    await form.getByLabel(/^KG/).fill('7.5');
    await waitSaved(page);
    await page.getByText(/KM 7\.00 m is below KG 7\.50 m/).waitFor();
    await form.getByLabel(/^KG/).fill(String(KG0));
    await waitSaved(page);
    await expect(page.getByText(/is below KG/).count()).resolves.toBe(0);

    // flood the wing tank by a sounding
    await section(page, 'Contents');
    await page.getByRole('button', { name: 'Wing tank 3 S', exact: true }).click();
    await page.getByRole('button', { name: 'Enter contents of Wing tank 3 S' }).click();
    await page.getByLabel(/^Sounding \(/).fill(String(SOUNDING));
    await waitSaved(page);

    await section(page, 'Stability');
    const e = expected();
    await expect(page.getByTestId('predicted-mean-draft').textContent()).resolves.toBe(formatNumber(e.T, 4));
    await expect(page.getByTestId('predicted-heel').textContent()).resolves.toBe(`${Math.abs(e.heelDeg).toFixed(1)}° stbd`);
    await expect(page.getByTestId('gm-fluid').textContent()).resolves.toBe(`${formatNumber(e.gmFluid, 4)} m`);
    await page.getByTestId('stability-caution').waitFor();
    await page.screenshot({ path: screenshotPath('stability-box-barge-390'), fullPage: true });

    await section(page, 'Loads');
    await page.getByTestId('attitude-in-use').filter({ hasText: `The model predicts heel ${Math.abs(e.heelDeg).toFixed(1)}° stbd` }).waitFor();
    await context.close();
  });
});
