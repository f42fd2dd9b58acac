// A pulled survey is checked against the copy the device already holds (checkedServerDoc in
// client/src/offline/survey-store.ts): shared with it (shareUnchanged), then isValidEdit checks what
// moved. The reference is SurveySchema itself, parsing the whole pulled document: the two must agree
// on every document, accepted ones must come out equal to the full parse, and what did not change
// keeps its identity. Also: a crash between an edit and its write loses nothing. Common practice,
// no source. IndexedDB comes from fake-indexeddb, which runs Dexie's real store in Node.
import 'fake-indexeddb/auto';
import { beforeEach, describe, expect, it } from 'vitest';
import { SurveySchema, type Survey } from '@shared/schemas/survey';
import { shareUnchanged } from '@client/lib/share-unchanged';
import { db } from '@client/offline/db';
import { applyLocalChange, checkedServerDoc, mergeServerSurveys, replayUnsavedEdits } from '@client/offline/survey-store';
import { freshDeviceStore } from '../../support/device-store';
import demo from '../../../seeds/demo-survey.json';

const base = SurveySchema.parse(demo) as Survey;
/** The server's copy as a pull brings it: a new object graph, whatever changed. */
const wire = (s: unknown): Survey => JSON.parse(JSON.stringify(s)) as Survey;

function withSounding(s: Survey, value: unknown): Survey {
  const next = wire(s);
  const layer = next.conditions[0].contents.flatMap((c) => c.layers).find((l) => l.level.kind === 'sounding' || l.level.kind === 'ullage')!;
  if (layer.level.kind === 'sounding') (layer.level as { soundingM: unknown }).soundingM = value;
  else (layer.level as { ullageM: unknown }).ullageM = value;
  return next;
}

describe('shareUnchanged', () => {
  it('gives back the held copy itself when nothing changed, and new objects only along what changed', () => {
    expect(shareUnchanged(base, wire(base))).toBe(base);
    const edited = withSounding(base, 3.25);
    const shared = shareUnchanged(base, edited);
    expect(shared).toEqual(edited);
    expect(shared).not.toBe(base);
    expect(shared.boundaries).toBe(base.boundaries);
    expect(shared.compartments).toBe(base.compartments);
    expect(shared.vessel).toBe(base.vessel);
    expect(shared.conditions[0]).not.toBe(base.conditions[0]);
  });

  it('pairs list items by id, so removing the first keeps every later one', () => {
    const next = wire(base);
    next.boundaries.shift();
    const shared = shareUnchanged(base, next);
    expect(shared.boundaries).toHaveLength(base.boundaries.length - 1);
    shared.boundaries.forEach((b, i) => expect(b).toBe(base.boundaries[i + 1]));
  });
});

describe('checkedServerDoc agrees with the full survey schema', () => {
  const held = { doc: base, serverDoc: base };
  const cases: [string, (s: Survey) => unknown][] = [
    ['nothing changed', (s) => wire(s)],
    ['a new sounding', (s) => withSounding(s, 4.75)],
    ['a new title', (s) => ({ ...wire(s), title: 'Another title' })],
    ['a boundary removed', (s) => ({ ...wire(s), boundaries: wire(s).boundaries.slice(1) })],
    ['a sounding that is text', (s) => withSounding(s, 'deep')],
    ['a negative sounding', (s) => withSounding(s, -1)],
    ['a boundary on a space that does not exist', (s) => {
      const next = wire(s);
      (next.boundaries[0].sideA as { compartmentId?: string }).compartmentId = crypto.randomUUID();
      return next;
    }],
    ['no title', (s) => ({ ...wire(s), title: undefined })],
    ['not a survey', () => 42],
    ['boundaries not a list', (s) => ({ ...wire(s), boundaries: {} })],
  ];
  for (const [name, make] of cases) {
    it(name, () => {
      const pulled = make(base);
      const full = SurveySchema.safeParse(pulled);
      if (full.success) {
        const checked = checkedServerDoc(held, pulled);
        expect(checked).toEqual(full.data);
        // what did not change is the held copy's own object
        for (const b of checked.boundaries) {
          const was = base.boundaries.find((x) => x.id === b.id);
          if (was && JSON.stringify(was) === JSON.stringify(b)) expect(b).toBe(was);
        }
      } else {
        expect(() => checkedServerDoc(held, pulled)).toThrow();
      }
    });
  }

  it('with no copy on the device, parses the whole document', () => {
    expect(checkedServerDoc(undefined, wire(base))).toEqual(base);
    expect(() => checkedServerDoc(undefined, withSounding(base, 'deep'))).toThrow();
  });
});

describe('the device store', () => {
  const storage = new Map<string, string>();
  beforeEach(() => freshDeviceStore(storage, base));

  const titleOp = (title: string) => ({ kind: 'set' as const, path: 'title' as const, value: title });

  it('a pull keeps the edits still waiting on the device, and refuses a bad document whole', async () => {
    await applyLocalChange(base.id, titleOp('Edited on the device'));
    const fromServer = withSounding(base, 5.5);
    await mergeServerSurveys([{ id: base.id, revision: 4, status: 'draft', doc: fromServer, createdBy: { id: crypto.randomUUID(), name: 'S' }, updatedAt: '2026-12-02T00:00:00.000Z' }]);
    const row = (await db.surveys.get(base.id))!;
    expect(row.serverRevision).toBe(4);
    expect(row.serverDoc).toEqual(fromServer);
    expect(row.doc).toEqual({ ...fromServer, title: 'Edited on the device' });

    await expect(mergeServerSurveys([{ id: base.id, revision: 5, status: 'draft', doc: withSounding(base, 'deep'), createdBy: { id: crypto.randomUUID(), name: 'S' }, updatedAt: '2026-12-02T00:00:00.000Z' }])).rejects.toThrow();
    expect((await db.surveys.get(base.id))!.serverRevision).toBe(4);
  });

  it('an edit is noted before its first wait, so a page that dies before the store commits still keeps it at the next start', async () => {
    const writing = applyLocalChange(base.id, titleOp('Typed as the phone died'));
    // the moment the edit leaves the form: what the page's storage holds if it dies now
    const atDeath = new Map(storage);
    await writing;
    // the next start, on a store the write never reached
    await db.surveys.put({ id: base.id, doc: base, serverDoc: base, serverRevision: 3, status: 'draft', title: base.title, vesselName: base.vessel.name, updatedAt: '2026-12-01T00:00:00.000Z', ownerUserId: null, createdBy: null });
    await db.outbox.clear();
    storage.clear();
    for (const [k, v] of atDeath) storage.set(k, v);
    expect(await replayUnsavedEdits()).toBe(1);
    expect((await db.surveys.get(base.id))!.doc.title).toBe('Typed as the phone died');
    const queued = await db.outbox.toArray();
    expect(queued.map((e) => e.op)).toEqual([{ kind: 'set', path: 'title', value: 'Typed as the phone died' }]);
  });
});
