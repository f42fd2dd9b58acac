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
import type { AppDeps } from '../app';
import type { Role } from '@shared/api/roles';
import { ANY_MEMBER, authOf, confirmMembership, ensureMembership, unconfirmedAuthOf, type RouteSpec } from '../http/route';
import { HttpError } from '../http/errors';
import { createResultsScheduler, createSurvey, getSurvey, getSurveyJson, listSurveysJson, SurveyTextCache } from '../services/surveys';
import { pull, push, SurveyStateCache } from '../services/sync';

const IdParam = z.object({ id: z.uuid() });
const PUSH_POLICY = ANY_MEMBER;
const DetailQuery = z.object({ results: z.enum(['latest', 'current']).default('latest') });

export function surveyRoutes(deps: AppDeps): RouteSpec[] {
  const scheduler = createResultsScheduler(deps.db, (err) => deps.logger.warn({ err }, 'results recomputation failed'));
  const textCache = new SurveyTextCache();
  const stateCache = new SurveyStateCache();
  return [
    {
      method: 'get',
      path: '/surveys',
      policy: ANY_MEMBER,
      checksMembership: true,
      handler: async (req, res) => {
        const q = ListSurveysQuerySchema.parse(req.query);
        const body = await listSurveysJson(deps.db, unconfirmedAuthOf(req), q, (role) => confirmMembership(req, role));
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
          res.json(await getSurvey(deps.db, await ensureMembership(req), id, { fresh: true, scheduler }));
        } else {
          const confirm = (role: Role | null) => confirmMembership(req, role);
          res.type('application/json').send(await getSurveyJson(deps.db, unconfirmedAuthOf(req), id, { scheduler, confirm, cache: textCache }));
        }
      },
    },
    {
      method: 'post',
      path: '/surveys',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const { survey } = CreateSurveyRequestSchema.parse(req.body);
        res.status(201).json(await createSurvey(deps.db, authOf(req), survey));
      },
    },
    {
      method: 'post',
      path: '/sync/push',
      policy: PUSH_POLICY,
      checksMembership: true,
      handler: async (req, res) => {
        const changes = (req.body as { changes?: unknown } | undefined)?.changes;
        if (Array.isArray(changes) && changes.length > MAX_PUSH_CHANGES) {
          throw new HttpError(
            413,
            'payload_too_large',
            `A push may carry at most ${MAX_PUSH_CHANGES} changes; this one has ${changes.length}. Send the rest in another push.`,
          );
        }
        const body = PushRequestSchema.parse(req.body);
        if (body.changes.length === 0) await ensureMembership(req);
        const confirm = (role: Role | null) => confirmMembership(req, role);
        const out = await push(deps.db, unconfirmedAuthOf(req), body.changes, {
          scheduler,
          logger: req.log,
          confirm,
          roles: PUSH_POLICY.roles,
          known: stateCache,
        });
        res.json({ ...out, serverTime: new Date().toISOString() } satisfies PushResponse);
      },
    },
    {
      method: 'get',
      path: '/sync/pull',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        res.setHeader('Cache-Control', 'no-store');
        res.json(await pull(deps.db, authOf(req), PullQuerySchema.parse(req.query)));
      },
    },
  ];
}
