/**
 * Who owns each device id. A device id belongs to the person who first pushed with it; a push
 * carrying someone else's device id is refused (403) before anything is read or written, so nobody
 * can make a colleague's real edit come back "duplicate" by using their device id and next sequence
 * number. Ownership never changes once claimed, so this process remembers what it has seen: the
 * check costs a round trip only for a device id new to this process, and a remembered owner can
 * never be stale on another instance.
 */
import { LRUCache } from 'lru-cache';
import type { Db } from '../../db/knex';
import type { AuthContext } from '../../http/auth-context';
import { claimDevices } from '../../db/repositories/devices';
import { forbidden, unauthorized } from '../../errors';

export const NOT_YOUR_DEVICE =
  'These changes carry a device id that belongs to another person’s account, so they cannot be accepted from you. ' +
  'Changes are sent by the person who made them on that device.';

export class DeviceOwners {
  private readonly owners = new LRUCache<string, string>({ max: 100_000 });

  constructor(private readonly db: Db) {}

  /** Claims the caller's new device ids; throws 403 when any belongs to someone else, 401 when the caller is no member. */
  async check(auth: AuthContext, deviceIds: Iterable<string>): Promise<void> {
    const ids = [...new Set(deviceIds)];
    let unknown = ids.filter((id) => !this.owners.has(id));
    // Twice at most: a device id claimed concurrently by another statement is seen by the next one.
    for (let attempt = 0; unknown.length && attempt < 2; attempt++) {
      const claimed = await claimDevices(this.db, auth, unknown);
      if (claimed.memberRole === null) throw unauthorized();
      for (const [id, owner] of claimed.owners) this.owners.set(id, owner);
      unknown = unknown.filter((id) => !this.owners.has(id));
    }
    if (unknown.length || ids.some((id) => this.owners.get(id) !== auth.userId)) throw forbidden(NOT_YOUR_DEVICE);
  }
}
