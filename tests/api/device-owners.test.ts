/**
 * F5: a device id belongs to the person who first pushed with it. Another member (of this firm or
 * another) pushing with it is refused 403 with a readable body, so the owner's real edit with the
 * same sequence number is applied, never answered "duplicate" and dropped. The change record's key
 * is (owner, device, seq).
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import { PushResponseSchema, type SurveyChange } from '@shared/schemas/sync';
import { pushAs, startWithTwoFirms, storedTitle, type TwoFirms } from '../support/two-firms';
import { storeSurvey } from '../support/surveys';

let f: TwoFirms;
beforeAll(async () => {
  f = await startWithTwoFirms();
});
afterAll(async () => {
  await f?.t.close();
});

const push = (token: string, changes: SurveyChange[]) => pushAs(f, token, changes);

/** A title edit from `deviceId` with sequence number `seq`. */
const titleEdit = (deviceId: string, seq: number, surveyId: string, title: string): SurveyChange => ({
  id: randomUUID(),
  deviceId,
  seq,
  surveyId,
  baseRevision: 1,
  createdAt: new Date().toISOString(),
  op: { kind: 'set', path: 'title', value: title },
});

async function pushed(token: string, changes: SurveyChange[]) {
  const res = await push(token, changes);
  expect(res.status, await res.clone().text()).toBe(200);
  return PushResponseSchema.parse(await res.json()).results;
}

async function refused(token: string, changes: SurveyChange[]) {
  const res = await push(token, changes);
  expect(res.status).toBe(403);
  const body = ErrorBodySchema.parse(await res.json());
  expect(body.error.code).toBe('forbidden');
  expect(body.error.message).toMatch(/device id that belongs to another person/);
  return body;
}

const titleOf = (id: string) => storedTitle(f, id);

describe('device ids are owned (F5)', () => {
  it('refuses a colleague pushing with the surveyor’s device id; the surveyor’s real edit with that seq is applied', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const device = randomUUID();
    expect((await pushed(f.tok.surveyor, [titleEdit(device, 1, survey.id, 'First')]))[0].status).toBe('applied');

    // The admin of the same firm (who may edit the survey) guesses the device id and its next sequence number.
    await refused(f.tok.admin, [titleEdit(device, 2, survey.id, 'Squatted')]);
    expect(await titleOf(survey.id)).toBe('First');
    expect(await f.t.db('processed_changes').where({ device_id: device, user_id: f.org.admin.id })).toHaveLength(0);

    const [real] = await pushed(f.tok.surveyor, [titleEdit(device, 2, survey.id, 'Second')]);
    expect(real.status).toBe('applied');
    expect(await titleOf(survey.id)).toBe('Second');
  });

  it('refuses another firm’s member pushing with the device id, whatever the survey', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const foreign = await storeSurvey(f.t.db, f.other.admin);
    const device = randomUUID();
    await pushed(f.tok.surveyor, [titleEdit(device, 1, survey.id, 'Ours')]);
    await refused(f.tok.otherAdmin, [titleEdit(device, 2, survey.id, 'Theirs')]);
    await refused(f.tok.otherAdmin, [titleEdit(device, 2, foreign.id, 'Their own survey')]);
    // One foreign device id in a push refuses the whole push: nothing of it is applied.
    await refused(f.tok.otherAdmin, [titleEdit(randomUUID(), 1, foreign.id, 'Mixed'), titleEdit(device, 3, foreign.id, 'Mixed too')]);
    expect(await titleOf(foreign.id)).not.toMatch(/Mixed|Their own/);
    expect((await pushed(f.tok.surveyor, [titleEdit(device, 2, survey.id, 'Ours again')]))[0].status).toBe('applied');
  });

  it('gives a device id to whoever pushed with it first, and each person their own', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const mine = randomUUID();
    const his = randomUUID();
    await pushed(f.tok.surveyor, [titleEdit(mine, 1, survey.id, 'Mine')]);
    // the admin, who may edit a surveyor's survey (an engineer only reviews it: shared/review/editing.ts)
    await pushed(f.tok.admin, [titleEdit(his, 1, survey.id, 'His')]);
    const owners = await f.t.db('devices').whereIn('id', [mine, his]).select('id', 'user_id', 'organisation_id');
    expect(Object.fromEntries(owners.map((o: { id: string; user_id: string }) => [o.id, o.user_id]))).toEqual({
      [mine]: f.org.surveyor.id,
      [his]: f.org.admin.id,
    });
    // Refused twice from the same server process: the owner it remembers still refuses.
    await refused(f.tok.admin, [titleEdit(mine, 2, survey.id, 'Not his')]);
    await refused(f.tok.surveyor, [titleEdit(his, 2, survey.id, 'Not hers')]);
  });

  it('keys a change record by its owner: another person’s record of the same device and seq is no duplicate', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const device = randomUUID();
    // A record left by someone else under this device id and seq (written before ownership existed).
    await f.t.db('processed_changes').insert({
      device_id: device,
      seq: 1,
      change_id: randomUUID(),
      organisation_id: f.org.id,
      survey_id: survey.id,
      user_id: f.org.engineer.id,
      status: 'applied',
      revision: 1,
    });
    const [r] = await pushed(f.tok.surveyor, [titleEdit(device, 1, survey.id, 'Kept')]);
    expect(r.status).toBe('applied');
    expect(await titleOf(survey.id)).toBe('Kept');
    const key = await f.t.db.raw(`
      SELECT array_agg(a.attname::text ORDER BY k.n) AS cols
        FROM pg_index i CROSS JOIN unnest(i.indkey) WITH ORDINALITY AS k(att, n)
        JOIN pg_attribute a ON a.attrelid = i.indrelid AND a.attnum = k.att
       WHERE i.indrelid = 'processed_changes'::regclass AND i.indisprimary`);
    expect(key.rows[0].cols).toEqual(['user_id', 'device_id', 'seq']);
  });

  it('answers a repeated push by the owner as duplicate, as before', async () => {
    const survey = await storeSurvey(f.t.db, f.org.surveyor);
    const c = titleEdit(randomUUID(), 1, survey.id, 'Once');
    expect((await pushed(f.tok.surveyor, [c]))[0].status).toBe('applied');
    expect((await pushed(f.tok.surveyor, [c]))[0].status).toBe('duplicate');
  });
});
