/**
 * Development only: the messages the local mail catcher received, for admins (all their firm's) and
 * engineers (the briefs they sent), so invitations, resets and briefs can be followed without a real mailbox. Registered only when the dev-mail service exists
 * (NODE_ENV is not production and DEV_MAIL_DIR is set).
 */
import type { DevMailList } from '@shared/api/dev-mail';
import { authOf, roles, type RouteSpec } from '../http/route';
import { notFound } from '../errors';
import type { DevMailService } from '../services/dev-mail';

export function devMailRoutes(devMail: DevMailService): RouteSpec[] {
  if (!devMail) return [];
  return [
    {
      method: 'get',
      path: '/dev/mail',
      policy: roles('admin', 'engineer'),
      handler: async (req, res) => {
        const mail = await devMail.list(authOf(req));
        const body: DevMailList = { messages: mail.map(({ id, receivedAt, to, subject }) => ({ id, receivedAt, to, subject })) };
        res.setHeader('Cache-Control', 'no-store');
        res.json(body);
      },
    },
    {
      method: 'get',
      path: '/dev/mail/:id',
      policy: roles('admin', 'engineer'),
      handler: async (req, res) => {
        const found = await devMail.find(authOf(req), req.params.id as string);
        if (!found) throw notFound('No such message.');
        res.setHeader('Cache-Control', 'no-store');
        res.json(found);
      },
    },
  ];
}
