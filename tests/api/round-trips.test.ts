/**
 * What each request of the sync bench's mix (`npm run bench -- sync`) costs in PostgreSQL round
 * trips, once the app is warm: the survey list in both of the bench's forms, one survey, and a push of
 * one upsert. Every query of the app's process goes through node-postgres's `Client#query` (knex's
 * and `runNamed`'s alike), so counting its calls counts the round trips. A change that adds one
 * to a hot route makes this fail: say why in DEVELOPERS.md ("Server performance") and change the count.
 */
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newSurvey, change } from '../support/surveys';
import { pushAs, startWithTwoFirms, type TwoFirms } from '../support/two-firms';
import { authHeader } from '../support/auth';

let f: TwoFirms;
const texts: string[] = [];
const realQuery = pg.Client.prototype.query;

beforeAll(async () => {
  f = await startWithTwoFirms();
  pg.Client.prototype.query = function (this: pg.Client, ...args: unknown[]) {
    const q = args[0] as string | { text?: string; name?: string };
    texts.push(typeof q === 'string' ? q : (q.name ?? q.text ?? '?'));
    return (realQuery as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof realQuery;
});
afterAll(async () => {
  pg.Client.prototype.query = realQuery;
  await f?.t.close();
});

/** The queries a call made (its answer read whole), after the background work of earlier calls is done. */
async function queriesOf(call: () => Promise<Response>): Promise<string[]> {
  await new Promise((r) => setTimeout(r, 50));
  texts.length = 0;
  const res = await call();
  expect(res.status).toBe(200);
  await res.arrayBuffer();
  return [...texts];
}

describe('round trips per request of the sync mix (warm)', () => {
  const device = randomUUID();
  let surveyId = '';
  let revision = 1;
  const get = (path: string) => () => fetch(`${f.t.url}${path}`, { headers: authHeader(f.tok.surveyor) });
  const pushOne = (n: number) => () =>
    pushAs(f, f.tok.surveyor, [
      change(device, surveyId, { kind: 'upsert', collection: 'fluids', entity: { id: `rt-${n}`, name: `Fluid ${n}`, category: 'oil', densityKgM3: 850 + n } }, revision++),
    ]);

  it('warms up: a survey made by push, read, listed and edited', async () => {
    const s = newSurvey({ title: 'Round trips' });
    surveyId = s.id;
    expect((await pushAs(f, f.tok.surveyor, [change(device, s.id, { kind: 'create', survey: s })])).status).toBe(200);
    for (let i = 0; i < 3; i++) {
      await queriesOf(get('/api/surveys?pageSize=25'));
      await queriesOf(get(`/api/surveys/${surveyId}`));
      await queriesOf(pushOne(i));
    }
  });

  it('the list, both forms: one query each', async () => {
    expect(await queriesOf(get('/api/surveys?pageSize=25'))).toHaveLength(1);
    expect(await queriesOf(get('/api/surveys?sort=title&order=asc&pageSize=10'))).toHaveLength(1);
  });

  it('one survey: one query', async () => {
    expect(await queriesOf(get(`/api/surveys/${surveyId}`))).toHaveLength(1);
  });

  it('a push of one upsert to a survey this process last wrote: one query', async () => {
    const q = await queriesOf(pushOne(10));
    expect(q, q.join('\n')).toHaveLength(1);
  });
});
