/**
 * Request and response bodies of the review desk and the master's brief (zod; types by z.infer).
 * Plain words for verdicts and limits live here too, so the desk, the surveyor's notes and the brief
 * say the same thing.
 */
import { z } from 'zod';
import { SurveyStatusSchema } from '../review/status';
import { ChangeLineSchema } from '../review/survey-changes';

const Id = z.uuid();

// ---- status -------------------------------------------------------------------------------------

export const StatusChangeRequestSchema = z.object({
  to: SurveyStatusSchema,
  note: z.string().trim().max(2000).optional(),
});
export type StatusChangeRequest = z.infer<typeof StatusChangeRequestSchema>;

export const StatusEventSchema = z.object({
  id: Id,
  from: SurveyStatusSchema,
  to: SurveyStatusSchema,
  note: z.string().nullable(),
  actorName: z.string(),
  revision: z.number().int(),
  at: z.string(),
});
export type StatusEvent = z.infer<typeof StatusEventSchema>;

export const StatusChangeResponseSchema = z.object({
  surveyId: Id,
  status: SurveyStatusSchema,
  event: StatusEventSchema,
});

// ---- items a comment can be attached to ---------------------------------------------------------

export const COMMENT_TARGET_KINDS = ['survey', 'vessel', 'condition', 'compartment', 'boundary', 'photo'] as const;
export const CommentTargetSchema = z.object({
  kind: z.enum(COMMENT_TARGET_KINDS),
  /** The item's id in the survey document; the survey's own id for 'survey' and 'vessel'. */
  id: z.string().min(1).max(100),
});
export type CommentTarget = z.infer<typeof CommentTargetSchema>;

export const NewCommentSchema = z.object({
  target: CommentTargetSchema,
  body: z.string().trim().min(1).max(4000),
  /** Reply to this comment (threads are one level deep: replies attach to the thread's first comment). */
  parentId: Id.optional(),
  /**
   * Made by the device that wrote it offline: sending the same comment again (a lost answer) returns
   * the comment already made instead of a second one.
   */
  id: Id.optional(),
});
export type NewComment = z.infer<typeof NewCommentSchema>;

export const ReviewCommentSchema = z.object({
  id: Id,
  surveyId: Id,
  target: CommentTargetSchema,
  parentId: Id.nullable(),
  body: z.string(),
  authorName: z.string(),
  authorRole: z.string(),
  revision: z.number().int(),
  createdAt: z.string(),
  /** On a thread's first comment: when the reviewer closed the thread (absent from older servers). */
  resolvedAt: z.string().nullable().optional(),
  resolvedByName: z.string().nullable().optional(),
});
export type ReviewComment = z.infer<typeof ReviewCommentSchema>;

export const CommentResolutionSchema = z.object({ resolved: z.boolean() });
export type CommentResolution = z.infer<typeof CommentResolutionSchema>;

// ---- verdicts -----------------------------------------------------------------------------------

export const BOUNDARY_VERDICTS = ['sound', 'sound_if_shored', 'load_no_further', 'unsafe'] as const;
export const BoundaryVerdictValueSchema = z.enum(BOUNDARY_VERDICTS);
export type BoundaryVerdictValue = z.infer<typeof BoundaryVerdictValueSchema>;

export const BOUNDARY_VERDICT_LABELS: Record<BoundaryVerdictValue, string> = {
  sound: 'Sound',
  sound_if_shored: 'Sound once shored',
  load_no_further: 'Load no further',
  unsafe: 'Unsafe',
};
/** The same verdicts said as a sentence for the master. */
export const BOUNDARY_VERDICT_MEANINGS: Record<BoundaryVerdictValue, string> = {
  sound: 'holds the present load',
  sound_if_shored: 'holds only once the shoring is in place',
  load_no_further: 'must not carry more load than now',
  unsafe: 'may fail: keep people clear and reduce the load',
};

export const SURVEY_VERDICTS = ['proceed', 'proceed_within_limits', 'do_not_proceed'] as const;
export const SurveyVerdictValueSchema = z.enum(SURVEY_VERDICTS);
export type SurveyVerdictValue = z.infer<typeof SurveyVerdictValueSchema>;
export const SURVEY_VERDICT_LABELS: Record<SurveyVerdictValue, string> = {
  proceed: 'Numbers checked: proceed as planned',
  proceed_within_limits: 'Numbers checked: proceed only within the limits below',
  do_not_proceed: 'Do not proceed as planned',
};

export const SetVerdictSchema = z.discriminatedUnion('scope', [
  z.object({ scope: z.literal('survey'), verdict: SurveyVerdictValueSchema, note: z.string().trim().max(2000).optional() }),
  z.object({
    scope: z.literal('boundary'),
    boundaryId: z.string().min(1).max(100),
    verdict: BoundaryVerdictValueSchema,
    note: z.string().trim().max(2000).optional(),
  }),
]);
export type SetVerdict = z.infer<typeof SetVerdictSchema>;

export const VerdictSchema = z.object({
  scope: z.enum(['survey', 'boundary']),
  boundaryId: z.string().nullable(),
  verdict: z.string(),
  note: z.string().nullable(),
  setByName: z.string(),
  revision: z.number().int(),
  setAt: z.string(),
});
export type Verdict = z.infer<typeof VerdictSchema>;

// ---- operating limits ---------------------------------------------------------------------------

/** Structured operating limits; every one also carries optional free text. Levels and pressures SI. */
export const LimitRuleSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('keep_level_above'), compartmentId: z.string().min(1), levelM: z.number().min(-50).max(100) }),
  z.object({ kind: z.literal('keep_level_below'), compartmentId: z.string().min(1), levelM: z.number().min(-50).max(100) }),
  z.object({ kind: z.literal('no_pumping_until_shored'), compartmentId: z.string().min(1), boundaryId: z.string().min(1) }),
  z.object({ kind: z.literal('max_net_pressure'), boundaryId: z.string().min(1), pressurePa: z.number().positive().max(1e8) }),
  z.object({ kind: z.literal('text') }),
]);
export type LimitRule = z.infer<typeof LimitRuleSchema>;
export const LIMIT_KIND_LABELS: Record<LimitRule['kind'], string> = {
  keep_level_above: 'Keep a compartment’s level above',
  keep_level_below: 'Keep a compartment’s level below',
  no_pumping_until_shored: 'Do not pump a compartment until a boundary is shored',
  max_net_pressure: 'Highest net pressure on a boundary',
  text: 'Other (words only)',
};

export const NewLimitSchema = z
  .object({ rule: LimitRuleSchema, text: z.string().trim().max(2000).optional() })
  .refine((l) => l.rule.kind !== 'text' || (l.text ?? '').length > 0, { message: 'write the limit', path: ['text'] });
export type NewLimit = z.infer<typeof NewLimitSchema>;

export const OperatingLimitSchema = z.object({
  id: Id,
  rule: LimitRuleSchema,
  text: z.string().nullable(),
  createdByName: z.string(),
  revision: z.number().int(),
  createdAt: z.string(),
});
export type OperatingLimit = z.infer<typeof OperatingLimitSchema>;

// ---- queue, review bundle -----------------------------------------------------------------------

export const QueueItemSchema = z.object({
  surveyId: Id,
  title: z.string(),
  vesselName: z.string(),
  status: SurveyStatusSchema,
  revision: z.number().int(),
  surveyorName: z.string().nullable(),
  submittedAt: z.string().nullable(),
  soundingsAt: z.string().nullable(),
  worstUtilisation: z.number().nullable(),
  worstBoundaryName: z.string().nullable(),
  engineVersion: z.string().nullable(),
});
export type QueueItem = z.infer<typeof QueueItemSchema>;
export const QueueResponseSchema = z.object({ items: z.array(QueueItemSchema) });

/** Everything the review desk shows about one survey; `doc` and `results` are the stored JSON. */
export const ReviewBundleSchema = z.object({
  surveyId: Id,
  status: SurveyStatusSchema,
  revision: z.number().int(),
  submittedById: Id.nullable(),
  doc: z.unknown(),
  serverResults: z.unknown().nullable(),
  serverEngineVersion: z.string().nullable(),
  serverComputedRevision: z.number().int().nullable(),
  comments: z.array(ReviewCommentSchema),
  verdicts: z.array(VerdictSchema),
  limits: z.array(OperatingLimitSchema),
  events: z.array(StatusEventSchema),
  briefs: z.array(z.lazy(() => BriefLinkSchema)),
  /**
   * Set when the survey changed after it was sent, under review or accepted (shared/review/reviewed.ts):
   * the revision compared with and every change since it, in plain words. `lines` is empty with
   * `documentKept` false when that revision's document is not kept (changed before the rule existed).
   */
  sinceReview: z
    .object({
      revision: z.number().int(),
      reviewed: z.enum(['accepted', 'submitted', 'in_review']),
      acceptedBy: z.string().nullable(),
      acceptedAt: z.string().nullable(),
      documentKept: z.boolean(),
      lines: z.array(ChangeLineSchema),
      total: z.number().int(),
    })
    .nullable(),
  /** Who is looking, so the desk offers only what the server will allow. */
  viewer: z.object({ userId: Id, role: z.enum(['admin', 'engineer', 'surveyor']) }),
  /** The viewer made, edited or sent this survey at some revision, so may not accept it (the own-work rule). */
  viewerWorkedOn: z.boolean(),
  organisationName: z.string(),
});
export type ReviewBundle = z.infer<typeof ReviewBundleSchema>;

/** What flows to a surveyor's device in the sync pull's `extras.review`, per survey. */
export const ReviewNotesSchema = z.object({
  surveyId: Id,
  status: SurveyStatusSchema,
  comments: z.array(ReviewCommentSchema),
  verdicts: z.array(VerdictSchema),
  limits: z.array(OperatingLimitSchema),
  lastEvent: StatusEventSchema.nullable(),
});
export type ReviewNotes = z.infer<typeof ReviewNotesSchema>;

// ---- history ------------------------------------------------------------------------------------

/** One line of a revision's trail: entity ('survey', 'vessel', 'boundary'…) and its id, field (null: added or removed), old → new. */
export const FieldChangeSchema = z.object({
  entity: z.string(),
  entityId: z.string().nullable(),
  field: z.string().nullable(),
  old: z.unknown(),
  new: z.unknown(),
});
export type FieldChange = z.infer<typeof FieldChangeSchema>;

export const RevisionEntrySchema = z.object({
  revision: z.number().int(),
  authorName: z.string().nullable(),
  at: z.string(),
  changes: z.array(FieldChangeSchema),
  engineVersion: z.string().nullable(),
  worstUtilisation: z.number().nullable(),
});
export type RevisionEntry = z.infer<typeof RevisionEntrySchema>;
export const RevisionsResponseSchema = z.object({ surveyId: Id, revisions: z.array(RevisionEntrySchema) });

/** Both optional: b defaults to the current revision, a to the one before it. */
export const CompareQuerySchema = z.object({ a: z.coerce.number().int().min(1).optional(), b: z.coerce.number().int().min(1).optional() });

export const NumberDifferenceSchema = z.object({
  path: z.string(),
  a: z.number().nullable(),
  b: z.number().nullable(),
  relative: z.number().nullable(),
});
export type NumberDifference = z.infer<typeof NumberDifferenceSchema>;

export const BoundaryComparisonSchema = z.object({
  boundaryId: z.string(),
  name: z.string(),
  a: z.object({ netForceN: z.number(), peakPressurePa: z.number(), maxUtilisation: z.number().nullable() }).nullable(),
  b: z.object({ netForceN: z.number(), peakPressurePa: z.number(), maxUtilisation: z.number().nullable() }).nullable(),
});
export const CompareResponseSchema = z.object({
  surveyId: Id,
  a: z.object({ revision: z.number().int(), engineVersion: z.string().nullable() }),
  b: z.object({ revision: z.number().int(), engineVersion: z.string().nullable() }),
  boundaries: z.array(BoundaryComparisonSchema),
  differences: z.array(NumberDifferenceSchema),
  differenceCount: z.number().int(),
});
export type CompareResponse = z.infer<typeof CompareResponseSchema>;

// ---- master's brief -----------------------------------------------------------------------------

export const IssueBriefSchema = z.object({
  recipientEmail: z.email().max(254),
  /** Hours until the link stops working: one hour to thirty days. */
  expiresInHours: z.number().int().min(1).max(24 * 30),
  units: z.enum(['si', 'us']),
});
export type IssueBrief = z.infer<typeof IssueBriefSchema>;

export const BriefLinkSchema = z.object({
  id: Id,
  recipientEmail: z.string(),
  units: z.enum(['si', 'us']),
  revision: z.number().int(),
  expiresAt: z.string(),
  createdAt: z.string(),
  createdByName: z.string(),
  revokedAt: z.string().nullable(),
  openings: z.number().int(),
  lastOpenedAt: z.string().nullable(),
  /** The master's latest "received and understood", if any (absent from older servers). */
  acknowledgement: z.object({ name: z.string(), at: z.string(), revision: z.number().int() }).nullable().optional(),
});
export type BriefLink = z.infer<typeof BriefLinkSchema>;

/** The master's acknowledgement, posted by a plain HTML form (no script): a name is all it asks. */
export const BriefAcknowledgementSchema = z.object({
  name: z.string().trim().min(1, 'Write your name and rank.').max(120, 'At most 120 characters.'),
  /** The brief as the master saw it (revision and a short hash, from the form's hidden field); the server refuses a stale one. */
  seen: z.string().max(80).optional(),
});

export const IssueBriefResponseSchema = z.object({
  link: BriefLinkSchema,
  /** Only in the answer to the engineer who issued it; the server keeps only the token's hash. */
  url: z.string(),
});
