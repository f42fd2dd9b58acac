/**
 * The composition root's other half: every service of the app, each built once from the app's
 * dependencies. `createApp` calls this and hands each route group the services it uses.
 */
import type { AppContext } from '../context';
import type { AccessVerifier } from '../http/route';
import { createAccessVerifier } from './access';
import { createAuthService } from './auth';
import { createInvitationService } from './invitations';
import { createMemberService } from './members';
import { createDevMailService } from './dev-mail';
import { createHealthService } from './health';
import { createSurveyService } from './surveys';
import { createSyncService } from './sync/service';
import { createReviewService } from './review';
import { createBriefService } from './briefs';
import { createReportService } from './report';
import { createPhotoService } from './photos';

export function createServices(ctx: AppContext) {
  const auth = createAuthService(ctx);
  const surveys = createSurveyService(ctx);
  return {
    access: createAccessVerifier(ctx) as AccessVerifier,
    health: createHealthService(ctx),
    auth,
    invitations: createInvitationService({ ...ctx, auth }),
    members: createMemberService(ctx),
    devMail: createDevMailService(ctx),
    surveys,
    sync: createSyncService({ db: ctx.db, scheduler: surveys.scheduler }),
    review: createReviewService(ctx),
    briefs: createBriefService(ctx),
    reports: createReportService(ctx),
    photos: createPhotoService(ctx),
  };
}

export type AppServices = ReturnType<typeof createServices>;
