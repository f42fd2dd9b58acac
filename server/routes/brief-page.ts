/**
 * GET /brief/:token — the master's brief, server-rendered. Not under /api and not the SPA: no
 * sign-in, no script. Unknown, expired, revoked and malformed tokens all get the same 404 page.
 */
import express, { type Response } from 'express';
import { BriefAcknowledgementSchema } from '@shared/api/review';
import { PUBLIC, type RouteSpec } from '../http/route';
import type { BriefService } from '../services/briefs';
import { renderBriefNotFound, renderBriefPage } from '../brief/render-brief';

export const BRIEF_CHANGED_NOTICE = 'This brief changed after you opened it: read it again, then acknowledge.';

function privateHeaders(res: Response): void {
  res.setHeader('Cache-Control', 'no-store');
  res.setHeader('Pragma', 'no-cache');
  res.setHeader('X-Robots-Tag', 'noindex, nofollow, noarchive');
  res.setHeader('Referrer-Policy', 'no-referrer');
  res.setHeader('Content-Type', 'text/html; charset=utf-8');
}

export function briefPageRoutes(briefs: BriefService): RouteSpec[] {  return [
    {
      method: 'get',
      path: '/brief/:token',
      policy: PUBLIC,
      handler: async (req, res) => {
        privateHeaders(res);
        const data = await briefs.open(String(req.params.token), { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null });
        if (!data) {
          res.status(404).send(renderBriefNotFound());
          return;
        }
        res.status(200).send(renderBriefPage(data));
      },
    },
    {
      method: 'post',
      path: '/brief/:token/acknowledge',
      policy: PUBLIC,
      // a plain HTML form: works with no script on the bridge's phone
      before: [express.urlencoded({ extended: false, limit: '4kb' })],
      handler: async (req, res) => {
        privateHeaders(res);
        const token = String(req.params.token);
        const meta = { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null };
        const parsed = BriefAcknowledgementSchema.safeParse(req.body ?? {});
        if (!parsed.success) {
          const data = await briefs.open(token, { ...meta, log: false });
          if (!data) {
            res.status(404).send(renderBriefNotFound());
            return;
          }
          res.status(400).send(renderBriefPage(data, { ackError: parsed.error.issues[0]?.message ?? 'Write your name and rank.' }));
          return;
        }
        const outcome = await briefs.acknowledge(token, parsed.data, meta);
        if (outcome.kind === 'gone') {
          res.status(404).send(renderBriefNotFound());
          return;
        }
        if (outcome.kind === 'changed') {
          // the page the master read is not the brief now: show the current one, keep the typed name
          res.status(409).send(renderBriefPage(outcome.brief, { ackNotice: BRIEF_CHANGED_NOTICE, ackName: parsed.data.name }));
          return;
        }
        // post, redirect, get: a reload does not send it twice
        res.redirect(303, `/brief/${encodeURIComponent(token)}#acknowledged`);
      },
    },
  ];
}
