/**
 * Survey format version 2 on the server: the migration upgrades stored version 1 documents (and
 * devices pull them again), a device still on version 1 can create a survey, and a version 1
 * document written meanwhile by an older server reads as version 2. Common practice, no source.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PushResponseSchema, SurveyDetailSchema } from '@shared/schemas/sync';
import type { Survey } from '@shared/schemas/survey';
import { up } from '../../migrations/20261203001500_survey_format_v2';
import { startTestApp, type TestApp } from '../support/app';
import { createOrgWithMembers, type TestOrg } from '../support/auth';
import { change, newSurvey, storeSurvey, tokenFor } from '../support/surveys';

let t: TestApp;
let org: TestOrg;
let token: string;

beforeAll(async () => {
  t = await startTestApp();
  org = await createOrgWithMembers(t.db);
  token = await tokenFor(t.config.JWT_SECRET, org.surveyor);
});
afterAll(async () => {
  await t?.close();
});

const h = () => ({ authorization: `Bearer ${token}`, 'content-type': 'application/json' });
const asV1 = (id: string) =>
  t.db.raw(`UPDATE surveys SET doc = jsonb_set(doc::jsonb, '{schemaVersion}', '1')::json WHERE id = ?`, [id]);
const stored = async (id: string) =>
  (await t.db('surveys').where({ id }).first('doc', 'revision', t.db.raw('change_xid::text AS xid'))) as { doc: Survey; revision: number; xid: string };

describe('survey format version 2', () => {
  it('the migration upgrades a stored version 1 document in place and devices pull it again', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    await asV1(s.id);
    const before = await stored(s.id);
    expect(before.doc.schemaVersion).toBe(1);
    await up(t.db);
    const after = await stored(s.id);
    expect(after.doc.schemaVersion).toBe(2);
    expect({ ...after.doc, schemaVersion: 1 }).toEqual(before.doc);
    expect(after.revision).toBe(before.revision);
    expect(BigInt(after.xid)).toBeGreaterThan(BigInt(before.xid));
  });

  it('a version 1 document an older server wrote reads as version 2', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    await asV1(s.id);
    const res = await fetch(`${t.url}/api/surveys/${s.id}`, { headers: h() });
    expect(res.status).toBe(200);
    expect(SurveyDetailSchema.parse(await res.json()).doc.schemaVersion).toBe(2);
  });

  it('a device still on version 1 creates a survey; it is stored as version 2', async () => {
    const doc = { ...newSurvey(), schemaVersion: 1 } as unknown as Survey;
    const c = change(crypto.randomUUID(), doc.id, { kind: 'create', survey: doc });
    const res = await fetch(`${t.url}/api/sync/push`, { method: 'POST', headers: h(), body: JSON.stringify({ changes: [c] }) });
    expect(res.status, await res.clone().text()).toBe(200);
    expect(PushResponseSchema.parse(await res.json()).results[0].status).toBe('applied');
    expect((await stored(doc.id)).doc.schemaVersion).toBe(2);
  });
});
