/**
 * Request-loop bench: `/api/health` p99 while the largest survey the format allows is recomputed
 * without pause — as the server does it (the results scheduler's task: the worker reads the stored
 * document, computes and stores the results; server/services/engine-worker.ts), then as last round
 * (document copied into the pool, results text back), then on the request loop, for comparison.
 * Goal: p99 < 50 ms as the server does it.
 * Run: npm run bench -- loop
 */
import { execFile } from 'node:child_process';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { pino } from 'pino';
import { computeSurvey, ENGINE_VERSION } from '@shared/engine';
import type { Boundary, Survey } from '@shared/schemas/survey';
import { SURVEY_LIMITS } from '@shared/schemas/limits';
import { SurveySchema } from '@shared/schemas/survey';
import { startTestStack } from '../tests/support/stack';
import { createApp } from '../server/app';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/knex';
import { closeEnginePool, computeInPool, recomputeStoredInPool } from '../server/services/engine-pool';
import { ROOT_DIR } from '../server/index';
import { createOrgWithMembers } from '../tests/support/auth';
import { storeSurvey } from '../tests/support/surveys';
import { generateVessel } from './bench-engine';

/** The 4,000-boundary bench vessel topped up with 1,000-vertex polygons to the survey's geometry cap. */
export function largestSurvey(): Survey {
  const s = generateVessel();
  const base = s.boundaries[s.boundaries.length - 1];
  // Counted as the schema counts them: polygon corners, 1 per circle, 4 per rectangle and per box.
  let points = s.compartments.length * 4 + s.boundaries.reduce((n, b) => n + (b.geometry.kind === 'polygon' ? b.geometry.vertices.length : b.geometry.kind === 'circle' ? 1 : 4), 0);
  const n = SURVEY_LIMITS.polygonVertices;
  const extra: Boundary[] = [];
  for (let k = 0; points + n <= SURVEY_LIMITS.geometryPoints; k++, points += n) {
    const x0 = 4 + (k % 38) * 4;
    const vertices = Array.from({ length: n }, (_, i) => {
      const a = (2 * Math.PI * i) / n;
      return { x: x0 + 1.5 * Math.cos(a), y: -9.5 + 0.001 * k, z: 6 + 4 * Math.sin(a) };
    });
    extra.push({ ...base, id: `be9c0000-0000-4000-9000-${k.toString(16).padStart(12, '0')}`, name: `Polygon ${k}`, geometry: { kind: 'polygon', vertices } });
  }
  return SurveySchema.parse({ ...s, boundaries: [...s.boundaries, ...extra] });
}

/**
 * `/api/health` latency from autocannon in a process of its own (so the load generator's work is not
 * on the server's loop), 10 connections for 10 s, while `busy` runs without pause.
 */
async function healthP99(url: string, busy: () => Promise<void>, label: string): Promise<void> {
  let stop = false;
  let runs = 0;
  const loop = (async () => {
    while (!stop) {
      await busy();
      runs++;
    }
  })();
  const bin = path.join(ROOT_DIR, 'node_modules', '.bin', 'autocannon');
  const out = await new Promise<string>((resolve, reject) => {
    execFile(bin, ['-j', '-c', '10', '-d', '10', `${url}/api/health`], { maxBuffer: 16 * 1024 * 1024 }, (err, stdout) => (err ? reject(err) : resolve(stdout)));
  });
  stop = true;
  await loop;
  const r = JSON.parse(out) as { latency: { p50: number; p99: number; max: number }; requests: { average: number }; non2xx: number };
  console.log(
    `${label}: /api/health p50 ${r.latency.p50} ms, p99 ${r.latency.p99} ms, max ${r.latency.max} ms, ${r.requests.average.toFixed(0)} requests/s, ` +
      `${r.non2xx} non-2xx; ${runs} recomputations; load average ${os.loadavg()[0].toFixed(1)}`,
  );
}

export async function main(): Promise<void> {
  const stack = await startTestStack('bench-loop');
  const db = createDb(stack.env.DATABASE_URL);
  const server = http.createServer(createApp({ db, config: loadConfig({ ...stack.env, PORT: '0' }), logger: pino({ level: 'silent' }) }));
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const url = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
  try {
    const doc = largestSurvey();
    const points = doc.boundaries.reduce((n, b) => n + (b.geometry.kind === 'polygon' ? b.geometry.vertices.length : 4), 0);
    console.log(`largest allowed survey: ${doc.boundaries.length} boundaries, about ${points.toLocaleString('en-GB')} geometry points`);
    const org = await createOrgWithMembers(db);
    const stored = await storeSurvey(db, org.surveyor, doc);
    const t0 = performance.now();
    await computeInPool(doc);
    console.log(`one recomputation in the pool (document copied in): ${(performance.now() - t0).toFixed(0)} ms`);
    // The server's path: a new revision, then the scheduler's task, read + compute + store in a worker.
    const recomputeStored = async () => {
      await db('surveys').where({ id: stored.id }).increment('revision', 1);
      await recomputeStoredInPool(stack.env.DATABASE_URL, stored.id, ENGINE_VERSION);
    };
    await healthP99(url, recomputeStored, 'stored survey read, computed and stored in the worker pool, as the server does (goal p99 < 50 ms)');
    await healthP99(url, async () => void (await computeInPool(doc)), 'document copied into the pool and results text back (last round)');
    await healthP99(
      url,
      () => new Promise<void>((resolve) => setImmediate(() => (computeSurvey(doc), resolve()))),
      'engine on the request loop (before the pool), for comparison',
    );
  } finally {
    server.closeAllConnections();
    server.close();
    await db.destroy();
    await closeEnginePool();
    await stack.stop();
  }
}

if (process.argv[1]?.endsWith('bench-loop.ts')) await main();
