/**
 * Accepted means accepted, on a 390 px phone: the surveyor opening an accepted survey is told a
 * change sends it back for review and cannot type until they choose to; offline, the edit and
 * "Send for review" wait in the outbox and are carried out, in order, when the link returns. The
 * desk then lists the change in plain words, and the master's brief keeps the accepted figures
 * with a notice.
 */
import { randomUUID } from 'node:crypto';
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { IssueBriefResponseSchema, ReviewBundleSchema } from '@shared/api/review';
import { SurveySummarySchema } from '@shared/schemas/sync';
import { screenshotPath } from '../support/browser';
import { seriousA11yViolations } from '../support/axe';
import { call, callAs, DEMO, signIn, startE2eFile } from '../support/e2e';
import { newSurvey, tokenFor } from '../support/surveys';
import { SimDevice } from '../support/sync-device';

const baseUrl = inject('baseUrl');
const env = inject('testEnv');
const SURVEYOR = DEMO.surveyor;
const ENGINEER = DEMO.engineer;

const file = startE2eFile();

const Status = SurveySummarySchema.pick({ status: true });
const statusOf = async (token: string, id: string) => (await callAs(Status, token, 'GET', `/api/surveys/${id}`)).status;

const syncState = (page: Page) => page.getByTestId('sync-status').getAttribute('data-state');

describe('editing an accepted survey', () => {
  it('warns before the first edit, and queues the edit and “Send for review” offline', async () => {
    const surveyorToken = await tokenFor(env.JWT_SECRET, SURVEYOR);
    const engineerToken = await tokenFor(env.JWT_SECRET, ENGINEER);
    // An accepted survey, made through the API: sent by the surveyor, accepted by the engineer.
    const device = new SimDevice(baseUrl, surveyorToken);
    const survey = newSurvey({ title: `Accepted check ${randomUUID().slice(0, 6)}` });
    device.create(survey);
    await device.sync();
    await call(surveyorToken, 'POST', `/api/surveys/${survey.id}/status`, { to: 'submitted' });
    await call(engineerToken, 'POST', `/api/surveys/${survey.id}/status`, { to: 'in_review' });
    await call(engineerToken, 'PUT', `/api/review/surveys/${survey.id}/verdicts`, { scope: 'survey', verdict: 'proceed_within_limits' });
    await call(engineerToken, 'POST', `/api/surveys/${survey.id}/status`, { to: 'accepted' });
    const brief = await callAs(IssueBriefResponseSchema.pick({ url: true }), engineerToken, 'POST', `/api/review/surveys/${survey.id}/briefs`, { recipientEmail: `master-${randomUUID().slice(0, 6)}@ship.example`, expiresInHours: 24, units: 'si' });
    const active = survey.conditions.find((c) => c.id === survey.activeConditionId)!;
    const aftBefore = active.drafts.aftM!;
    const aftAfter = Math.round((aftBefore + 0.1) * 1000) / 1000;

    const ctx = await file.browser.newContext({ viewport: { width: 390, height: 844 } });
    const phone = await ctx.newPage();
    const deskCtx = await file.browser.newContext({ viewport: { width: 1440, height: 900 } });
    const desk = await deskCtx.newPage();
    // a busy shared host can take a while over a page load or the sign-in's redirect: every wait is
    // tied to a condition, with room to spare, rather than to a fixed sleep
    for (const c of [ctx, deskCtx]) c.setDefaultTimeout(60_000);
    try {
      await signIn(phone, SURVEYOR, `/surveys/${survey.id}?s=readings`);
      await phone.getByTestId('workspace').waitFor({ timeout: 90_000 });
      await expect.poll(() => syncState(phone), { timeout: 90_000 }).toBe('synced');

      // Told before anything can be changed: the fields are read-only until "Make changes".
      const guard = phone.getByTestId('reviewed-guard');
      await guard.waitFor({ timeout: 60_000 });
      await expect(guard.getAttribute('data-locked')).resolves.toBe('true');
      await expect(guard.textContent()).resolves.toContain('This survey was accepted; a change sends it back for review.');
      const aft = phone.getByLabel(/^Aft( \(|$)/);
      await expect(aft.isDisabled()).resolves.toBe(true);
      await phone.screenshot({ path: screenshotPath('accepted-guard-locked-390'), fullPage: true });
      expect(await seriousA11yViolations(phone)).toEqual([]);

      await phone.getByRole('button', { name: 'Make changes' }).click();
      await expect.poll(() => guard.getAttribute('data-locked'), { timeout: 30_000 }).toBe('false');
      await expect(aft.isDisabled()).resolves.toBe(false);

      // No signal on deck: a new aft draft and "Send for review" are kept on the phone.
      await ctx.setOffline(true);
      await aft.fill(String(aftAfter));
      await phone.getByTestId('save-state').filter({ hasText: 'Saved on this device' }).first().waitFor({ timeout: 30_000 });
      const status = phone.getByTestId('survey-review-status');
      await expect.poll(() => status.getAttribute('data-status'), { timeout: 30_000 }).toBe('changed_since_review');
      await phone.getByRole('button', { name: 'Send for review again' }).click();
      const assumptions = phone.getByRole('button', { name: 'Send for review with these assumptions' });
      if (await assumptions.isVisible()) await assumptions.click();
      await phone.getByTestId('submit-queued').waitFor({ timeout: 30_000 });
      await expect(phone.getByTestId('submit-queued').textContent()).resolves.toContain('when the link returns');
      await expect.poll(() => phone.getByTestId('sync-status').getAttribute('data-pending'), { timeout: 30_000 }).toBe('2');
      await phone.screenshot({ path: screenshotPath('accepted-edit-queued-offline-390'), fullPage: true });
      expect(await statusOf(engineerToken, survey.id)).toBe('accepted');

      // The link returns: the edit, then the send, are carried out.
      await ctx.setOffline(false);
      await expect.poll(() => syncState(phone), { timeout: 90_000 }).toBe('synced');
      await expect.poll(() => statusOf(engineerToken, survey.id), { timeout: 30_000 }).toBe('submitted');
      await expect.poll(() => status.getAttribute('data-status'), { timeout: 60_000 }).toBe('submitted');
      const review = await callAs(ReviewBundleSchema.pick({ events: true, sinceReview: true }), engineerToken, 'GET', `/api/review/surveys/${survey.id}`);
      expect(review.events.map((e) => e.to).slice(-2)).toEqual(['changed_since_review', 'submitted']);
      expect(review.sinceReview).toMatchObject({ revision: 1, reviewed: 'accepted', documentKept: true });

      // The desk: exactly what changed since the accepted revision.
      await signIn(desk, ENGINEER, `/review/${survey.id}`);
      const since = desk.getByTestId('since-review');
      await since.waitFor({ timeout: 90_000 });
      const line = await desk.getByTestId('since-review-lines').textContent();
      expect(line).toMatch(new RegExp(`Draft aft( \\([^)]*\\))?: ${aftBefore} m → ${aftAfter} m`));
      await desk.screenshot({ path: screenshotPath('accepted-desk-changes-1440'), fullPage: true });
      expect(await seriousA11yViolations(desk)).toEqual([]);

      // The master's brief on a phone: the accepted figures, and a notice that newer ones exist.
      const master = await ctx.newPage();
      await master.goto(`${baseUrl}${new URL(brief.url).pathname}`);
      await master.locator('[data-notice="newer-figures"]').waitFor({ timeout: 60_000 });
      await expect(master.getByTestId('reviewed-line').textContent()).resolves.toMatch(/survey revision 1 \(the survey is now at revision 2, not reviewed\)/);
      await master.screenshot({ path: screenshotPath('accepted-brief-newer-figures-390'), fullPage: true });
    } finally {
      await ctx.close();
      await deskCtx.close();
    }
  }, 480_000);
});
