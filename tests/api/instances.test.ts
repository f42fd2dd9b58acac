/**
 * Item 8: two app instances on one PostgreSQL, as behind a load balancer. One device's pushes and
 * pulls alternate between them: every change is applied exactly once (a repeat sent to the other
 * instance is a duplicate), and neither instance ever answers from a stale copy (each keeps its
 * survey text and survey state caches, which must be checked against the stored revision).
 */
import { spawn, spawnSync } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { PushResponseSchema, SurveyDetailSchema, SurveyListResponseSchema, type SurveyChange } from '@shared/schemas/sync';
import { startTestApp, type TestApp } from '../support/app';
import { createOrgWithMembers, type TestOrg } from '../support/auth';
import { newSurvey, tokenFor } from '../support/surveys';
import { SimDevice } from '../support/sync-device';
import { freePort } from '../support/free-port';
import { ROOT_DIR } from '../../server/index';
import { ENGINE_VERSION } from '@shared/engine';
import { createResultsScheduler } from '../../server/services/results-scheduler';
import { docNeedingResults } from '../../server/db/repositories/surveys';

let a: TestApp;
let b: TestApp;
let org: TestOrg;
let surveyorToken: string;
/** A second editor of the surveyor's surveys (an engineer only reviews them: shared/review/editing.ts). */
let adminToken: string;

beforeAll(async () => {
  [a, b] = await Promise.all([startTestApp(), startTestApp()]);
  org = await createOrgWithMembers(a.db);
  surveyorToken = await tokenFor(a.config.JWT_SECRET, org.surveyor);
  adminToken = await tokenFor(a.config.JWT_SECRET, org.admin);
});
afterAll(async () => {
  await Promise.all([a?.close(), b?.close()]);
});

const auth = (token: string) => ({ authorization: `Bearer ${token}`, 'content-type': 'application/json' });

async function read(app: TestApp, id: string, token = surveyorToken) {
  const res = await fetch(`${app.url}/api/surveys/${id}`, { headers: auth(token) });
  expect(res.status).toBe(200);
  return SurveyDetailSchema.parse(await res.json());
}

async function listedTitle(app: TestApp, id: string): Promise<string | undefined> {
  const res = await fetch(`${app.url}/api/surveys?pageSize=100`, { headers: auth(surveyorToken) });
  return SurveyListResponseSchema.parse(await res.json()).items.find((s) => s.id === id)?.title;
}

async function pushRaw(app: TestApp, changes: SurveyChange[], token = surveyorToken) {
  const res = await fetch(`${app.url}/api/sync/push`, { method: 'POST', headers: auth(token), body: JSON.stringify({ changes }) });
  expect(res.status).toBe(200);
  return PushResponseSchema.parse(await res.json()).results;
}

describe('two instances on one database', () => {
  it('alternating one device between them: each change applied exactly once, no stale reads', async () => {
    const device = new SimDevice(a.url, surveyorToken);
    const survey = newSurvey({ title: 'Round 0' });
    device.create(survey);
    await device.sync();
    const rounds = 12;
    for (let i = 1; i <= rounds; i++) {
      const [pushTo, readFrom] = i % 2 ? [a, b] : [b, a];
      const title = `Round ${i}`;
      const change = device.edit(survey.id, { kind: 'set', path: 'title', value: title })!;
      device.baseUrl = pushTo.url;
      const pushed = await device.push();
      expect(pushed?.results.map((r) => r.status)).toEqual(['applied']);
      const revision = i + 1;
      expect(pushed?.results[0].revision).toBe(revision);

      // The same change sent again, to the other instance: recorded once, answered as a duplicate.
      const again = await pushRaw(readFrom, [change]);
      expect(again.map((r) => [r.status, r.revision])).toEqual([['duplicate', revision]]);

      // Both instances read the new revision, whatever they held before.
      for (const app of [readFrom, pushTo]) {
        const got = await read(app, survey.id);
        expect([got.revision, got.doc.title]).toEqual([revision, title]);
        expect(await listedTitle(app, survey.id)).toBe(title);
      }
      device.baseUrl = readFrom.url;
      await device.pull();
      expect(device.copies.get(survey.id)?.serverRevision).toBe(revision);
      expect(device.doc(survey.id)?.title).toBe(title);
    }
    const revisions = await a.db('survey_revisions').where({ survey_id: survey.id }).count<{ count: string }[]>('* as count');
    expect(Number(revisions[0].count)).toBe(rounds + 1);
    const records = await a.db('processed_changes').where({ device_id: device.deviceId }).count<{ count: string }[]>('* as count');
    expect(Number(records[0].count)).toBe(rounds + 1);
  });

  it('an instance whose remembered state went stale writes nothing from it: both people’s edits are kept', async () => {
    const surveyor = new SimDevice(a.url, surveyorToken);
    const admin = new SimDevice(b.url, adminToken);
    const survey = newSurvey({ title: 'Shared' });
    surveyor.create(survey);
    await surveyor.sync();
    // Instance A now remembers the survey as it wrote it (revision 2 after this edit).
    surveyor.edit(survey.id, { kind: 'set', path: 'casualtyDescription', value: 'Written first, on A' });
    await surveyor.push();
    admin.cursor = '0';
    await admin.pull();
    // Instance B writes revision 3; A does not know.
    admin.edit(survey.id, { kind: 'set', path: 'title', value: 'Set on B' });
    expect((await admin.push())?.results[0]).toMatchObject({ status: 'applied', revision: 3 });
    // A push to A from the remembered revision 2 must not overwrite B's title.
    surveyor.edit(survey.id, { kind: 'set', path: 'casualtyDescription', value: 'Written again, on A' });
    expect((await surveyor.push())?.results[0]).toMatchObject({ status: 'applied', revision: 4 });
    for (const app of [a, b]) {
      const got = await read(app, survey.id);
      expect([got.revision, got.doc.title, got.doc.casualtyDescription]).toEqual([4, 'Set on B', 'Written again, on A']);
    }
  });
});

describe('results computed after pushes, shared between instances', () => {
  it('an instance leaves a survey whose results another stored less than a gap ago, and asks again later; a flush does not wait', async () => {
    const survey = newSurvey({ title: 'Computed once per gap' });
    const device = new SimDevice(a.url, surveyorToken);
    device.create(survey);
    await device.sync();
    // Schedulers of our own, whose timers never fire in this test: only flush runs them.
    const errors: unknown[] = [];
    const onA = createResultsScheduler(a.db, (e) => errors.push(e), 600_000);
    const onB = createResultsScheduler(b.db, (e) => errors.push(e), 600_000);
    onA.schedule(survey.id);
    await onA.flush();
    const stored = async () => (await a.db('survey_results').where({ survey_id: survey.id, engine_version: ENGINE_VERSION }).pluck('revision')).sort();
    expect(await stored()).toContain(1);

    // A new revision, told to instance B: results were stored a moment ago, so within a gap B waits.
    device.edit(survey.id, { kind: 'set', path: 'title', value: 'Edited through B' });
    device.baseUrl = b.url;
    expect((await device.push())?.results[0]).toMatchObject({ status: 'applied', revision: 2 });
    const within = await docNeedingResults(b.db, survey.id, ENGINE_VERSION, 60_000);
    expect(within && 'waitMs' in within && within.waitMs).toBeGreaterThan(0);
    expect(within && 'waitMs' in within && within.waitMs).toBeLessThanOrEqual(60_000);
    // With no gap asked for, the new revision is handed out to compute.
    const now = await docNeedingResults(b.db, survey.id, ENGINE_VERSION, 0);
    expect(now && 'revision' in now && [now.revision, now.doc.title]).toEqual([2, 'Edited through B']);

    onB.schedule(survey.id);
    await onB.flush();
    expect(await stored()).toEqual(expect.arrayContaining([1, 2]));
    // Once the current revision has results, nothing is handed out, gap or not.
    expect(await docNeedingResults(a.db, survey.id, ENGINE_VERSION, 60_000)).toBeUndefined();
    expect(errors).toEqual([]);
  });
});

describe('WORKERS', () => {
  it('runs the production entry as that many server processes on one port, and stops them all', async () => {
    const port = await freePort();
    const proc = spawn(process.execPath, ['--import', 'tsx', path.join(ROOT_DIR, 'server/index.ts')], {
      cwd: ROOT_DIR,
      env: { ...process.env, ...inject('testEnv'), PORT: String(port), WORKERS: '2', LOG_LEVEL: 'silent' },
      stdio: ['ignore', 'ignore', 'inherit'],
    });
    const exited = new Promise<number | null>((resolve) => proc.once('exit', (code) => resolve(code)));
    try {
      let up = false;
      for (let i = 0; i < 600 && !up; i++) {
        up = await fetch(`http://127.0.0.1:${port}/api/health`).then((r) => r.ok, () => false);
        if (!up) await new Promise((r) => setTimeout(r, 100));
      }
      expect(up).toBe(true);
      const children = () => spawnSync('pgrep', ['-P', String(proc.pid), '-f', 'server/index.ts'], { encoding: 'utf8' }).stdout.trim().split('\n').filter(Boolean);
      // Both workers come up (the first may answer before the second listens).
      for (let i = 0; i < 300 && children().length < 2; i++) await new Promise((r) => setTimeout(r, 100));
      expect(children()).toHaveLength(2);
      const res = await fetch(`http://127.0.0.1:${port}/api/surveys`, { headers: auth(surveyorToken) });
      expect(res.status).toBe(200);
    } finally {
      proc.kill('SIGTERM');
    }
    expect(await exited).toBe(0);
  }, 120_000);
});
