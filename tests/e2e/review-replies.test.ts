/**
 * The surveyor answers the engineer from the phone with no signal: the reply waits in the device's
 * outbox like any edit, reaches the desk once the link returns, and each thread shows its state
 * (open, answered, resolved) on the phone at 390 px and at the desk at 1440 px.
 */
import { randomUUID } from 'node:crypto';
import { z } from 'zod';
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_USERS } from '../../seeds/demo-people';
import { screenshotPath } from '../support/browser';
import { seriousA11yViolations } from '../support/axe';
import { newSurvey, tokenFor } from '../support/surveys';
import { SimDevice } from '../support/sync-device';
import { call, callAs, signIn, startE2eFile } from '../support/e2e';
import { ReviewCommentSchema } from '@shared/api/review';

const baseUrl = inject('baseUrl');
const env = inject('testEnv');
const SURVEYOR = DEMO_USERS.find((u) => u.role === 'surveyor' && u.email.endsWith('skerrow.example'))!;
const ENGINEER = DEMO_USERS.find((u) => u.role === 'engineer')!;
const QUESTION = 'What is the sounding in No. 2 hold now?';
const ANSWER = `6.40 m at 0600, taken twice (${randomUUID().slice(0, 4)}).`;

const e2e = startE2eFile();


const Comments = z.object({ comments: ReviewCommentSchema.pick({ body: true, parentId: true, authorName: true }).array() });

const syncState = (page: Page) => page.getByTestId('sync-status').getAttribute('data-state');

describe('replies to the reviewer', () => {
  it('a reply written offline reaches the desk, and the thread goes open → answered → resolved', async () => {
    // A survey under review with the engineer's question on it, made through the API.
    const surveyorToken = await tokenFor(env.JWT_SECRET, { ...SURVEYOR, id: SURVEYOR.id, orgId: SURVEYOR.orgId });
    const engineerToken = await tokenFor(env.JWT_SECRET, { ...ENGINEER, id: ENGINEER.id, orgId: ENGINEER.orgId });
    const device = new SimDevice(baseUrl, surveyorToken);
    const survey = newSurvey({ title: `Replies check ${randomUUID().slice(0, 6)}` });
    device.create(survey);
    await device.sync();
    await call(surveyorToken, 'POST', `/api/surveys/${survey.id}/status`, { to: 'submitted' });
    await call(engineerToken, 'POST', `/api/surveys/${survey.id}/status`, { to: 'in_review' });
    const question = await callAs(ReviewCommentSchema.pick({ id: true }), engineerToken, 'POST', `/api/review/surveys/${survey.id}/comments`, { target: { kind: 'survey', id: survey.id }, body: QUESTION });

    const phoneCtx = await e2e.browser.newContext({ viewport: { width: 390, height: 844 } });
    const phone = await phoneCtx.newPage();
    const deskCtx = await e2e.browser.newContext({ viewport: { width: 1440, height: 900 } });
    const desk = await deskCtx.newPage();
    try {
      await signIn(phone, SURVEYOR, `/surveys/${survey.id}`);
      await phone.getByTestId('workspace').waitFor({ timeout: 30_000 });
      await expect.poll(() => syncState(phone), { timeout: 45_000 }).toBe('synced');
      const notesToggle = phone.getByText(/Reviewer’s notes \(/);
      await notesToggle.waitFor({ timeout: 30_000 });
      await notesToggle.click();
      const thread = phone.getByTestId('review-note-comment').filter({ hasText: QUESTION });
      await expect.poll(() => thread.getAttribute('data-thread-state'), { timeout: 20_000 }).toBe('open');

      // No signal: the reply is kept on the device and counted as waiting.
      await phoneCtx.setOffline(true);
      await thread.getByRole('button', { name: 'Reply' }).click();
      await thread.getByLabel('Your reply').fill(ANSWER);
      await thread.getByRole('button', { name: 'Send reply' }).click();
      await thread.getByTestId('local-reply').filter({ hasText: ANSWER }).waitFor();
      await expect(thread.getByTestId('local-reply').getAttribute('data-state')).resolves.toBe('pending');
      await expect.poll(() => thread.getAttribute('data-thread-state')).toBe('answered');
      await expect.poll(() => phone.getByTestId('sync-status').getAttribute('data-pending')).toBe('1');
      await phone.screenshot({ path: screenshotPath('reply-offline-waiting-390'), fullPage: true });
      expect(await seriousA11yViolations(phone)).toEqual([]);
      const before = (await callAs(Comments, engineerToken, 'GET', `/api/review/surveys/${survey.id}/comments`)).comments;
      expect(before.map((c) => c.body)).not.toContain(ANSWER);

      // The link returns: the reply goes with the next sync and comes back as a comment.
      await phoneCtx.setOffline(false);
      await expect.poll(() => syncState(phone), { timeout: 30_000 }).toBe('synced');
      await expect.poll(() => thread.getByTestId('local-reply').count(), { timeout: 30_000 }).toBe(0);
      await thread.getByText(ANSWER).waitFor();
      const after = (await callAs(Comments, engineerToken, 'GET', `/api/review/surveys/${survey.id}/comments`)).comments;
      expect(after.filter((c) => c.body === ANSWER)).toEqual([expect.objectContaining({ parentId: question.id, authorName: SURVEYOR.name })]);

      // At the desk: the thread reads "Answered"; the engineer resolves it.
      await signIn(desk, ENGINEER, `/review/${survey.id}`);
      await desk.getByTestId('review-desk').waitFor({ timeout: 30_000 });
      const deskThread = desk.getByTestId('comment-list').locator('li').filter({ hasText: QUESTION });
      await deskThread.getByText(ANSWER).waitFor({ timeout: 20_000 });
      await expect(deskThread.getAttribute('data-thread-state')).resolves.toBe('answered');
      await desk.screenshot({ path: screenshotPath('reply-desk-answered-1440'), fullPage: true });
      expect(await seriousA11yViolations(desk)).toEqual([]);
      await deskThread.getByRole('button', { name: 'Mark resolved' }).click();
      await expect.poll(() => deskThread.getAttribute('data-thread-state'), { timeout: 20_000 }).toBe('resolved');

      // The phone hears of it on its next sync.
      await phone.reload();
      await phone.getByText(/Reviewer’s notes \(/).click();
      const resolved = phone.getByTestId('review-note-comment').filter({ hasText: QUESTION });
      await expect.poll(() => resolved.getAttribute('data-thread-state'), { timeout: 45_000 }).toBe('resolved');
      await expect(resolved.getByRole('button', { name: 'Reply' }).count()).resolves.toBe(0);
      await phone.screenshot({ path: screenshotPath('reply-resolved-390'), fullPage: true });
    } finally {
      await phoneCtx.close();
      await deskCtx.close();
    }
  });
});
