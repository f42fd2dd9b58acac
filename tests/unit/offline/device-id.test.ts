// Device ids per person: the server gives a device id to the first person who pushes with it and
// refuses it to anyone else (403), so two people on one phone must never share one. IndexedDB comes
// from fake-indexeddb, which runs Dexie's real store in Node.
import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { db, getDeviceId, META, setMeta } from '@client/offline/db';

const A = 'aaaaaaaa-aaaa-4aaa-8aaa-aaaaaaaaaaaa';
const B = 'bbbbbbbb-bbbb-4bbb-8bbb-bbbbbbbbbbbb';

describe('device ids per person', () => {
  it('the id made before ids were per person goes to the first person who asks; a second person gets their own, for good', async () => {
    await db.meta.clear();
    const before = crypto.randomUUID();
    await setMeta(META.deviceId, before);

    expect(await getDeviceId(A)).toBe(before);
    const b = await getDeviceId(B);
    expect(b).not.toBe(before);
    expect(b).toMatch(/^[0-9a-f-]{36}$/);
    // asked again, in either order: the same ids
    expect(await getDeviceId(B)).toBe(b);
    expect(await getDeviceId(A)).toBe(before);
    // nobody remembered (signed out): the device's first id, never a new one each time
    expect(await getDeviceId(null)).toBe(before);
  });

  it('on a new phone each person gets a new id, and nobody remembered gets one of its own', async () => {
    await db.meta.clear();
    const a = await getDeviceId(A);
    const b = await getDeviceId(B);
    const anonymous = await getDeviceId(null);
    expect(new Set([a, b, anonymous]).size).toBe(3);
    expect(await getDeviceId(null)).toBe(anonymous);
  });
});
