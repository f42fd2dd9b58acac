/**
 * Sync through a bad link: a loopback proxy that, for 30% of sync requests, lets the server commit
 * and then either drops the response or delivers the request a second time. Five devices make 200
 * edits each to one survey, syncing as they go. At the end the server and every device hold the same
 * document, every edit was applied exactly once, and each device's own work is all there.
 */
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Survey } from '@shared/schemas/survey';
import { startTestApp, type TestApp } from '../support/app';
import { addMember, createOrgWithMembers } from '../support/auth';
import { newSurvey, tokenFor } from '../support/surveys';
import { SimDevice } from '../support/sync-device';
import { prng } from '../support/prng';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

interface LossyProxy {
  url: string;
  counts: { passed: number; dropped: number; duplicated: number };
  close: () => Promise<void>;
}

/** Forwards to `target`; for /api/sync/*, drops 15% of responses and sends 15% of requests twice, after the server answered. */
async function startLossyProxy(target: string, random: () => number): Promise<LossyProxy> {
  const upstream = new URL(target);
  const counts = { passed: 0, dropped: 0, duplicated: 0 };
  const forward = (req: http.IncomingMessage, body: Buffer) =>
    new Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }>((resolve, reject) => {
      const r = http.request(
        { host: upstream.hostname, port: upstream.port, method: req.method, path: req.url, headers: { ...req.headers, host: upstream.host } },
        (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => resolve({ status: res.statusCode ?? 502, headers: res.headers, body: Buffer.concat(chunks) }));
          res.on('error', reject);
        },
      );
      r.on('error', reject);
      r.end(body);
    });
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', async () => {
      const body = Buffer.concat(chunks);
      try {
        let answer = await forward(req, body);
        const roll = req.url?.startsWith('/api/sync/') ? random() : 1;
        if (roll < 0.15) {
          counts.dropped++;
          req.socket.destroy(); // the server committed; the device never hears
          return;
        }
        if (roll < 0.3) {
          counts.duplicated++;
          answer = await forward(req, body); // the same request delivered twice
        } else counts.passed++;
        // the body as the server sent it, so its encoding goes with it (API JSON is compressed)
        const encoding = answer.headers['content-encoding'];
        res.writeHead(answer.status, {
          'content-type': String(answer.headers['content-type'] ?? 'application/json'),
          ...(encoding ? { 'content-encoding': String(encoding) } : {}),
        });
        res.end(answer.body);
      } catch {
        req.socket.destroy();
      }
    });
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const port = (server.address() as { port: number }).port;
  return {
    url: `http://127.0.0.1:${port}`,
    counts,
    close: async () => {
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
    },
  };
}

describe('five devices syncing through a link that loses and repeats 30% of sync responses', () => {
  it('ends with identical documents, nothing lost and nothing applied twice', { timeout: 300_000 }, async () => {
    const random = prng(20261201);
    const org = await createOrgWithMembers(t.db);
    const proxy = await startLossyProxy(t.url, random);
    try {
      // editors of the survey the first one makes (an engineer only reviews a surveyor's survey: shared/review/editing.ts)
      const people = [org.surveyor, org.admin, await addMember(t.db, org.id, 'surveyor'), await addMember(t.db, org.id, 'surveyor'), await addMember(t.db, org.id, 'surveyor')];
      const devices = await Promise.all(people.map(async (p) => new SimDevice(proxy.url, await tokenFor(t.config.JWT_SECRET, p))));

      const survey = newSurvey();
      devices[0].create(survey);
      await devices[0].syncUntilDone();
      for (const d of devices.slice(1)) await d.syncUntilDone();

      /** What each device intends for its own fluids: density, or null when deleted. Nobody else edits them. */
      const intended = devices.map(() => new Map<string, number | null>());
      const EDITS = 200;

      await Promise.all(
        devices.map(async (d, di) => {
          const mine = intended[di];
          const own = () => [...mine.entries()].filter(([, v]) => v !== null).map(([k]) => k);
          for (let i = 0; i < EDITS; i++) {
            const roll = random();
            const existing = own();
            if (roll < 0.25 || existing.length === 0) {
              const id = `d${di}-f${i}`;
              const density = 800 + Math.round(random() * 200);
              d.edit(survey.id, { kind: 'upsert', collection: 'fluids', entity: { id, name: `Device ${di} fluid ${i}`, category: 'oil', densityKgM3: density } });
              mine.set(id, density);
            } else if (roll < 0.8) {
              const id = existing[Math.floor(random() * existing.length)];
              const doc = d.doc(survey.id)!;
              const current = doc.fluids.find((f) => f.id === id)!;
              const density = 800 + Math.round(random() * 200) + 0.5;
              if (d.edit(survey.id, { kind: 'upsert', collection: 'fluids', entity: { ...current, densityKgM3: density } })) mine.set(id, density);
            } else if (roll < 0.9) {
              const id = existing[Math.floor(random() * existing.length)];
              d.edit(survey.id, { kind: 'delete', collection: 'fluids', entityId: id });
              mine.set(id, null);
            } else {
              // A field every device edits: conflicts are expected and must be recorded, not lost.
              d.edit(survey.id, { kind: 'set', path: 'casualtyDescription', value: `Note ${di}.${i}` });
            }
            if (i % 10 === 9) await d.sync(25).catch(() => undefined);
          }
        }),
      );
      for (let round = 0; round < 2; round++) for (const d of devices) await d.syncUntilDone(100, 50);

      const server = (await t.db('surveys').where({ id: survey.id }).first('doc', 'revision')) as { doc: Survey; revision: number };
      // Identical everywhere.
      for (const d of devices) {
        expect(d.outbox).toHaveLength(0);
        expect(d.rejected).toEqual([]);
        expect(d.doc(survey.id)).toEqual(server.doc);
      }
      // Each device's own fluids are exactly what it meant: no edit lost.
      devices.forEach((_, di) => {
        for (const [id, density] of intended[di]) {
          const f = server.doc.fluids.find((x) => x.id === id);
          if (density === null) expect(f, id).toBeUndefined();
          else expect(f?.densityKgM3, id).toBe(density);
        }
      });
      // Every change processed exactly once, none applied twice.
      const made = devices.flatMap((d) => [...d.made.keys()]);
      const processed = await t.db('processed_changes').whereIn('device_id', devices.map((d) => d.deviceId)).select('change_id', 'status');
      expect(processed).toHaveLength(made.length);
      expect(new Set(processed.map((p) => p.change_id))).toEqual(new Set(made));
      expect(processed.filter((p) => p.status === 'rejected')).toEqual([]);
      const revisions = await t.db('survey_revisions').where({ survey_id: survey.id }).select('change_id', 'revision');
      expect(new Set(revisions.map((r) => r.change_id)).size).toBe(revisions.length);
      expect(revisions).toHaveLength(server.revision);
      // Conflicting notes were kept as conflicts, each with both values.
      const conflicts = await t.db('survey_conflicts').where({ survey_id: survey.id });
      for (const c of conflicts) expect(c.proposed).not.toEqual(c.kept);

      expect(proxy.counts.dropped).toBeGreaterThan(10);
      expect(proxy.counts.duplicated).toBeGreaterThan(10);
      console.info(
        `chaos: ${made.length} changes, ${server.revision} revisions, ${conflicts.length} conflicts; link: ${JSON.stringify(proxy.counts)}`,
      );
    } finally {
      await proxy.close();
    }
  });
});

