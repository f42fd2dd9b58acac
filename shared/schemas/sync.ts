/**
 * The sync protocol between a device and the server. A device edits its copy of a survey and
 * records each edit as a `SurveyChange` with a client-made id and a per-device sequence number;
 * the server applies every change exactly once, merging entity by entity (and field by field)
 * against the revision the device had seen, and keeps both values as a conflict when two devices
 * changed the same thing since that revision.
 */
import { z } from 'zod';
import {
  BoundarySchema,
  CompartmentSchema,
  ConditionSchema,
  FluidOverrideSchema,
  PhotoRefSchema,
  SurveySchema,
  UpgradingSurveySchema,
} from './survey';

const shape = SurveySchema.shape;

/**
 * The lifecycle of a survey on the server; the review desk moves it along. `changed_since_review`:
 * an edit was applied while the survey was sent, under review or accepted, so it needs review again
 * (set by the database itself, migration 20261204000100_changed_since_review).
 */
export const SurveyStatusSchema = z.enum(['draft', 'submitted', 'in_review', 'accepted', 'returned', 'changed_since_review']);
export type SurveyStatus = z.infer<typeof SurveyStatusSchema>;

/** The top-level fields of a survey a `set` change may replace. */
export const SURVEY_SET_PATHS = ['title', 'casualtyDescription', 'vessel', 'vesselId', 'activeConditionId'] as const;
export type SurveySetPath = (typeof SURVEY_SET_PATHS)[number];
export const SurveySetPathSchema = z.enum(SURVEY_SET_PATHS);

/** The arrays of entities (each with an `id`) inside a survey. */
/** The largest value of a PostgreSQL integer column (sequence numbers and revisions are stored as one). */
export const PG_INT_MAX = 2 ** 31 - 1;

export const SURVEY_COLLECTIONS = ['conditions', 'compartments', 'boundaries', 'fluids', 'photos'] as const;
export type SurveyCollection = (typeof SURVEY_COLLECTIONS)[number];
export const SurveyCollectionSchema = z.enum(SURVEY_COLLECTIONS);

/** The schema of one entity of each collection. */
export const COLLECTION_ENTITY_SCHEMAS = {
  conditions: ConditionSchema,
  compartments: CompartmentSchema,
  boundaries: BoundarySchema,
  fluids: FluidOverrideSchema,
  photos: PhotoRefSchema,
} as const;

/** The schema of the value of each settable top-level field. */
export const SET_PATH_SCHEMAS = {
  title: shape.title,
  casualtyDescription: shape.casualtyDescription,
  vessel: shape.vessel,
  vesselId: z.uuid(),
  activeConditionId: shape.activeConditionId,
} as const;

const setOp = <P extends SurveySetPath, S extends z.ZodType>(path: P, value: S) =>
  z.object({ kind: z.literal('set'), path: z.literal(path), value });

export const SetOpSchema = z.discriminatedUnion('path', [
  setOp('title', SET_PATH_SCHEMAS.title),
  setOp('casualtyDescription', SET_PATH_SCHEMAS.casualtyDescription),
  setOp('vessel', SET_PATH_SCHEMAS.vessel),
  setOp('vesselId', SET_PATH_SCHEMAS.vesselId),
  setOp('activeConditionId', SET_PATH_SCHEMAS.activeConditionId),
]);

/**
 * `fields`: the top-level fields of the entity this edit changed (the device store fills it in by
 * comparing with the entity before the edit). The server merges only those fields, so two devices
 * editing different fields of the same boundary both keep their work. Absent: every field that
 * differs from the server's copy counts as changed.
 */
const upsertOp = <C extends SurveyCollection, S extends z.ZodType>(collection: C, entity: S) =>
  z.object({
    kind: z.literal('upsert'),
    collection: z.literal(collection),
    entity,
    fields: z.array(z.string().min(1).max(64)).max(64).optional(),
  });

export const UpsertOpSchema = z.discriminatedUnion('collection', [
  upsertOp('conditions', ConditionSchema),
  upsertOp('compartments', CompartmentSchema),
  upsertOp('boundaries', BoundarySchema),
  upsertOp('fluids', FluidOverrideSchema),
  upsertOp('photos', PhotoRefSchema),
]);

/** Most steps a patch's path may take into an entity (condition → contents → compartment → layers → layer → level → …). */
export const MAX_PATCH_DEPTH = 12;

/**
 * One field of an entity changed in place: the lean form of an upsert that changed a single field
 * (a layer's sounding, not the whole condition). `path` starts at the entity's field and walks down:
 * an object's key, or, inside a list, the key of an item (its `id`, or a contents' `compartmentId`).
 * `value` is the new value there; absent, the key is removed. The server applies it to its own copy
 * of the entity and validates the whole survey after it, exactly as for an upsert; the merge tracks
 * the entity's field (`path[0]`), as for an upsert.
 */
export const PatchOpSchema = z.object({
  kind: z.literal('patch'),
  collection: SurveyCollectionSchema,
  entityId: z.string().min(1).max(200),
  path: z.array(z.string().min(1).max(200)).min(1).max(MAX_PATCH_DEPTH),
  value: z.unknown().optional(),
});

export const DeleteOpSchema = z.object({
  kind: z.literal('delete'),
  collection: SurveyCollectionSchema,
  entityId: z.string().min(1).max(200),
});

/** What a conflict is about: a top-level field, a whole entity (edit against delete), or one field of an entity. */
export const ConflictTargetSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('field'), path: SurveySetPathSchema }),
  z.object({ kind: z.literal('entity'), collection: SurveyCollectionSchema, entityId: z.string().min(1) }),
  z.object({
    kind: z.literal('entity-field'),
    collection: SurveyCollectionSchema,
    entityId: z.string().min(1),
    field: z.string().min(1).max(64),
  }),
]);
export type ConflictTarget = z.infer<typeof ConflictTargetSchema>;

/**
 * The user's choice for a conflict. `value` is the chosen value of the target; `null` for an
 * entity target means "deleted". The server checks it against the target's schema.
 */
export const ResolveConflictOpSchema = z.object({
  kind: z.literal('resolve-conflict'),
  conflictId: z.uuid(),
  target: ConflictTargetSchema,
  value: z.unknown(),
});

export const CreateOpSchema = z.object({ kind: z.literal('create'), survey: UpgradingSurveySchema });

/**
 * "Send for review", queued on the device like any edit so it works offline and follows the edits
 * made before it: the server moves the survey to "sent for review" when the push reaches it (the
 * same rules as POST /api/surveys/:id/status). It changes nothing in the document.
 */
export const SubmitOpSchema = z.object({ kind: z.literal('submit') });

export const SurveyOpSchema = z.discriminatedUnion('kind', [
  CreateOpSchema,
  SetOpSchema,
  UpsertOpSchema,
  PatchOpSchema,
  DeleteOpSchema,
  ResolveConflictOpSchema,
  SubmitOpSchema,
]);
export type SurveyOp = z.infer<typeof SurveyOpSchema>;
export type SetOp = z.infer<typeof SetOpSchema>;
export type UpsertOp = z.infer<typeof UpsertOpSchema>;
export type DeleteOp = z.infer<typeof DeleteOpSchema>;
export type PatchOp = z.infer<typeof PatchOpSchema>;
export type ResolveConflictOp = z.infer<typeof ResolveConflictOpSchema>;

/** One edit made on a device. (deviceId, seq) and id are both idempotency keys. */
export const SurveyChangeSchema = z
  .object({
    id: z.uuid(),
    deviceId: z.uuid(),
    seq: z.number().int().min(1).max(PG_INT_MAX),
    surveyId: z.uuid(),
    /** The server revision of the survey the device had when the edit was made (0: never synced). */
    baseRevision: z.number().int().min(0).max(PG_INT_MAX),
    createdAt: z.iso.datetime({ offset: true }),
    op: SurveyOpSchema,
  })
  .refine((c) => c.op.kind !== 'create' || c.op.survey.id === c.surveyId, {
    path: ['op', 'survey', 'id'],
    message: 'the created survey must have the change’s surveyId',
  });
export type SurveyChange = z.infer<typeof SurveyChangeSchema>;

/** Most changes one push may carry; a device with more sends several pushes. */
export const MAX_PUSH_CHANGES = 500;

export const PushRequestSchema = z.object({ changes: z.array(SurveyChangeSchema).min(1).max(MAX_PUSH_CHANGES) });
export type PushRequest = z.infer<typeof PushRequestSchema>;

export const PushStatusSchema = z.enum(['applied', 'duplicate', 'conflict', 'rejected']);
export type PushStatus = z.infer<typeof PushStatusSchema>;

export const PushResultSchema = z.object({
  changeId: z.uuid(),
  deviceId: z.uuid(),
  seq: z.number().int(),
  /**
   * applied: merged into the survey; duplicate: this change was already processed (its first
   * outcome is in `firstStatus`); conflict: some or all of it collided with another device's edit,
   * see `conflictIds`; rejected: permanently refused, `reason` says why.
   */
  status: PushStatusSchema,
  firstStatus: PushStatusSchema.optional(),
  surveyId: z.uuid(),
  /** The survey revision after this change (unchanged when nothing was applied). */
  revision: z.number().int().optional(),
  conflictIds: z.array(z.uuid()).optional(),
  reason: z.string().optional(),
});
export type PushResult = z.infer<typeof PushResultSchema>;

export const UserRefSchema = z.object({ id: z.uuid(), name: z.string() });
export type UserRef = z.infer<typeof UserRefSchema>;

/** Two values for the same thing: `kept` is what the survey holds, `proposed` the edit that collided with it. */
export const ConflictSchema = z.object({
  id: z.uuid(),
  surveyId: z.uuid(),
  target: ConflictTargetSchema,
  /** The value the pushed change wanted (null: it deleted the entity). */
  proposed: z.unknown(),
  /** The value the survey keeps until the conflict is resolved (null: the entity was deleted). */
  kept: z.unknown(),
  baseRevision: z.number().int(),
  keptRevision: z.number().int(),
  proposedBy: UserRefSchema,
  proposedDeviceId: z.uuid(),
  keptBy: UserRefSchema.nullable(),
  changeId: z.uuid(),
  status: z.enum(['open', 'resolved']),
  createdAt: z.string(),
  resolvedAt: z.string().nullable(),
  resolvedBy: UserRefSchema.nullable(),
});
export type Conflict = z.infer<typeof ConflictSchema>;

export const PushResponseSchema = z.object({
  results: z.array(PushResultSchema),
  /** Conflict records created by this push, for the device to show at once. */
  conflicts: z.array(ConflictSchema),
  serverTime: z.string(),
});
export type PushResponse = z.infer<typeof PushResponseSchema>;

/** Engine results stored for one revision (the engine's own output type is `SurveyResults` in shared/engine). */
export const StoredResultsSchema = z.object({
  revision: z.number().int(),
  engineVersion: z.string(),
  computedAt: z.string(),
  /** What computeSurvey returned (null when it failed; `error` says why). */
  results: z.unknown(),
  error: z.string().nullable(),
});
export type StoredResults = z.infer<typeof StoredResultsSchema>;

export const SurveySummarySchema = z.object({
  id: z.uuid(),
  title: z.string(),
  vesselName: z.string(),
  status: SurveyStatusSchema,
  revision: z.number().int(),
  createdBy: UserRefSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
  /** Time of the active condition's soundings. */
  soundingsAt: z.string().nullable(),
  openConflicts: z.number().int(),
});
export type SurveySummary = z.infer<typeof SurveySummarySchema>;

export const SurveyDetailSchema = SurveySummarySchema.extend({
  doc: UpgradingSurveySchema,
  results: StoredResultsSchema.nullable(),
  conflicts: z.array(ConflictSchema),
});
export type SurveyDetail = z.infer<typeof SurveyDetailSchema>;

/** `a,b` or `?x=a&x=b` → ['a', 'b']. */
const splitList = (v: unknown): unknown => {
  if (v === undefined || v === '') return undefined;
  const list: unknown[] = Array.isArray(v) ? v : [v];
  return list.flatMap((s) => String(s).split(',')).map((s) => s.trim()).filter(Boolean);
};

export const SURVEY_SORTS = ['updated', 'created', 'title', 'vessel', 'soundings', 'status'] as const;

export const ListSurveysQuerySchema = z.object({
  /** One status, or several separated by commas (or repeated). */
  status: z.preprocess(splitList, z.array(SurveyStatusSchema).optional()),
  q: z.string().trim().max(200).optional(),
  sort: z.enum(SURVEY_SORTS).default('updated'),
  order: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type ListSurveysQuery = z.infer<typeof ListSurveysQuerySchema>;

export const SurveyListResponseSchema = z.object({
  items: z.array(SurveySummarySchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type SurveyListResponse = z.infer<typeof SurveyListResponseSchema>;

export const CreateSurveyRequestSchema = z.object({ survey: UpgradingSurveySchema });
export type CreateSurveyRequest = z.infer<typeof CreateSurveyRequestSchema>;

/** A survey as the server holds it, for a device's store. */
export const SyncedSurveySchema = z.object({
  id: z.uuid(),
  revision: z.number().int(),
  status: SurveyStatusSchema,
  doc: UpgradingSurveySchema,
  createdBy: UserRefSchema,
  updatedAt: z.string(),
});
export type SyncedSurvey = z.infer<typeof SyncedSurveySchema>;

const XID8_MAX = 2n ** 64n - 1n;
export const PullQuerySchema = z.object({
  // Transaction ids are PostgreSQL xid8 (unsigned 64-bit); the id is a survey's UUID.
  cursor: z
    .string()
    .regex(/^\d{1,20}(:\d{1,20}:[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})?$/i, 'cursor is not one this server gave out')
    // zod runs the refinement even when the pattern failed: only digits reach BigInt (else a 500, not a 400).
    .refine((c) => c.split(':').every((part, i) => i === 2 || (/^\d{1,20}$/.test(part) && BigInt(part) <= XID8_MAX)), 'cursor is not one this server gave out')
    .default('0'),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});
export type PullQuery = z.infer<typeof PullQuerySchema>;

/**
 * Everything of the caller's organisation changed since `cursor`. Pass the returned `cursor` back
 * next time; while `hasMore`, pull again at once. `extras` carries other record kinds keyed by name
 * (reviewers' comments, verdicts…), each a list of records changed since the cursor; a device
 * ignores names it does not know.
 */
export const PullResponseSchema = z.object({
  cursor: z.string(),
  hasMore: z.boolean(),
  surveys: z.array(SyncedSurveySchema),
  conflicts: z.array(ConflictSchema),
  extras: z.record(z.string(), z.array(z.unknown())),
  serverTime: z.string(),
});
export type PullResponse = z.infer<typeof PullResponseSchema>;

/**
 * The pull's answer as a device reads it: everything checked but each survey's document, which the
 * device checks against the copy it already holds (`mergeServerSurveys` in
 * client/src/offline/survey-store.ts), so a 2,000-boundary survey costs what changed, not a full parse.
 */
export const PulledSurveySchema = SyncedSurveySchema.extend({ doc: z.unknown() });
export type PulledSurvey = z.infer<typeof PulledSurveySchema>;
export const PullEnvelopeSchema = PullResponseSchema.extend({ surveys: z.array(PulledSurveySchema) });
