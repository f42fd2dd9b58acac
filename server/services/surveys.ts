/**
 * Surveys on the server: listing, reading (with the engine results of the current revision,
 * recomputed here with the same engine the device runs) and creating one directly.
 */
import type { Knex } from 'knex';
import { LRUCache } from 'lru-cache';
import { computeSurvey, ENGINE_VERSION } from '@shared/engine';
import type { Role } from '@shared/api/roles';
import type { Survey } from '@shared/schemas/survey';
import type { ListSurveysQuery, SurveyDetail, SurveyResults } from '@shared/schemas/sync';
import type { Db } from '../db/knex';
import type { AuthContext } from '../http/auth-context';
import { conflict, notFound } from '../http/errors';
import * as repo from '../db/repositories/surveys';

/** Time of the active condition's soundings, for lists and the brief. */
export function soundingsAt(doc: Survey): string | null {
  return doc.conditions.find((c) => c.id === doc.activeConditionId)?.time ?? null;
}

/** The denormalised columns kept beside a document. */
export async function columnsOf(
  db: Db | Knex.Transaction,
  orgId: string,
  doc: Survey,
  revision: number,
  revs: repo.SurveyColumns['revs'],
  /** The vessel row already linked, and the name it was linked under: reused while the name is unchanged. */
  known?: { vesselId: string | null; vesselName: string },
): Promise<repo.SurveyColumns> {
  const vesselId =
    known?.vesselId && known.vesselName.toLowerCase() === doc.vessel.name.toLowerCase()
      ? known.vesselId
      : await repo.findOrCreateVessel(db, orgId, { name: doc.vessel.name, imo: doc.vessel.imo });
  return { doc, revision, revs, title: doc.title, vesselName: doc.vessel.name, vesselId, soundingsAt: soundingsAt(doc) };
}

/** Runs the engine on a document; a failure is stored as the result's error, never thrown. */
export function runEngine(doc: Survey): { results: unknown; error: string | null } {
  try {
    return { results: computeSurvey(doc), error: null };
  } catch (err) {
    return { results: null, error: err instanceof Error ? err.message : String(err) };
  }
}

/** The stored results of a revision, computed and stored first if missing (e.g. after a crash). */
export async function ensureResults(db: Db, surveyId: string, revision: number, doc: Survey): Promise<SurveyResults> {
  const found = await repo.findResults(db, surveyId, revision, ENGINE_VERSION);
  if (found) return found;
  const { results, error } = runEngine(doc);
  await repo.insertResults(db, { surveyId, revision, engineVersion: ENGINE_VERSION, results, error });
  return (await repo.findResults(db, surveyId, revision, ENGINE_VERSION))!;
}

/**
 * A page of surveys, as the UTF-8 JSON of a SurveyListResponse. With `confirm`, the same query checks
 * the caller's membership and hands the role it found to `confirm` (which throws when there is none)
 * before anything is returned.
 */
export async function listSurveysJson(
  db: Db,
  auth: AuthContext,
  q: ListSurveysQuery,
  confirm?: (role: Role | null) => unknown,
): Promise<Buffer> {
  const { itemsJson, total, memberRole } = await repo.listSurveysJson(db, auth.orgId, q, confirm ? auth : undefined);
  confirm?.(memberRole);
  return utf8(`{"items":${itemsJson},"total":${total},"page":${q.page},"pageSize":${q.pageSize}}`);
}

/**
 * One survey with its open conflicts and engine results. The results are those of the current
 * revision when `fresh` (computed now if needed); otherwise the latest stored ones, which may be of
 * an earlier revision while a burst of edits is still arriving (their `revision` says which) — the
 * recomputation of the latest revision is then already scheduled.
 */
export async function getSurvey(
  db: Db,
  auth: AuthContext,
  id: string,
  opts: { fresh?: boolean; scheduler?: ResultsScheduler } = {},
): Promise<SurveyDetail> {
  const s = await repo.findSurvey(db, auth.orgId, id);
  if (!s) throw notFound('No survey with this id in your organisation.');
  const latest = opts.fresh ? undefined : await repo.latestResults(db, id, ENGINE_VERSION);
  let results: SurveyResults;
  if (latest) {
    results = latest;
    if (latest.revision < s.revision) opts.scheduler?.schedule(id);
  } else {
    results = await ensureResults(db, id, s.revision, s.doc);
  }
  const conflicts = await repo.surveyConflicts(db, auth.orgId, id, 'open');
  return { ...s, results, conflicts };
}

const utf8 = (text: string) => Buffer.from(text, 'utf8');
const DOC_KEY = utf8(',"doc":');
const RESULTS_KEY = utf8(',"results":');
const CONFLICTS_KEY = utf8('},"conflicts":');

/** `{"a":1}` → `{"a":1` (to continue the object). */
const open = (obj: object) => {
  const text = JSON.stringify(obj);
  return utf8(text.slice(0, -1));
};

/**
 * The UTF-8 JSON text of each survey's current document and latest results, by survey id, with the
 * revision each belongs to. Both are immutable for their revision (see repo.readSurveyRaw), so a
 * read that finds the same revisions in the database skips reading, sending and converting them:
 * most of a survey read's work. Bounded in bytes; one per app, never shared between databases.
 */
interface HeldText {
  docRevision?: number;
  doc?: Buffer;
  resultsRevision?: number;
  results?: Buffer;
}

export class SurveyTextCache {
  private readonly entries: LRUCache<string, HeldText>;

  constructor(maxBytes = 64 * 1024 * 1024) {
    this.entries = new LRUCache({ maxSize: maxBytes, sizeCalculation: (e) => 64 + (e.doc?.length ?? 0) + (e.results?.length ?? 0) });
  }

  /** What is held for a survey now; the caller keeps this object, so a later replacement cannot take it away mid-read. */
  hold(id: string): HeldText {
    return this.entries.get(id) ?? {};
  }

  /** Keeps what a read found, unless a newer revision is already held. */
  keep(id: string, found: Required<HeldText>): void {
    const now = this.entries.get(id);
    if (now && ((now.docRevision ?? 0) > found.docRevision || (now.resultsRevision ?? 0) > found.resultsRevision)) return;
    this.entries.set(id, found);
  }
}

/** The held bytes when the read skipped the text (null), else the text just read. */
function textOf(text: string | null, held: Buffer | undefined, what: string): Buffer {
  if (text != null) return utf8(text);
  if (!held) throw new Error(`The ${what} was skipped as held, but nothing is held.`);
  return held;
}

/**
 * The same answer as getSurvey (latest stored results), as UTF-8 JSON bytes: the document and the
 * results go out as PostgreSQL stored them, never parsed and serialised again — the costly part of
 * reading a large survey — and the survey, its results and its conflicts come from one query. With
 * `cache`, text already held for the same revisions is not read again. With `confirm`, that query
 * also checks the caller's membership (see listSurveys).
 */
export async function getSurveyJson(
  db: Db,
  auth: AuthContext,
  id: string,
  opts: { scheduler?: ResultsScheduler; confirm?: (role: Role | null) => unknown; cache?: SurveyTextCache } = {},
): Promise<Buffer> {
  const held = opts.cache?.hold(id) ?? {};
  const known = { docRevision: held.doc && held.docRevision, resultsRevision: held.results && held.resultsRevision };
  const read = await repo.readSurveyRaw(db, auth.orgId, id, ENGINE_VERSION, opts.confirm ? auth : undefined, known);
  opts.confirm?.(read.memberRole);
  const s = read.survey;
  if (!s) throw notFound('No survey with this id in your organisation.');
  const results = read.results;
  if (!results) return utf8(JSON.stringify(await getSurvey(db, auth, id, { scheduler: opts.scheduler })));
  if (results.revision < s.revision) opts.scheduler?.schedule(id);
  const { docJson: docText, ...summary } = s;
  const { resultsJson: resultsText, ...meta } = results;
  const docJson = textOf(docText, held.doc, 'document');
  const resultsJson = textOf(resultsText, held.results, 'results');
  opts.cache?.keep(id, { docRevision: s.revision, doc: docJson, resultsRevision: results.revision, results: resultsJson });
  // {...summary, doc, results: {...meta, results}, conflicts}, in that order, as getSurvey answers.
  return Buffer.concat([
    open(summary),
    DOC_KEY,
    docJson,
    RESULTS_KEY,
    open(meta),
    RESULTS_KEY,
    resultsJson,
    CONFLICTS_KEY,
    utf8(JSON.stringify(read.conflicts)),
    utf8('}'),
  ]);
}

export interface ResultsScheduler {
  /** Recompute this survey's latest revision soon (coalesced: one run for a burst of edits). */
  schedule: (surveyId: string) => void;
  /** Runs everything scheduled now (tests, shutdown). */
  flush: () => Promise<void>;
}

/**
 * Recomputes results after pushes without holding up the push: each survey is computed at most
 * once per `delayMs`, always at its latest revision, one at a time, so a burst of edits costs one
 * engine run and the API stays responsive under load.
 */
export function createResultsScheduler(db: Db, onError: (err: unknown) => void, delayMs = 2000): ResultsScheduler {
  const due = new Set<string>();
  let timer: ReturnType<typeof setTimeout> | undefined;
  let running: Promise<void> = Promise.resolve();
  const run = async () => {
    timer = undefined;
    const ids = [...due];
    due.clear();
    for (const id of ids) {
      try {
        const row = await repo.docNeedingResults(db, id, ENGINE_VERSION);
        if (row) await repo.insertResults(db, { surveyId: id, revision: row.revision, engineVersion: ENGINE_VERSION, ...runEngine(row.doc) });
      } catch (err) {
        onError(err);
      }
    }
  };
  return {
    schedule(surveyId) {
      due.add(surveyId);
      if (!timer) {
        timer = setTimeout(() => {
          running = running.then(run);
        }, delayMs);
        timer.unref?.();
      }
    },
    async flush() {
      clearTimeout(timer);
      running = running.then(run);
      await running;
    },
  };
}

/** Creates a survey from a whole document (import, or a client that is online). */
export async function createSurvey(db: Db, auth: AuthContext, doc: Survey, deviceId: string | null = null): Promise<SurveyDetail> {
  await db.transaction(async (trx) => {
    if (await repo.surveyIdTaken(trx, doc.id)) throw conflict('A survey with this id already exists.');
    await repo.insertSurvey(trx, { id: doc.id, orgId: auth.orgId, createdBy: auth.userId, ...(await columnsOf(trx, auth.orgId, doc, 1, {})) });
    await repo.insertRevision(trx, {
      surveyId: doc.id,
      revision: 1,
      orgId: auth.orgId,
      userId: auth.userId,
      deviceId,
      changeId: null,
      changes: [{ entity: 'survey', field: null, old: null, new: 'created' }],
    });
  }).catch((err: { code?: string }) => {
    if (err?.code === '23505') throw conflict('A survey with this id already exists.');
    throw err;
  });
  return getSurvey(db, auth, doc.id);
}
