/** The review desk's API: status moves, queue, comments, verdicts, limits, history, brief links. */
import type { Request } from 'express';
import { z } from 'zod';
import {
  CommentResolutionSchema,
  CompareQuerySchema,
  IssueBriefSchema,
  NewCommentSchema,
  NewLimitSchema,
  SetVerdictSchema,
  StatusChangeRequestSchema,
} from '@shared/api/review';
import { ANY_MEMBER, authOf, roles, type RouteSpec } from '../http/route';
import { notFound } from '../errors';
import type { AppServices } from '../services';
import { renderReport } from '../report/render-report';

/** Engineers review; admins may look (and withdraw a brief link), but do not judge structure. */
const REVIEW_READERS = roles('engineer', 'admin');
const ENGINEER = roles('engineer');

/** A malformed id is answered like an unknown one. */
const idParam = (req: Request, name: string, what: string): string => {
  const parsed = z.uuid().safeParse(req.params[name]);
  if (!parsed.success) throw notFound(`No such ${what} in your organisation.`);
  return parsed.data;
};
const surveyIdOf = (req: Request) => idParam(req, 'id', 'survey');

/** The survey's own record: its report, status moves, revisions and their comparison. */
function surveyRecordRoutes({ review, reports }: Pick<AppServices, 'review' | 'reports'>): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/surveys/:id/report',
      // the firm's record of the survey: every member may read and print it
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        const units = z.enum(['si', 'us']).catch('si').parse(req.query.units);
        const html = renderReport(await reports.data(authOf(req), id, units));
        res.setHeader('Cache-Control', 'no-store');
        res.type('html').send(html);
      },
    },
    {
      method: 'post',
      path: '/surveys/:id/status',
      // Who may make which move is the transition table's business (shared/review/status.ts).
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        res.json(await review.changeStatus(authOf(req), id, StatusChangeRequestSchema.parse(req.body)));
      },
    },
    {
      method: 'get',
      path: '/surveys/:id/revisions',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        res.json({ surveyId: id, revisions: await review.revisions(authOf(req), id) });
      },
    },
    {
      method: 'get',
      path: '/surveys/:id/compare',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        const q = CompareQuerySchema.parse(req.query);
        res.json(await review.compare(authOf(req), id, q.a, q.b));
      },
    },
  ];
}

/** The desk's queue and one survey's review bundle. */
function deskRoutes({ review }: Pick<AppServices, 'review'>): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/review/queue',
      policy: REVIEW_READERS,
      handler: async (req, res) => {
        res.json({ items: await review.queue(authOf(req)) });
      },
    },
    {
      method: 'get',
      path: '/review/surveys/:id',
      policy: REVIEW_READERS,
      handler: async (req, res) => {
        res.json(await review.bundle(authOf(req), surveyIdOf(req)));
      },
    },
  ];
}

/** Comment threads: the reviewer asks, the surveyor answers, the reviewer closes. */
function commentRoutes({ review }: Pick<AppServices, 'review'>): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/review/surveys/:id/comments',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        res.json({ comments: await review.listComments(authOf(req), surveyIdOf(req)) });
      },
    },
    {
      method: 'post',
      path: '/review/surveys/:id/comments',
      // The surveyor answers in the same thread.
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        res.status(201).json(await review.addComment(authOf(req), id, NewCommentSchema.parse(req.body)));
      },
    },
    {
      method: 'put',
      path: '/review/surveys/:id/comments/:commentId/resolution',
      // Only the reviewer closes a thread; the surveyor answers it.
      policy: ENGINEER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        res.json(await review.resolveComment(authOf(req), id, idParam(req, 'commentId', 'comment'), CommentResolutionSchema.parse(req.body)));
      },
    },
  ];
}

/** What the engineer decides: verdicts and operating limits. */
function verdictAndLimitRoutes({ review }: Pick<AppServices, 'review'>): RouteSpec[] {
  return [
    {
      method: 'put',
      path: '/review/surveys/:id/verdicts',
      policy: ENGINEER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        res.json(await review.setVerdict(authOf(req), id, SetVerdictSchema.parse(req.body)));
      },
    },
    {
      method: 'post',
      path: '/review/surveys/:id/limits',
      policy: ENGINEER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        res.status(201).json(await review.addLimit(authOf(req), id, NewLimitSchema.parse(req.body)));
      },
    },
    {
      method: 'delete',
      path: '/review/surveys/:id/limits/:limitId',
      policy: ENGINEER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        await review.removeLimit(authOf(req), id, idParam(req, 'limitId', 'limit'));
        res.status(204).end();
      },
    },
  ];
}

/** The master's brief links: issued by the engineer, withdrawn by the engineer or an admin. */
function briefLinkRoutes({ briefs }: Pick<AppServices, 'briefs'>): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/review/surveys/:id/briefs',
      policy: ENGINEER,
      handler: async (req, res) => {
        const id = surveyIdOf(req);
        res.status(201).json(await briefs.issue(authOf(req), id, IssueBriefSchema.parse(req.body)));
      },
    },
    {
      method: 'post',
      path: '/review/briefs/:briefId/revoke',
      policy: REVIEW_READERS,
      handler: async (req, res) => {
        res.json(await briefs.revoke(authOf(req), idParam(req, 'briefId', 'brief link')));
      },
    },
  ];
}

export function reviewRoutes(services: Pick<AppServices, 'review' | 'briefs' | 'reports'>): RouteSpec[] {
  return [
    ...surveyRecordRoutes(services),
    ...deskRoutes(services),
    ...commentRoutes(services),
    ...verdictAndLimitRoutes(services),
    ...briefLinkRoutes(services),
  ];
}
