/**
 * F7: bad input answers 4xx with a readable body, never 500. Each case here answered 500 before:
 * NUL characters in seven text fields (and the photo's bytes were left in storage), a pull cursor
 * whose id part is not a UUID, a sequence number past PostgreSQL's integer, a 200,000-deep JSON
 * value and a multipart body cut short.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import { startTestApp, type TestApp } from '../support/app';
import { authHeader, createOrgWithMembers, type TestOrg } from '../support/auth';
import { change, newSurvey, storeSurvey, tokenFor } from '../support/surveys';
import { surveyInStatus } from '../support/review';
import { makePng } from '../support/photos';
import { createS3PhotoStorage, type PhotoStorage } from '../../server/storage/photo-store';

let t: TestApp;
let org: TestOrg;
const tok: Record<'surveyor' | 'engineer', string> = { surveyor: '', engineer: '' };
/** Keys the app put into photo storage and has not deleted since. */
const storedKeys = new Set<string>();

beforeAll(async () => {
  t = await startTestApp(
    {},
    {
      storage: (config): PhotoStorage => {
        const s3 = createS3PhotoStorage(config);
        return {
          get: (key) => s3.get(key),
          put: async (key, body, type) => {
            await s3.put(key, body, type);
            storedKeys.add(key);
          },
          delete: async (key) => {
            await s3.delete(key);
            storedKeys.delete(key);
          },
        };
      },
    },
  );
  org = await createOrgWithMembers(t.db);
  tok.surveyor = await tokenFor(t.config.JWT_SECRET, org.surveyor);
  tok.engineer = await tokenFor(t.config.JWT_SECRET, org.engineer);
});
afterAll(async () => {
  await t?.close();
});

const NUL = 'Hold 2\u0000 forward';

async function send(method: string, path: string, token: string, body?: unknown): Promise<{ status: number; code: string; text: string }> {
  const res = await fetch(`${t.url}${path}`, {
    method,
    headers: { ...authHeader(token), ...(body !== undefined ? { 'content-type': 'application/json' } : {}) },
    body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
  });
  const text = await res.text();
  const parsed = ErrorBodySchema.safeParse(JSON.parse(text || '{}'));
  return { status: res.status, code: parsed.success ? parsed.data.error.code : '', text };
}

/** A 4xx with the API's error body, whose words mention `mention` when given. */
function expectRefused(r: { status: number; code: string; text: string }, mention?: RegExp) {
  expect(r.status, r.text).toBeGreaterThanOrEqual(400);
  expect(r.status, r.text).toBeLessThan(500);
  expect(r.code).not.toBe('');
  if (mention) expect(r.text).toMatch(mention);
}

describe('NUL characters in text', () => {
  it('survey title, by create and by push', async () => {
    expectRefused(await send('POST', '/api/surveys', tok.surveyor, { survey: newSurvey({ title: NUL }) }), /NUL/);
    const s = newSurvey({ title: NUL });
    const pushed = await send('POST', '/api/sync/push', tok.surveyor, { changes: [change(randomUUID(), s.id, { kind: 'create', survey: s })] });
    expectRefused(pushed, /title/);
  });

  it('comment', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    expectRefused(await send('POST', `/api/review/surveys/${s.id}/comments`, tok.engineer, { target: { kind: 'survey', id: s.id }, body: NUL }), /body/);
  });

  it('verdict note', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    expectRefused(await send('PUT', `/api/review/surveys/${s.id}/verdicts`, tok.engineer, { scope: 'survey', verdict: 'proceed', note: NUL }), /note/);
  });

  it('limit text', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    expectRefused(await send('POST', `/api/review/surveys/${s.id}/limits`, tok.engineer, { rule: { kind: 'text' }, text: NUL }), /text/);
  });

  it('status note', async () => {
    const s = await surveyInStatus(t.db, org, 'in_review');
    expectRefused(await send('POST', `/api/surveys/${s.id}/status`, tok.engineer, { to: 'returned', note: NUL }), /note/);
  });

  it('profile name', async () => {
    expectRefused(await send('PATCH', '/api/me', tok.surveyor, { name: NUL }), /name/);
  });

  it('photo caption, leaving nothing in storage', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    const f = new FormData();
    f.set('surveyId', s.id);
    f.set('entityKind', 'survey');
    f.set('entityId', s.id);
    f.set('caption', NUL);
    f.set('file', new Blob([new Uint8Array(makePng())], { type: 'image/png' }), 'photo.png');
    const before = storedKeys.size;
    const res = await fetch(`${t.url}/api/photos/${randomUUID()}`, { method: 'PUT', headers: authHeader(tok.surveyor), body: f });
    const text = await res.text();
    expectRefused({ status: res.status, code: ErrorBodySchema.parse(JSON.parse(text)).error.code, text }, /caption/);
    expect(storedKeys.size, 'photo bytes left in storage without a row').toBe(before);
  });
});

describe('sync edge values', () => {
  it('a pull cursor whose id part is not a UUID', async () => {
    expectRefused(await send('GET', `/api/sync/pull?cursor=${encodeURIComponent(`1:1:${'-'.repeat(36)}`)}`, tok.surveyor), /cursor/);
    expectRefused(await send('GET', `/api/sync/pull?cursor=${'9'.repeat(40)}`, tok.surveyor), /cursor/);
  });

  it('a sequence number of 2^31 or more', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    const c = { ...change(randomUUID(), s.id, { kind: 'set', path: 'title', value: 'Renamed' }, 1), seq: 2 ** 31 };
    expectRefused(await send('POST', '/api/sync/push', tok.surveyor, { changes: [c] }), /seq/);
  });
});

describe('malformed bodies', () => {
  it('a 200,000-deep JSON value', async () => {
    const depth = 200_000;
    const body = `{"changes":${'['.repeat(depth)}${']'.repeat(depth)}}`;
    const deepArr = `${'['.repeat(depth)}${']'.repeat(depth)}`;
    const deepObj = `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`;
    const s = await storeSurvey(t.db, org.surveyor);
    // A conflict's chosen value is any JSON: this one used to reach code that walks it recursively.
    const c = change(randomUUID(), s.id, { kind: 'resolve-conflict', conflictId: randomUUID(), target: { kind: 'field', path: 'title' }, value: 1 }, 1);
    const pushDeep = JSON.stringify({ changes: [c] }).replace('"value":1', `"value":${deepArr}`);
    expectRefused(await send('POST', '/api/sync/push', tok.surveyor, pushDeep), /64 levels deep/);
    expectRefused(await send('POST', '/api/sync/push', tok.surveyor, body), /64 levels deep/);
    expectRefused(await send('PATCH', '/api/me', tok.surveyor, `{"name":${deepObj}}`), /64 levels deep/);
  });

  it('a multipart body cut short', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    const boundary = '----brineline-probe';
    const head = [
      `--${boundary}`,
      'Content-Disposition: form-data; name="surveyId"',
      '',
      s.id,
      `--${boundary}`,
      'Content-Disposition: form-data; name="file"; filename="photo.png"',
      'Content-Type: image/png',
      '',
      '',
    ].join('\r\n');
    const body = Buffer.concat([Buffer.from(head), makePng().subarray(0, 40)]);
    const res = await fetch(`${t.url}/api/photos/${randomUUID()}`, {
      method: 'PUT',
      headers: { ...authHeader(tok.surveyor), 'content-type': `multipart/form-data; boundary=${boundary}` },
      body,
    });
    const text = await res.text();
    expectRefused({ status: res.status, code: ErrorBodySchema.parse(JSON.parse(text)).error.code, text });
  });
});

describe('survey caps (F4)', () => {
  it('a polygon past the vertex cap and a 1 MB title answer 400 naming the field and the limit', async () => {
    const s = newSurvey();
    const ring = Array.from({ length: 5_000 }, (_, k) => ({ x: 50 + 5 * Math.cos(k / 800), y: 0, z: 6 + 5 * Math.sin(k / 800) }));
    s.boundaries[0] = { ...s.boundaries[0], geometry: { kind: 'polygon', vertices: ring } };
    const polygon = await send('POST', '/api/surveys', tok.surveyor, { survey: s });
    expect(polygon.status).toBe(400);
    expect(polygon.text).toContain('survey.boundaries.0.geometry.vertices');
    expect(polygon.text).toContain('At most 1,000 vertices per polygon allowed.');

    const title = await send('POST', '/api/surveys', tok.surveyor, { survey: newSurvey({ title: 'T'.repeat(1_000_000) }) });
    expect(title.status).toBe(400);
    expect(title.text).toContain('"path":"survey.title","message":"Use at most 200 characters."');
  });
});
