/**
 * Development only: the messages the local mail catcher received — only those their organisation
 * sent (invitations, resets of its members, its briefs; the mailer marks each with the sending firm),
 * all of them for an admin, and for an engineer the ones they sent (the master's briefs they issued). An address another firm also wrote to, even one invited here, never
 * shows the other firm's mail. Null (no routes) in production or without DEV_MAIL_DIR.
 */
import type { DevMail } from '@shared/api/dev-mail';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import { readMailbox } from '../mail/dev-mailbox';
import type { Role } from '@shared/api/roles';

interface Viewer {
  orgId: string;
  userId: string;
  role: Role;
}

export function createDevMailService(deps: { db: Db; config: Pick<Config, 'NODE_ENV' | 'DEV_MAIL_DIR'> }) {
  const dir = deps.config.DEV_MAIL_DIR;
  if (deps.config.NODE_ENV === 'production' || !dir) return null;

  /** An admin sees all their firm's mail; an engineer only what they sent themselves (the briefs they issued). */
  async function visibleTo(viewer: Viewer): Promise<DevMail[]> {
    return (await readMailbox(dir!)).filter((m) => m.organisationId === viewer.orgId && (viewer.role === 'admin' || m.sentById === viewer.userId));
  }

  return {
    list: visibleTo,
    find: async (viewer: Viewer, id: string) => (await visibleTo(viewer)).find((m) => m.id === id),
  };
}

export type DevMailService = ReturnType<typeof createDevMailService>;
