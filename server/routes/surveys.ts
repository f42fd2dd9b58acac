/** Surveys and sync: list, read, create; push device changes; pull what changed. */
import { z } from 'zod';
import {
  CreateSurveyRequestSchema,
  ListSurveysQuerySchema,
  MAX_PUSH_CHANGES,
  PullQuerySchema,
  PushRequestSchema,
  type PushResponse,
} from '@shared/schemas/sync';
import type { Request } from 'express';
import type { Role } from '@shared/api/roles';
import { ANY_MEMBER, authOf, confirmMembership, ensureMembership, unconfirmedAuthOf, type RouteSpec } from '../http/route';
import { tooLarge } from '../errors';
import type { AppServices } from '../services';

const IdParam = z.object({ id: z.uuid() });
const PUSH_POLICY = ANY_MEMBER;
const DetailQuery = z.object({ results: z.enum(['latest', 'current']).default('latest') });

/** Reports the role a handler's own query found (see `checksMembership`). */
const confirmer = (req: Request) => (role: Role | null) => confirmMembership(req, role);

/** The survey list, one survey, and a survey made whole (an import, or a client online). */
function surveyRecordRoutes({ surveys }: Pick<AppServices, 'surveys'>): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/surveys',
      policy: ANY_MEMBER,
      checksMembership: true,
      handler: async (req, res) => {
        const q = ListSurveysQuerySchema.parse(req.query);
        const body = await surveys.listJson(unconfirmedAuthOf(req), q, confirmer(req));
        res.type('application/json').send(body);
      },
    },
    {
      method: 'get',
      path: '/surveys/:id',
      policy: ANY_MEMBER,
      checksMembership: true,
      handler: async (req, res) => {
        const { id } = IdParam.parse(req.params);
        const q = DetailQuery.parse(req.query);
        if (q.results === 'current') {
          res.json(await surveys.get(await ensureMembership(req), id, { fresh: true }));
        } else {
          res.type('application/json').send(await surveys.getJson(unconfirmedAuthOf(req), id, confirmer(req)));
        }
      },
    },
    {
      method: 'post',
      path: '/surveys',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const { survey } = CreateSurveyRequestSchema.parse(req.body);
        res.status(201).json(await surveys.create(authOf(req), survey));
      },
    },
  ];
}

/** The device's side of sync: push its changes, pull what changed. */
function syncRoutes({ sync }: Pick<AppServices, 'sync'>): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/sync/push',
      policy: PUSH_POLICY,
      checksMembership: true,
      handler: async (req, res) => {
        const changes = (req.body as { changes?: unknown } | undefined)?.changes;
        if (Array.isArray(changes) && changes.length > MAX_PUSH_CHANGES) {
          throw tooLarge(`A push may carry at most ${MAX_PUSH_CHANGES} changes; this one has ${changes.length}. Send the rest in another push.`);
        }
        const body = PushRequestSchema.parse(req.body);
        if (body.changes.length === 0) await ensureMembership(req);
        const out = await sync.push(unconfirmedAuthOf(req), body.changes, { logger: req.log, confirm: confirmer(req), roles: PUSH_POLICY.roles });
        res.json({ ...out, serverTime: new Date().toISOString() } satisfies PushResponse);
      },
    },
    {
      method: 'get',
      path: '/sync/pull',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        res.setHeader('Cache-Control', 'no-store');
        res.json(await sync.pull(authOf(req), PullQuerySchema.parse(req.query)));
      },
    },
  ];
}

export function surveyRoutes(services: Pick<AppServices, 'surveys' | 'sync'>): RouteSpec[] {
  return [...surveyRecordRoutes(services), ...syncRoutes(services)];
}
