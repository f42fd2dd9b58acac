// A device store for unit tests of client/src/offline: a page's localStorage (a Map, so a test can copy
// it "as the page died") and the Dexie store (fake-indexeddb, imported by the test file first) holding
// one survey at server revision 3. Call in a beforeEach.
import type { Survey } from '@shared/schemas/survey';
import { db } from '@client/offline/db';

export async function freshDeviceStore(storage: Map<string, string>, survey: Survey): Promise<void> {
  storage.clear();
  Object.assign(globalThis, {
    localStorage: {
      getItem: (k: string) => storage.get(k) ?? null,
      setItem: (k: string, v: string) => void storage.set(k, v),
      removeItem: (k: string) => void storage.delete(k),
    },
  });
  await db.surveys.clear();
  await db.outbox.clear();
  await db.surveys.put({ id: survey.id, doc: survey, serverDoc: survey, serverRevision: 3, status: 'draft', title: survey.title, vesselName: survey.vessel.name, updatedAt: '2026-12-01T00:00:00.000Z', ownerUserId: null, createdBy: null });
}
