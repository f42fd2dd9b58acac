/**
 * Master's brief links: issue (token made here, only its hash stored, sent by e-mail through the
 * app's mailer), revoke, and open. Opening a link answers the same way for a token that never
 * existed, one that expired and one that was revoked.
 */
import type { Knex } from 'knex';
import type { BriefLink, IssueBrief } from '@shared/api/review';
import { ENGINE_VERSION, type SurveyResults } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import type { Verdict } from '@shared/api/review';
import { standingAcceptance } from '@shared/review/reviewed';
import { UpgradingSurveySchema } from '@shared/schemas/survey';
import { BRIEFABLE_STATUSES, STATUS_LABELS } from '@shared/review/status';
import type { Config } from '../config';
import type { AuthContext } from '../http/auth-context';
import { conflict, notFound } from '../errors';
import type { Mailer } from '../mail/mailer';
import { briefMail } from '../mail/brief-mail';
import { hashSecret, issueSecret, looksLikeSecret } from './secrets';
import type { BriefPageData } from '../brief/brief-data';
import { briefSeenToken } from '../brief/brief-seen';
import * as repo from '../db/repositories/review';
import { ensureResults } from './engine-results';

interface BriefDeps {
  db: Knex;
  config: Pick<Config, 'publicUrl'>;
  mailer: Mailer;
}
type StatusEvents = Awaited<ReturnType<typeof repo.listStatusEvents>>;

/** The revision a brief shows: the accepted one while an acceptance stands for an older revision, else the current one. */
function shownRevision(events: StatusEvents, revision: number): number {
  const accepted = standingAcceptance(events);
  return accepted && accepted.revision < revision ? accepted.revision : revision;
}

async function issue({ db, config, mailer }: BriefDeps, auth: AuthContext, surveyId: string, body: IssueBrief): Promise<{ link: BriefLink; url: string }> {
  const s = await repo.findSurvey(db, auth.orgId, surveyId);
  if (!s) throw notFound('No such survey in your organisation.');
  if (!BRIEFABLE_STATUSES.includes(s.status)) {
    throw conflict(`A brief is sent for a survey under review or accepted; this one is “${STATUS_LABELS[s.status]}”.`);
  }
  const { token, hash } = issueSecret();
  const expiresAt = new Date(Date.now() + body.expiresInHours * 3600_000);
  const link = await repo.insertBrief(db, {
    surveyId,
    orgId: auth.orgId,
    tokenHash: hash,
    recipientEmail: body.recipientEmail,
    units: body.units,
    revision: s.revision,
    expiresAt,
    createdBy: auth.userId,
  });
  const url = new URL(`/brief/${token}`, config.publicUrl).toString();
  await mailBrief(db, mailer, auth, { to: body.recipientEmail, url, expiresAt, doc: s.doc });
  return { link, url };
}

/** The link's e-mail, sent as the engineer (the development mailbox shows it to them). */
async function mailBrief(db: Knex, mailer: Mailer, auth: AuthContext, brief: { to: string; url: string; expiresAt: Date; doc: unknown }) {
  const parsed = UpgradingSurveySchema.safeParse(brief.doc);
  const [engineerName, organisationName] = await Promise.all([repo.userName(db, auth.userId), repo.organisationName(db, auth.orgId)]);
  await mailer.send({
    to: brief.to,
    orgId: auth.orgId,
    sentBy: auth.userId,
    ...briefMail({
      url: brief.url,
      vesselName: parsed.success ? parsed.data.vessel.name : 'the vessel',
      surveyTitle: parsed.success ? parsed.data.title : '',
      engineerName,
      organisationName,
      expiresAt: brief.expiresAt,
    }),
  });
}

async function revoke(db: Knex, auth: AuthContext, briefId: string): Promise<BriefLink> {
  const found = await repo.findBriefInOrg(db, auth.orgId, briefId);
  if (!found) throw notFound('No such brief link in your organisation.');
  await repo.revokeBrief(db, briefId, auth.userId);
  const { surveyId: _s, ...link } = (await repo.findBriefInOrg(db, auth.orgId, briefId))!;
  return link;
}

/** The page's data for a live token, or null for any other (unknown, expired, revoked, malformed). */
async function open(db: Knex, token: string, meta: { ip: string | null; userAgent: string | null; log?: boolean }): Promise<BriefPageData | null> {
  if (!looksLikeSecret(token)) return null;
  const link = await repo.findLiveBrief(db, hashSecret(token));
  if (!link) return null;
  const s = await repo.findSurvey(db, link.orgId, link.surveyId);
  const parsed = s ? UpgradingSurveySchema.safeParse(s.doc) : null;
  if (!s || !parsed?.success) return null;
  const [events, verdicts, limits, reviewed, organisationName, issuer, acknowledgement] = await Promise.all([
    repo.listStatusEvents(db, s.id),
    repo.listVerdicts(db, [s.id]),
    repo.listLimits(db, [s.id]),
    repo.lastReviewEvent(db, s.id),
    repo.organisationName(db, link.orgId),
    repo.briefIssuer(db, link.id),
    repo.lastBriefAcknowledgement(db, link.id),
    meta.log === false ? Promise.resolve() : repo.logBriefOpening(db, link.id, meta.ip, meta.userAgent),
  ]);
  const shown = await reviewedFigures(db, s.id, s.status, s.revision, parsed.data, events, verdicts);
  return {
    ...shown,
    status: s.status,
    revision: s.revision,
    issuedRevision: link.revision,
    units: link.units,
    limits,
    organisationName,
    reviewedBy: shown.acceptedBy ?? (s.status === 'in_review' ? (reviewed?.name ?? null) : null),
    reviewedAt: shown.acceptedAt ?? (s.status === 'in_review' ? (reviewed?.at ?? null) : null),
    expiresAt: link.expiresAt,
    engineer: issuer,
    acknowledgement,
    token,
  };
}

/**
 * What the brief may show: never a verdict beside figures nobody reviewed.
 * - An acceptance stands (no "returned" after it) for an older revision than the current one:
 *   that revision's figures (`acceptedFigures`).
 * - The current revision is accepted, or under review: its figures and verdicts.
 * - Otherwise (sent, changed since review, returned, draft): the current figures with no verdict.
 */
async function reviewedFigures(db: Knex, surveyId: string, status: BriefPageData['status'], revision: number, doc: Survey, events: StatusEvents, verdicts: Verdict[]) {
  const accepted = standingAcceptance(events);
  if (accepted && shownRevision(events, revision) < revision) return acceptedFigures(db, surveyId, accepted, revision, doc, verdicts);
  const current = await ensureResults(db, surveyId, revision, doc);
  const reviewedNow = status === 'accepted' || status === 'in_review';
  // Under review with no acceptance: only verdicts given on this very revision.
  const shownVerdicts = !reviewedNow ? [] : accepted ? verdicts : verdicts.filter((v) => v.revision === revision);
  return {
    acceptedBy: accepted?.actorName ?? null,
    acceptedAt: accepted?.at ?? null,
    shownRevision: revision,
    newerRevision: null,
    verdicts: shownVerdicts,
    doc,
    results: (current.results as SurveyResults | null) ?? null,
    figuresWithheld: false,
  };
}

/**
 * An acceptance that stands for an older revision: that revision's document (kept when the change
 * came, review_snapshots) and its stored results, with the verdicts that stood when it was accepted;
 * `newerRevision` says newer figures exist. Without the kept document (a survey changed before this
 * rule), the figures are withheld.
 */
async function acceptedFigures(
  db: Knex,
  surveyId: string,
  accepted: StatusEvents[number],
  revision: number,
  doc: Survey,
  verdicts: Verdict[],
) {
  const kept = await repo.findSnapshot(db, surveyId, accepted.revision);
  const keptDoc = kept ? UpgradingSurveySchema.safeParse(kept) : null;
  const standing = verdicts.filter((v) => v.setAt <= accepted.at);
  const common = { acceptedBy: accepted.actorName ?? null, acceptedAt: accepted.at ?? null, shownRevision: accepted.revision, newerRevision: revision, verdicts: standing };
  if (!keptDoc?.success) return { ...common, doc, results: null, figuresWithheld: true };
  const stored =
    (await repo.findResultsExact(db, surveyId, accepted.revision, ENGINE_VERSION)) ?? (await ensureResults(db, surveyId, accepted.revision, keptDoc.data));
  return { ...common, doc: keptDoc.data, results: (stored.results as SurveyResults | null) ?? null, figuresWithheld: false };
}

/** What an acknowledgement post came to: logged, refused because the brief changed since it was read, or no live link. */
export type AcknowledgeOutcome = { kind: 'logged' } | { kind: 'changed'; brief: BriefPageData } | { kind: 'gone' };

/**
 * The master's "received and understood": logged with the revision the brief shows (the accepted
 * one while newer, unreviewed figures exist), the one the master read, and only when the form's
 * `seen` token (`briefSeenToken`) still matches the brief as it is now; otherwise the current
 * brief comes back to be read again. A missing token counts as changed.
 */
async function acknowledge(
  db: Knex,
  token: string,
  ack: { name: string; seen?: string },
  meta: { ip: string | null; userAgent: string | null },
): Promise<AcknowledgeOutcome> {
  const brief = await open(db, token, { ...meta, log: false });
  if (!brief) return { kind: 'gone' };
  if (ack.seen !== briefSeenToken(brief)) return { kind: 'changed', brief };
  const link = await repo.findLiveBrief(db, hashSecret(token));
  if (!link) return { kind: 'gone' };
  await repo.insertBriefAcknowledgement(db, { briefId: link.id, name: ack.name, revision: brief.shownRevision ?? brief.revision, ip: meta.ip, userAgent: meta.userAgent });
  return { kind: 'logged' };
}

export function createBriefService(deps: BriefDeps) {
  const { db } = deps;
  return {
    issue: (auth: AuthContext, surveyId: string, body: IssueBrief) => issue(deps, auth, surveyId, body),
    revoke: (auth: AuthContext, briefId: string) => revoke(db, auth, briefId),
    open: (token: string, meta: { ip: string | null; userAgent: string | null; log?: boolean }) => open(db, token, meta),
    acknowledge: (token: string, ack: { name: string; seen?: string }, meta: { ip: string | null; userAgent: string | null }) => acknowledge(db, token, ack, meta),
  };
}

export type BriefService = ReturnType<typeof createBriefService>;
