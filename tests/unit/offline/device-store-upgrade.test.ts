// The device store's version 2 moves the reviewers' notes out of `meta` (keys `review:<id>`) into a table of
// their own. IndexedDB comes from fake-indexeddb, which runs Dexie's real upgrade path in Node.
import 'fake-indexeddb/auto';
import { Dexie } from 'dexie';
import { afterEach, describe, expect, it } from 'vitest';
import { openDb, type BrinelineDb } from '@client/offline/db';
import type { ReviewNotes } from '@shared/api/review';

const SURVEY_A = '11111111-1111-4111-8111-111111111111';
const SURVEY_B = '22222222-2222-4222-8222-222222222222';

const notesFor = (surveyId: string, note: string): ReviewNotes =>
  ({
    surveyId,
    status: 'returned',
    lastEvent: { id: '33333333-3333-4333-8333-333333333333', from: 'in_review', to: 'returned', note, actorName: 'Engineer', revision: 4, at: '2026-01-01T10:00:00Z' },
    comments: [],
    verdicts: [],
    limits: [],
  }) as unknown as ReviewNotes;

let opened: Dexie[] = [];
afterEach(async () => {
  for (const d of opened) {
    d.close();
    await Dexie.delete(d.name);
  }
  opened = [];
});

/** A store exactly as version 1 of the app left it. */
async function versionOneStore(name: string, meta: { key: string; value: unknown }[]) {
  const old = new Dexie(name);
  old.version(1).stores({
    surveys: 'id, updatedAt, status, ownerUserId, title',
    outbox: '++seq, id, surveyId, state, [surveyId+state]',
    conflicts: 'id, surveyId, status, [surveyId+status]',
    photos: 'id, surveyId, uploaded, [entity.kind+entity.id]',
    meta: 'key',
  });
  await old.open();
  await old.table('meta').bulkPut(meta);
  old.close();
}

describe('device store upgrade to version 2', () => {
  it('moves every review:<id> meta row into reviewNotes and leaves the other meta rows alone', async () => {
    const name = `upgrade-${crypto.randomUUID()}`;
    await versionOneStore(name, [
      { key: `review:${SURVEY_A}`, value: notesFor(SURVEY_A, 'Re-sound No. 2 hold') },
      { key: `review:${SURVEY_B}`, value: notesFor(SURVEY_B, 'Add the shore sizes') },
      { key: 'deviceId', value: 'device-1' },
      { key: 'pullCursor', value: '1234' },
    ]);

    const db: BrinelineDb = openDb(name);
    opened.push(db);
    await db.open();

    expect(db.verno).toBe(3);
    const moved = await db.reviewNotes.toArray();
    expect(moved.map((n) => n.surveyId).sort()).toEqual([SURVEY_A, SURVEY_B]);
    expect((await db.reviewNotes.get(SURVEY_A))?.lastEvent?.note).toBe('Re-sound No. 2 hold');
    expect((await db.meta.toArray()).map((r) => r.key).sort()).toEqual(['deviceId', 'pullCursor']);
    expect(await db.replies.count()).toBe(0);
  });

  it('keeps a legacy record that lacks its survey id under the id from its key', async () => {
    const name = `upgrade-${crypto.randomUUID()}`;
    const partial = { ...notesFor(SURVEY_A, 'x'), surveyId: undefined };
    await versionOneStore(name, [{ key: `review:${SURVEY_B}`, value: partial }]);
    const db = openDb(name);
    opened.push(db);
    await db.open();
    expect((await db.reviewNotes.get(SURVEY_B))?.status).toBe('returned');
    expect(await db.meta.count()).toBe(0);
  });

  it('opens a new device store at version 2 with empty tables', async () => {
    const db = openDb(`fresh-${crypto.randomUUID()}`);
    opened.push(db);
    await db.open();
    expect(db.verno).toBe(3);
    expect(db.tables.map((t) => t.name).sort()).toEqual(['conflicts', 'meta', 'outbox', 'photos', 'replies', 'reviewNotes', 'surveys']);
  });
});
