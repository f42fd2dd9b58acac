// Sync never drops an edit: when the device store refuses a write (a full disk, a broken store), the
// edit stays in its note (client/src/offline/unsaved-edits.ts), the surveyor is told it is held but not
// yet stored, and it goes in with the next edit or at the next start. Common practice, no source.
// IndexedDB comes from fake-indexeddb, which runs Dexie's real store (and its transaction abort) in Node.
import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { SurveySchema, type Survey } from '@shared/schemas/survey';
import { db } from '@client/offline/db';
import { applyLocalChange, HeldEditError, LocalChangeError, replayUnsavedEdits } from '@client/offline/survey-store';
import { unsavedEdits } from '@client/offline/unsaved-edits';
import { freshDeviceStore } from '../../support/device-store';
import demo from '../../../seeds/demo-survey.json';

const base = SurveySchema.parse(demo) as Survey;
const titleOp = (title: string) => ({ kind: 'set' as const, path: 'title' as const, value: title });
/** What IndexedDB raises when the device has no room left. */
const quotaError = () => new DOMException('The quota has been exceeded.', 'QuotaExceededError');

describe('a store write that fails', () => {
  const storage = new Map<string, string>();
  beforeEach(() => freshDeviceStore(storage, base));
  afterEach(() => vi.restoreAllMocks());

  const storedTitle = async () => (await db.surveys.get(base.id))!.doc.title;
  const queuedOps = async () => (await db.outbox.toArray()).map((e) => e.op);

  it('keeps the edit noted, says it is held but not stored, and the next start stores it', async () => {
    vi.spyOn(db.surveys, 'put').mockRejectedValueOnce(quotaError());
    const failed = applyLocalChange(base.id, titleOp('Typed on a full phone'));
    await expect(failed).rejects.toBeInstanceOf(HeldEditError);
    await expect(failed).rejects.toThrow(/held on this device but NOT yet stored \(this device is out of storage space/);
    // the transaction was undone whole: nothing in the store, nothing queued
    expect(await storedTitle()).toBe(base.title);
    expect(await queuedOps()).toEqual([]);
    // but the note is still there
    expect(unsavedEdits().map((e) => e.ops)).toEqual([[titleOp('Typed on a full phone')]]);

    vi.restoreAllMocks();
    expect(await replayUnsavedEdits()).toBe(1); // the next start
    expect(await storedTitle()).toBe('Typed on a full phone');
    expect(await queuedOps()).toEqual([titleOp('Typed on a full phone')]);
    expect(unsavedEdits()).toEqual([]);
  });

  it('a broken store (not a full disk) also keeps the edit, with the store’s own reason', async () => {
    vi.spyOn(db.outbox, 'add').mockRejectedValueOnce(new Error('UnknownError: the store is broken'));
    await expect(applyLocalChange(base.id, titleOp('Kept through a broken store'))).rejects.toThrow(/NOT yet stored \(the device store refused the write: UnknownError: the store is broken\)/);
    expect(await queuedOps()).toEqual([]);
    expect(unsavedEdits()).toHaveLength(1);
    vi.restoreAllMocks();
    expect(await replayUnsavedEdits()).toBe(1);
    expect(await storedTitle()).toBe('Kept through a broken store');
  });

  it('the next edit on the page stores the held one first, in order, so neither is lost', async () => {
    const put = vi.spyOn(db.surveys, 'put').mockRejectedValueOnce(quotaError());
    await expect(applyLocalChange(base.id, { kind: 'set', path: 'casualtyDescription', value: 'Held description' })).rejects.toBeInstanceOf(HeldEditError);
    // while the store still fails, a second edit is held too (behind the first)
    put.mockRejectedValueOnce(quotaError());
    await expect(applyLocalChange(base.id, titleOp('Second, also held'))).rejects.toBeInstanceOf(HeldEditError);
    expect(unsavedEdits()).toHaveLength(2);
    expect(await queuedOps()).toEqual([]);

    // room again: the next edit puts both held ones in first, then itself
    await applyLocalChange(base.id, titleOp('Third, stored'));
    expect(await queuedOps()).toEqual([{ kind: 'set', path: 'casualtyDescription', value: 'Held description' }, titleOp('Second, also held'), titleOp('Third, stored')]);
    expect(await storedTitle()).toBe('Third, stored');
    expect(unsavedEdits()).toEqual([]);
  });

  it('an edit refused as invalid is still struck off (the form says why; nothing to replay)', async () => {
    await expect(applyLocalChange('99999999-9999-4999-8999-999999999999', titleOp('No such survey'))).rejects.toBeInstanceOf(LocalChangeError);
    expect(unsavedEdits()).toEqual([]);
  });
});
