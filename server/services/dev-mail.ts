/**
 * Development only: the messages the local mail catcher received, as an admin may see them — only
 * those their organisation sent (invitations, resets of its members, its briefs; the mailer marks
 * each with the sending firm). An address another firm also wrote to, even one invited here, never
 * shows the other firm's mail. Null (no routes) in production or without DEV_MAIL_DIR.
 */
import type { DevMail } from '@shared/api/dev-mail';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import { readMailbox } from '../mail/dev-mailbox';

export function createDevMailService(deps: { db: Db; config: Pick<Config, 'NODE_ENV' | 'DEV_MAIL_DIR'> }) {
  const dir = deps.config.DEV_MAIL_DIR;
  if (deps.config.NODE_ENV === 'production' || !dir) return null;

  async function visibleTo(orgId: string): Promise<DevMail[]> {
    return (await readMailbox(dir!)).filter((m) => m.organisationId === orgId);
  }

  return {
    list: visibleTo,
    find: async (orgId: string, id: string) => (await visibleTo(orgId)).find((m) => m.id === id),
  };
}

export type DevMailService = ReturnType<typeof createDevMailService>;
