import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import { PhotoSchema } from '@shared/api/photos';
import type { TestApp } from '../support/app';
import { authHeader, type TestOrg } from '../support/auth';
import { storeSurvey } from '../support/surveys';
import { startWithTwoFirms } from '../support/two-firms';
import { makePng } from '../support/photos';
import { createS3PhotoStorage } from '../../server/storage/photo-store';

let t: TestApp;
let org: TestOrg;
let token: string;
let otherToken: string;
let surveyId: string;

beforeAll(async () => {
  const firms = await startWithTwoFirms();
  ({ t, org } = firms);
  ({ surveyor: token, otherAdmin: otherToken } = firms.tok);
  surveyId = (await storeSurvey(t.db, org.surveyor)).id;
});
afterAll(async () => {
  await t.close();
});

function form(bytes: Buffer, opts: { type?: string; name?: string; survey?: string } = {}): FormData {
  const f = new FormData();
  f.set('surveyId', opts.survey ?? surveyId);
  f.set('entityKind', 'survey');
  f.set('entityId', opts.survey ?? surveyId);
  f.set('caption', 'Forward bulkhead, port side');
  f.set('file', new Blob([new Uint8Array(bytes)], { type: opts.type ?? 'image/png' }), opts.name ?? 'photo.png');
  return f;
}

const put = (id: string, body: FormData, tok = token) => fetch(`${t.url}/api/photos/${id}`, { method: 'PUT', headers: authHeader(tok), body });

describe('photos', () => {
  it('stores an upload under a generated key, answers a repeat with the same photo, and serves the bytes back', async () => {
    const id = randomUUID();
    const png = makePng(40, 30);
    const first = await put(id, form(png));
    expect(first.status).toBe(201);
    const photo = PhotoSchema.parse(await first.json());
    expect(photo).toMatchObject({ id, surveyId, contentType: 'image/png', sizeBytes: png.length, caption: 'Forward bulkhead, port side' });

    // a retry after a dropped connection: same id, same answer, nothing stored twice
    const again = await put(id, form(png));
    expect(again.status).toBe(200);
    expect(PhotoSchema.parse(await again.json())).toEqual(photo);
    const rows = await t.db('photos').where({ id });
    expect(rows).toHaveLength(1);
    expect(rows[0].storage_key).not.toContain(id);
    expect(rows[0].storage_key).not.toContain('photo.png');

    const stored = await createS3PhotoStorage(t.config).get(rows[0].storage_key);
    expect(stored).not.toBeNull();

    const got = await fetch(`${t.url}/api/photos/${id}`, { headers: authHeader(token) });
    expect(got.status).toBe(200);
    expect(got.headers.get('content-type')).toBe('image/png');
    expect(Buffer.from(await got.arrayBuffer()).equals(png)).toBe(true);

    const list = await fetch(`${t.url}/api/surveys/${surveyId}/photos`, { headers: authHeader(token) });
    expect(((await list.json()) as { items: { id: string }[] }).items.map((p) => p.id)).toContain(id);
  });

  it('shows nothing of a photo to another organisation', async () => {
    const id = randomUUID();
    expect((await put(id, form(makePng()))).status).toBe(201);
    const got = await fetch(`${t.url}/api/photos/${id}`, { headers: authHeader(otherToken) });
    expect(got.status).toBe(404);
    const list = await fetch(`${t.url}/api/surveys/${surveyId}/photos`, { headers: authHeader(otherToken) });
    expect(list.status).toBe(404);
    // nor can it attach a photo to this organisation's survey, or take over the id
    expect((await put(randomUUID(), form(makePng()), otherToken)).status).toBe(404);
    // Another firm's photo id answers as one that names nothing (F13: it used to answer 409).
    const taken = await put(id, form(makePng()), otherToken);
    expect(taken.status).toBe(404);
    const unknown = await fetch(`${t.url}/api/photos/${randomUUID()}`, { headers: authHeader(otherToken) });
    expect(ErrorBodySchema.parse(await taken.json()).error.message).toBe(ErrorBodySchema.parse(await unknown.json()).error.message);
  });

  it('refuses a file that is not an image by its content, whatever its name and declared type (415)', async () => {
    const res = await put(randomUUID(), form(Buffer.from('<html>not a photo</html>'.repeat(20)), { type: 'image/jpeg', name: 'bulkhead.jpg' }));
    expect(res.status).toBe(415);
    const body = ErrorBodySchema.parse(await res.json());
    expect(body.error.code).toBe('unsupported_media_type');
    expect(body.error.message).toMatch(/JPEG, PNG, WebP or HEIC/);
  });

  it('refuses a photo over 15 MB with a readable 413', async () => {
    const big = Buffer.concat([makePng(), Buffer.alloc(15 * 1024 * 1024 + 10)]);
    const res = await put(randomUUID(), form(big));
    expect(res.status).toBe(413);
    const body = ErrorBodySchema.parse(await res.json());
    expect(body.error.code).toBe('payload_too_large');
    expect(body.error.message).toMatch(/15 MB/);
  });

  it('answers 404 for a survey the server does not have yet, and 400 without a file', async () => {
    const missing = randomUUID();
    expect((await put(randomUUID(), form(makePng(), { survey: missing }))).status).toBe(404);
    const noFile = new FormData();
    noFile.set('surveyId', surveyId);
    const res = await fetch(`${t.url}/api/photos/${randomUUID()}`, { method: 'PUT', headers: authHeader(token), body: noFile });
    expect(res.status).toBe(400);
  });

  it('asks for a sign-in first', async () => {
    expect((await fetch(`${t.url}/api/photos/${randomUUID()}`)).status).toBe(401);
  });
});
