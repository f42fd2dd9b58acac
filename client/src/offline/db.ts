/**
 * The device store (IndexedDB through Dexie). The survey lives here first: every edit is written
 * to the survey and to the outbox in one transaction, and sync drains the outbox when a link exists.
 *
 * Schema versions are append-only: never edit a version that has shipped; add `version(n + 1)`
 * with the new stores (and an `upgrade` when existing rows must change).
 */
import { Dexie, type EntityTable, type Transaction } from 'dexie';
import type { Survey } from '@shared/schemas/survey';
import type { CommentTarget, ReviewNotes } from '@shared/api/review';
import { needsUpgrade, upgradeSurvey } from '@shared/schemas/upgrade';
import type { Conflict, SurveyChange, SurveyStatus, UserRef } from '@shared/schemas/sync';
import { rememberedUserId } from '@client/lib/identity';

export interface LocalSurvey {
  id: string;
  /** The document as this device sees it: the server's copy with this device's pending edits on top. */
  doc: Survey;
  /** The server's copy at `serverRevision` (null until the server has it). */
  serverDoc: Survey | null;
  /** 0 while the survey has never reached the server. */
  serverRevision: number;
  status: SurveyStatus;
  /** Denormalised for lists and sorting. */
  title: string;
  vesselName: string;
  /** ISO time of the last local or server change. */
  updatedAt: string;
  ownerUserId: string | null;
  createdBy: UserRef | null;
}

export type OutboxState = 'pending' | 'rejected';

/** One edit waiting for the server. `seq` (auto-increment) is the per-device sequence number. */
export interface OutboxEntry extends Omit<SurveyChange, 'seq'> {
  seq?: number;
  state: OutboxState;
  /** Why the server refused it, for the user. */
  reason?: string;
  /** Who made it (absent on edits queued before authors were kept): only they may push it. */
  userId?: string;
}

export interface LocalConflict extends Conflict {
  /** 1 while this device has a resolution in its outbox that the server has not confirmed yet. */
  resolving?: 0 | 1;
}

export interface LocalPhoto {
  id: string;
  surveyId: string;
  entity: { kind: 'survey' | 'condition' | 'compartment' | 'boundary'; id: string };
  blob: Blob;
  contentType: string;
  caption: string;
  /** 0 until the photo's bytes have reached object storage (IndexedDB cannot index booleans). */
  uploaded: 0 | 1;
  createdAt: string;
  /** Storage key once uploaded. */
  key?: string;
}

/** The reviewers' notes on one survey, as the last pull brought them (replaced whole by each pull). */
export type LocalReviewNotes = ReviewNotes;

/**
 * A reply to a reviewer's comment written on this device, waiting for the server. The id is made on
 * the device, so sending it twice (a lost answer) still makes one comment.
 */
export interface LocalReply {
  id: string;
  surveyId: string;
  /** The thread's first comment. */
  parentId: string;
  target: CommentTarget;
  body: string;
  authorName: string;
  createdAt: string;
  /** 'sent': the server has it; kept until a pull brings it back as a comment, so the thread never loses it. */
  state: OutboxState | 'sent';
  /** Why the server refused it, for the user. */
  reason?: string;
}

export interface MetaRow {
  key: string;
  value: unknown;
}

export type BrinelineDb = Dexie & {
  surveys: EntityTable<LocalSurvey, 'id'>;
  outbox: EntityTable<OutboxEntry, 'seq'>;
  conflicts: EntityTable<LocalConflict, 'id'>;
  photos: EntityTable<LocalPhoto, 'id'>;
  meta: EntityTable<MetaRow, 'key'>;
  reviewNotes: EntityTable<LocalReviewNotes, 'surveyId'>;
  replies: EntityTable<LocalReply, 'id'>;
};

/** Before version 2 the reviewers' notes were `meta` rows under this key prefix. */
export const LEGACY_REVIEW_KEY_PREFIX = 'review:';

export const DB_NAME = 'brineline';

export function openDb(name = DB_NAME): BrinelineDb {
  const db = new Dexie(name) as BrinelineDb;
  db.version(1).stores({
    surveys: 'id, updatedAt, status, ownerUserId, title',
    outbox: '++seq, id, surveyId, state, [surveyId+state]',
    conflicts: 'id, surveyId, status, [surveyId+status]',
    photos: 'id, surveyId, uploaded, [entity.kind+entity.id]',
    meta: 'key',
  });
  // A table per kind: the reviewers' notes leave `meta`, and replies written offline wait in their own outbox.
  db.version(2)
    .stores({ reviewNotes: 'surveyId', replies: 'id, surveyId, state, [surveyId+state]' })
    .upgrade(async (tx) => {
      const meta = tx.table<MetaRow, string>('meta');
      const legacy = await meta.where('key').startsWith(LEGACY_REVIEW_KEY_PREFIX).toArray();
      const notes = legacy.flatMap((row) => {
        const value = row.value as Partial<LocalReviewNotes> | null;
        // Keyed by the survey id in the value; the key's own suffix is the fallback for a partial record.
        const surveyId = value?.surveyId ?? row.key.slice(LEGACY_REVIEW_KEY_PREFIX.length);
        return value && typeof value === 'object' ? [{ ...value, surveyId } as LocalReviewNotes] : [];
      });
      await tx.table<LocalReviewNotes, string>('reviewNotes').bulkPut(notes);
      await meta.bulkDelete(legacy.map((row) => row.key));
    });
  // Survey format v2 (shared/schemas/upgrade.ts): same stores, documents upgraded.
  db.version(3).upgrade(upgradeStoredSurveys);
  return db;
}

/**
 * Brings every survey document on the device up to the current format: the working copy, the
 * server's copy and a survey waiting in the outbox to be created. Runs inside Dexie's version
 * upgrade, before anything else can read the store.
 */
export async function upgradeStoredSurveys(tx: Transaction): Promise<void> {
  await tx.table<LocalSurvey>('surveys').toCollection().modify((row) => {
    row.doc = upgradeSurvey(row.doc) as Survey;
    if (row.serverDoc) row.serverDoc = upgradeSurvey(row.serverDoc) as Survey;
  });
  await tx.table<OutboxEntry>('outbox').toCollection().modify((entry) => {
    if (entry.op.kind === 'create' && needsUpgrade(entry.op.survey)) {
      entry.op = { ...entry.op, survey: upgradeSurvey(entry.op.survey) as Survey };
    }
  });
}

export const db: BrinelineDb = openDb();

/** Keys of `meta` rows. */
export const META = {
  deviceId: 'deviceId',
  /** Set once a person has taken the device id made before ids were per person. */
  sharedDeviceIdTaken: 'sharedDeviceIdTaken',
  pullCursor: 'pullCursor',
  lastSyncedAt: 'lastSyncedAt',
} as const;

export async function getMeta<T>(key: string): Promise<T | undefined> {
  return (await db.meta.get(key))?.value as T | undefined;
}

export async function setMeta(key: string, value: unknown): Promise<void> {
  await db.meta.put({ key, value });
}

/**
 * This device's id for the person signed in, made on the device and kept with its data. The server
 * gives a device id to the first person who pushes with it and refuses it to anyone else, so each
 * person who edits on a shared phone has their own. The id from before ids were per person goes to
 * the first person who asks (on most phones the one who made it); nobody remembered: that id.
 */
export async function getDeviceId(userId: string | null = rememberedUserId()): Promise<string> {
  return db.transaction('rw', db.meta, async () => {
    const shared = await getMeta<string>(META.deviceId);
    if (!userId && shared) return shared;
    const key = userId ? `${META.deviceId}:${userId}` : META.deviceId;
    const own = await getMeta<string>(key);
    if (own) return own;
    const adopt = userId && shared && !(await getMeta<boolean>(META.sharedDeviceIdTaken));
    const id = adopt ? shared : crypto.randomUUID();
    await setMeta(key, id);
    if (adopt) await setMeta(META.sharedDeviceIdTaken, true);
    return id;
  });
}
