/**
 * Development only: the messages the local mail catcher received, for admins, so invitations and
 * resets can be followed without a real mailbox. Registered only when NODE_ENV is not production
 * and DEV_MAIL_DIR is set. An admin sees only the messages their organisation sent (invitations,
 * resets of its members, its briefs): an address another firm also wrote to, even one invited here,
 * never shows the other firm's mail.
 */
import type { DevMailList } from '@shared/api/dev-mail';
import type { AppContext } from '../app';
import { authOf, roles, type RouteSpec } from '../http/route';
import { notFound } from '../http/errors';
import { readMailbox } from '../mail/dev-mailbox';

export function devMailRoutes(deps: AppContext): RouteSpec[] {
  const mailDir = deps.config.DEV_MAIL_DIR;
  if (deps.config.NODE_ENV === 'production' || !mailDir) return [];
  const dir: string = mailDir;

  async function visibleMail(orgId: string) {
    return (await readMailbox(dir)).filter((m) => m.organisationId === orgId);
  }

  return [
    {
      method: 'get',
      path: '/dev/mail',
      policy: roles('admin'),
      handler: async (req, res) => {
        const mail = await visibleMail(authOf(req).orgId);
        const body: DevMailList = { messages: mail.map(({ id, receivedAt, to, subject }) => ({ id, receivedAt, to, subject })) };
        res.setHeader('Cache-Control', 'no-store');
        res.json(body);
      },
    },
    {
      method: 'get',
      path: '/dev/mail/:id',
      policy: roles('admin'),
      handler: async (req, res) => {
        const found = (await visibleMail(authOf(req).orgId)).find((m) => m.id === req.params.id);
        if (!found) throw notFound('No such message.');
        res.setHeader('Cache-Control', 'no-store');
        res.json(found);
      },
    },
  ];
}
