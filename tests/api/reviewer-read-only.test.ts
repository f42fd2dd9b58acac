/**
 * The engineer reviews the surveyor's survey and never changes its figures (shared/review/editing.ts).
 * The workspace showed such a survey read-only, but the server took the engineer's edits all the
 * same: a push or a photo upload from the engineer to a survey someone else made now answers 403
 * with a sentence, and nothing of it is written or stored. The engineer still edits a survey of
 * their own, sends a survey for review, and works at the desk; the admin and surveyors edit any.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import { PushResponseSchema, type SurveyChange } from '@shared/schemas/sync';
import { pushAs, startWithTwoFirms, storedTitle, type TwoFirms } from '../support/two-firms';
import { authHeader } from '../support/auth';
import { change, newSurvey, storeSurvey } from '../support/surveys';
import { makePng } from '../support/photos';

let f: TwoFirms;
beforeAll(async () => {
  f = await startWithTwoFirms();
});
afterAll(async () => {
  await f?.t.close();
});

const push = (token: string, changes: SurveyChange[]) => pushAs(f, token, changes);

const titleOf = (id: string) => storedTitle(f, id);

async function expectRefused(res: Response): Promise<void> {
  expect(res.status).toBe(403);
  const body = ErrorBodySchema.parse(await res.json());
  expect(body.error.code).toBe('forbidden');
  expect(body.error.message).toMatch(/You review this survey: its figures are the surveyor’s/);
}

describe('the engineer is read-only on the surveyor’s survey', () => {
  it('refuses the engineer’s edit of the surveyor’s survey with 403 and a sentence; nothing is written', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const device = randomUUID();
    await expectRefused(await push(f.tok.engineer, [change(device, survey.id, { kind: 'set', path: 'title', value: 'Changed by the reviewer' }, 1)]));
    expect(await titleOf(survey.id)).toBe(survey.title);
    expect(await f.t.db('processed_changes').where({ device_id: device })).toHaveLength(0);
    expect(((await f.t.db('surveys').where({ id: survey.id }).first('revision')) as { revision: number }).revision).toBe(1);
  });

  it('refuses a whole push that edits the surveyor’s survey beside the engineer’s own', async () => {
    const theirs = await storeSurvey(f.t.db, f.org.surveyor);
    const own = newSurvey();
    const device = randomUUID();
    const created = await (await push(f.tok.engineer, [change(device, own.id, { kind: 'create', survey: own })])).json();
    expect(PushResponseSchema.parse(created).results[0].status).toBe('applied');
    await expectRefused(
      await push(f.tok.engineer, [
        change(device, own.id, { kind: 'set', path: 'title', value: 'Own, edited' }, 1),
        change(device, theirs.id, { kind: 'set', path: 'title', value: 'Theirs, edited' }, 1),
      ]),
    );
    expect([await titleOf(own.id), await titleOf(theirs.id)]).toEqual([own.title, theirs.title]);
  });

  it('lets the engineer edit a survey of their own, and send the surveyor’s survey for review', async () => {
    const own = await storeSurvey(f.t.db, f.org.engineer);
    const device = randomUUID();
    const edited = PushResponseSchema.parse(await (await push(f.tok.engineer, [change(device, own.id, { kind: 'set', path: 'title', value: 'Own, edited' }, 1)])).json());
    expect(edited.results[0].status).toBe('applied');
    expect(await titleOf(own.id)).toBe('Own, edited');

    const theirs = await storeSurvey(f.t.db, f.org.surveyor);
    const sent = PushResponseSchema.parse(await (await push(f.tok.engineer, [change(device, theirs.id, { kind: 'submit' }, 1)])).json());
    expect(sent.results[0].status).toBe('applied');
    expect(((await f.t.db('surveys').where({ id: theirs.id }).first('status')) as { status: string }).status).toBe('submitted');
  });

  it('lets the admin and another surveyor edit the surveyor’s survey', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const res = PushResponseSchema.parse(await (await push(f.tok.admin, [change(randomUUID(), survey.id, { kind: 'set', path: 'title', value: 'By the admin' }, 1)])).json());
    expect(res.results[0].status).toBe('applied');
    expect(await titleOf(survey.id)).toBe('By the admin');
  });

  it('takes the role from the database: a surveyor made engineer since their token was issued is refused, one made surveyor is not', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const role = (who: string, r: string) => f.t.db('memberships').where({ user_id: who, organisation_id: f.org.id }).update({ role: r });
    await role(f.org.engineer.id, 'surveyor');
    try {
      const res = PushResponseSchema.parse(await (await push(f.tok.engineer, [change(randomUUID(), survey.id, { kind: 'set', path: 'title', value: 'As a surveyor' }, 1)])).json());
      expect(res.results[0].status).toBe('applied');
    } finally {
      await role(f.org.engineer.id, 'engineer');
    }
    await expectRefused(await push(f.tok.engineer, [change(randomUUID(), survey.id, { kind: 'set', path: 'title', value: 'As an engineer' }, 2)]));
  });

  it('refuses the engineer’s photo of the surveyor’s survey with 403, and stores nothing', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const id = randomUUID();
    const form = new FormData();
    form.set('surveyId', survey.id);
    form.set('entityKind', 'survey');
    form.set('entityId', survey.id);
    form.set('caption', 'Forward bulkhead');
    form.set('file', new Blob([new Uint8Array(makePng())], { type: 'image/png' }), 'photo.png');
    await expectRefused(await fetch(`${f.t.url}/api/photos/${id}`, { method: 'PUT', headers: authHeader(f.tok.engineer), body: form }));
    expect(await f.t.db('photos').where({ id })).toHaveLength(0);
    // the surveyor's own upload of the same photo goes through
    const ok = await fetch(`${f.t.url}/api/photos/${id}`, { method: 'PUT', headers: authHeader(f.tok.surveyor), body: form });
    expect(ok.status).toBe(201);
  });
});
