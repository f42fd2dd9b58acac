// A form opened on an older copy of the survey writes only what the person changed in it (#13 item
// 7): the title typed in Ship and left at once must not come back as the old title when Ship is
// reopened before that save lands and a vessel name is typed. IndexedDB comes from fake-indexeddb,
// which runs Dexie's real store in Node.
import 'fake-indexeddb/auto';
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { rebaseEdit } from '@client/offline/rebase-edit';
import { applyLocalChange, createLocalSurvey, getLocalSurvey } from '@client/offline/survey-store';
import type { Condition, Contents, Survey } from '@shared/schemas/survey';
import type { SurveyOp } from '@shared/schemas/sync';
import { demoSurvey } from '../../../seeds/demo-survey';

describe('rebaseEdit (three-way: what the device holds, what the form started from, what it holds now)', () => {
  it('keeps the device value wherever the form changed nothing, and the form value where it did', () => {
    const current = { name: 'MV Newer', lbpM: 120, imo: '9074729' };
    const base = { name: 'MV Older', lbpM: 120, imo: '9074729' };
    const mine = { name: 'MV Older', lbpM: 121, imo: '9074729' };
    expect(rebaseEdit(current, base, mine)).toEqual({ name: 'MV Newer', lbpM: 121, imo: '9074729' });
  });

  it('takes a value the form cleared, and a whole value where the form changed nothing at all', () => {
    expect(rebaseEdit({ a: 1, b: 2 }, { a: 1, b: 2 }, { a: 1 })).toEqual({ a: 1 });
    expect(rebaseEdit('device', 'form start', 'form start')).toBe('device');
    expect(rebaseEdit('device', 'form start', 'typed')).toBe('typed');
  });

  it('merges lists of items with ids item by item: added elsewhere kept, removed here removed, mine in my order', () => {
    const current = [{ id: 'a', v: 1 }, { id: 'b', v: 20 }, { id: 'x', v: 9 }];
    const base = [{ id: 'a', v: 1 }, { id: 'b', v: 2 }, { id: 'c', v: 3 }];
    const mine = [{ id: 'c', v: 30 }, { id: 'a', v: 10 }, { id: 'b', v: 2 }, { id: 'd', v: 4 }];
    expect(rebaseEdit(current, base, mine)).toEqual([
      { id: 'c', v: 30 }, // removed elsewhere, changed here: kept
      { id: 'a', v: 10 },
      { id: 'b', v: 20 }, // untouched here: the device's
      { id: 'd', v: 4 },
      { id: 'x', v: 9 }, // added elsewhere
    ]);
  });

  it('takes a list of plain points whole', () => {
    expect(rebaseEdit([{ y: 0 }, { y: 2 }], [{ y: 0 }, { y: 1 }], [{ y: 0 }, { y: 1 }, { y: 3 }])).toEqual([{ y: 0 }, { y: 1 }, { y: 3 }]);
  });
});

const fresh = async (): Promise<Survey> => {
  const survey = { ...demoSurvey(), id: randomUUID() };
  await createLocalSurvey(survey);
  return survey;
};
const stored = async (id: string): Promise<Survey> => (await getLocalSurvey(id))!.doc;
const setOp = <K extends 'title' | 'vessel'>(path: K, value: Survey[K]): SurveyOp => ({ kind: 'set', path, value }) as SurveyOp;

describe('the device store writes only what a form changed', () => {
  it('a Ship form opened before the title save landed keeps the new title when it saves a vessel name', async () => {
    const opened = await fresh(); // the copy the reopened form was filled from
    await applyLocalChange(opened.id, setOp('title', 'Kept title one')); // the save of the form just left
    // the reopened form: title untouched (still the old one in the form), vessel name typed
    const typed = { ...opened.vessel, name: 'MV Kept Name' };
    await applyLocalChange(opened.id, setOp('title', opened.title), setOp('title', opened.title));
    await applyLocalChange(opened.id, setOp('vessel', typed), setOp('vessel', opened.vessel));
    const doc = await stored(opened.id);
    expect([doc.title, doc.vessel.name]).toEqual(['Kept title one', 'MV Kept Name']);
  });

  it('without the base (as before) the stale title came back: the case this guards', async () => {
    const opened = await fresh();
    await applyLocalChange(opened.id, setOp('title', 'Kept title one'));
    await applyLocalChange(opened.id, setOp('title', opened.title));
    expect((await stored(opened.id)).title).toBe(opened.title);
  });

  it('a contents form with an older condition keeps a sounding saved meanwhile in another space', async () => {
    const opened = await fresh();
    const cond = opened.conditions[0];
    const [first, second] = cond.contents.filter((k) => k.layers[0]?.level.kind === 'sounding');
    const withSounding = (k: Contents, m: number): Contents => ({
      ...k,
      layers: k.layers.map((l, i) => (i === 0 && l.level.kind === 'sounding' ? { ...l, level: { ...l.level, soundingM: m } } : l)),
    });
    const conditionWith = (contents: Contents[]): SurveyOp => ({ kind: 'upsert', collection: 'conditions', entity: { ...cond, contents } as Condition });
    // saved from the first space's form
    await applyLocalChange(opened.id, conditionWith(cond.contents.map((k) => (k === first ? withSounding(first, 0.9) : k))));
    // the second space's form was filled from the older condition
    const others = cond.contents.filter((k) => k.compartmentId !== second.compartmentId);
    await applyLocalChange(opened.id, conditionWith([...others, withSounding(second, 4.15)]), conditionWith([...others, second]));
    const after = (await stored(opened.id)).conditions[0].contents;
    const sounding = (k: Contents | undefined) => (k?.layers[0]?.level as { soundingM?: number } | undefined)?.soundingM;
    expect(sounding(after.find((k) => k.compartmentId === first.compartmentId))).toBe(0.9);
    expect(sounding(after.find((k) => k.compartmentId === second.compartmentId))).toBe(4.15);
  });
});
