/** The admin's members screen: list, invite, change role, deactivate, reactivate, resend an invitation. */
import type { Request } from 'express';
import { z } from 'zod';
import { ChangeRoleRequestSchema, InviteMemberRequestSchema, type MembersResponse } from '@shared/api/auth';
import { authOf, roles, type RouteSpec } from '../http/route';
import { notFound } from '../errors';
import type { AppServices } from '../services';
import { requestMeta } from '../services/audit';

const ADMIN = roles('admin');

/** A malformed id is answered like an unknown one. */
const userIdOf = (req: Request): string => {
  const parsed = z.uuid().safeParse(req.params.userId);
  if (!parsed.success) throw notFound('No such member in your organisation.');
  return parsed.data;
};

export function memberRoutes({ members, invitations }: Pick<AppServices, 'members' | 'invitations'>): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/members',
      policy: ADMIN,
      handler: async (req, res) => {
        const body: MembersResponse = { members: await members.list(authOf(req)) };
        res.json(body);
      },
    },
    {
      method: 'post',
      path: '/members/invitations',
      policy: ADMIN,
      handler: async (req, res) => {
        const body = InviteMemberRequestSchema.parse(req.body);
        res.status(201).json(await invitations.invite(authOf(req), body.email, body.role, requestMeta(req)));
      },
    },
    {
      method: 'patch',
      path: '/members/:userId',
      policy: ADMIN,
      handler: async (req, res) => {
        const userId = userIdOf(req);
        const body = ChangeRoleRequestSchema.parse(req.body);
        res.json(await members.changeRole(authOf(req), userId, body.role, requestMeta(req)));
      },
    },
    {
      method: 'post',
      path: '/members/:userId/deactivate',
      policy: ADMIN,
      handler: async (req, res) => {
        res.json(await members.deactivate(authOf(req), userIdOf(req), requestMeta(req)));
      },
    },
    {
      method: 'post',
      path: '/members/:userId/reactivate',
      policy: ADMIN,
      handler: async (req, res) => {
        res.json(await members.reactivate(authOf(req), userIdOf(req), requestMeta(req)));
      },
    },
    {
      method: 'post',
      path: '/members/:userId/resend-invitation',
      policy: ADMIN,
      handler: async (req, res) => {
        res.json(await invitations.resend(authOf(req), userIdOf(req), requestMeta(req)));
      },
    },
  ];
}
