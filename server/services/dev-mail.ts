/**
 * Development only: the messages the local mail catcher received, as an admin may see them — only
 * those addressed to people of their organisation. Null (no routes) in production or without
 * DEV_MAIL_DIR.
 */
import type { DevMail } from '@shared/api/dev-mail';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import { listMemberEmails } from '../db/repositories/accounts';
import { readMailbox } from '../mail/dev-mailbox';

export function createDevMailService(deps: { db: Db; config: Pick<Config, 'NODE_ENV' | 'DEV_MAIL_DIR'> }) {
  const dir = deps.config.DEV_MAIL_DIR;
  if (deps.config.NODE_ENV === 'production' || !dir) return null;

  async function visibleTo(orgId: string): Promise<DevMail[]> {
    const ours = new Set((await listMemberEmails(deps.db, orgId)).map((e) => e.toLowerCase()));
    return (await readMailbox(dir!)).filter((m) => m.to.some((to) => ours.has(to.toLowerCase())));
  }

  return {
    list: visibleTo,
    find: async (orgId: string, id: string) => (await visibleTo(orgId)).find((m) => m.id === id),
  };
}

export type DevMailService = ReturnType<typeof createDevMailService>;
