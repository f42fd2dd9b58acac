/**
 * The server killed (SIGKILL) at random moments while a device pushes, then started again: the
 * device retries, the survey converges, every change is applied once, and no revision is ever
 * half-written (each revision has its change record, the survey's revision counter matches them).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Survey } from '@shared/schemas/survey';
import { ROOT } from '../support/stack';
import { freePort } from '../support/free-port';
import { startTestApp, type TestApp } from '../support/app';
import { createOrgWithMembers } from '../support/auth';
import { newSurvey, tokenFor } from '../support/surveys';
import { SimDevice } from '../support/sync-device';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

interface Child {
  proc: ChildProcess;
  url: string;
}

/** The real server entry (server/index.ts) as its own process group, so SIGKILL takes all of it. */
async function startServerProcess(port: number): Promise<Child> {
  const proc = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: { ...process.env, ...inject('testEnv'), PORT: String(port), LOG_LEVEL: 'silent' },
    stdio: ['ignore', 'ignore', 'pipe'],
    detached: true,
  });
  let stderr = '';
  proc.stderr?.on('data', (d: Buffer) => (stderr += d.toString()));
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 300; i++) {
    if (proc.exitCode !== null) throw new Error(`server exited early: ${stderr}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) return { proc, url };
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`server did not start: ${stderr}`);
}

async function kill(child: Child): Promise<void> {
  if (child.proc.exitCode !== null || child.proc.signalCode !== null) return;
  const exited = new Promise((r) => child.proc.once('exit', r));
  process.kill(-child.proc.pid!, 'SIGKILL');
  await exited;
}

async function processedCount(deviceId: string): Promise<number> {
  const row = (await t.db('processed_changes').where({ device_id: deviceId }).count('* as n').first()) as { n: number };
  return Number(row.n);
}

describe('the server killed mid-push', () => {
  it('converges after restarts with no partial revision', { timeout: 300_000 }, async () => {
    const org = await createOrgWithMembers(t.db);
    const port = await freePort();
    let child = await startServerProcess(port);
    const device = new SimDevice(child.url, await tokenFor(t.config.JWT_SECRET, org.surveyor));
    const survey = newSurvey();
    device.create(survey);
    for (let i = 0; i < 600; i++) {
      const boundary = survey.boundaries[i % survey.boundaries.length];
      if (i % 2 === 0) device.edit(survey.id, { kind: 'upsert', collection: 'fluids', entity: { id: `crash-${i}`, name: `Fluid ${i}`, category: 'oil', densityKgM3: 850 + i / 10 } });
      else device.edit(survey.id, { kind: 'upsert', collection: 'boundaries', entity: { ...boundary, notes: `Check ${i}` } });
    }
    const total = device.outbox.length;

    let killedMidPush = 0;
    try {
      for (let round = 0; round < 5 && device.outbox.length > 0; round++) {
        const before = device.outbox.length;
        const committed = await processedCount(device.deviceId);
        // Small batches, so the outbox takes many pushes to drain and a kill lands mid-stream.
        const pushing = device.sync(10).then(
          () => 'done',
          () => 'failed',
        );
        // Kill once the server has committed at least one more batch of this round, at a random
        // moment after that: between batches, inside a transaction, or while answering.
        const deadline = Date.now() + 30_000;
        while ((await processedCount(device.deviceId)) <= committed && Date.now() < deadline) await new Promise((r) => setTimeout(r, 5));
        await new Promise((r) => setTimeout(r, Math.random() * 40));
        await kill(child);
        if ((await pushing) === 'failed') killedMidPush++;
        expect(device.outbox.length).toBeLessThanOrEqual(before);
        await assertNoPartialRevision(survey.id);
        child = await startServerProcess(port);
      }
      await device.syncUntilDone();
    } finally {
      await kill(child);
    }

    expect(killedMidPush).toBeGreaterThan(0);
    const server = (await t.db('surveys').where({ id: survey.id }).first('doc', 'revision')) as { doc: Survey; revision: number };
    expect(device.doc(survey.id)).toEqual(server.doc);
    const processed = await t.db('processed_changes').where({ device_id: device.deviceId }).select('change_id', 'status');
    expect(processed).toHaveLength(total);
    expect(new Set(processed.map((p) => p.change_id))).toEqual(new Set(device.made.keys()));
    expect(processed.every((p) => p.status === 'applied')).toBe(true);
    await assertNoPartialRevision(survey.id);
    expect(server.revision).toBe(total);
    console.info(`crash: ${total} changes, ${killedMidPush} pushes cut by SIGKILL, final revision ${server.revision}`);
  });
});

/** Revisions 1..n, each with its applied change record, and the survey row at n. */
async function assertNoPartialRevision(surveyId: string): Promise<void> {
  const row = await t.db('surveys').where({ id: surveyId }).first('revision');
  if (!row) return; // not created yet: nothing at all was written
  const revisions = await t.db('survey_revisions').where({ survey_id: surveyId }).orderBy('revision').select('revision', 'change_id');
  expect(revisions.map((r) => r.revision)).toEqual(Array.from({ length: row.revision }, (_, i) => i + 1));
  const records = await t.db('processed_changes').where({ survey_id: surveyId }).whereNot({ status: 'rejected' }).select('change_id', 'revision');
  const byChange = new Map(records.map((r) => [r.change_id, r.revision]));
  for (const r of revisions) expect(byChange.get(r.change_id)).toBe(r.revision);
  expect(records).toHaveLength(revisions.length);
}
