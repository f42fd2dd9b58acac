/**
 * GET /brief/:token — the master's brief, server-rendered. Not under /api and not the SPA: no
 * sign-in, no script. Unknown, expired, revoked and malformed tokens all get the same 404 page.
 */
import type { Response } from 'express';
import { PUBLIC, type RouteSpec } from '../http/route';
import type { BriefService } from '../services/briefs';
import { renderBriefNotFound, renderBriefPage } from '../brief/render-brief';

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
  ];
}
