/**
 * Surveys on the server: listing, reading (with the engine results of the current revision,
 * recomputed here with the same engine the device runs) and creating one directly. The service owns
 * the results scheduler and the cache of survey text; one per app.
 */
import type { Logger } from 'pino';
import { ENGINE_VERSION } from '@shared/engine';
import type { Role } from '@shared/api/roles';
import type { Survey } from '@shared/schemas/survey';
import type { ListSurveysQuery, StoredResults, SurveyDetail } from '@shared/schemas/sync';
import type { Db } from '../db/knex';
import type { AuthContext } from '../http/auth-context';
import { conflict, notFound } from '../errors';
import { insertRevision, insertSurvey, latestResults, surveyIdTaken } from '../db/repositories/surveys';
import { findSurvey, listSurveysJson, readSurveyRaw } from '../db/repositories/survey-reads';
import { surveyConflicts } from '../db/repositories/conflicts';
import { columnsOf } from './survey-columns';
import { ensureResults } from './engine-results';
import { createResultsScheduler, type ResultsScheduler } from './results-scheduler';
import { SurveyTextCache } from './survey-text-cache';

/** Hands the caller's role found by a read's own query to the route (see `checksMembership`). */
type ConfirmMembership = (role: Role | null) => unknown;

const NO_SURVEY = 'No survey with this id in your organisation.';
const utf8 = (text: string) => Buffer.from(text, 'utf8');
const DOC_KEY = utf8(',"doc":');
const RESULTS_KEY = utf8(',"results":');
const CONFLICTS_KEY = utf8('},"conflicts":');

/** `{"a":1}` → `{"a":1` (to continue the object). */
const open = (obj: object) => utf8(JSON.stringify(obj).slice(0, -1));

/** The held bytes when the read skipped the text (null), else the text just read. */
function textOf(text: string | null, held: Buffer | undefined, what: string): Buffer {
  if (text != null) return utf8(text);
  if (!held) throw new Error(`The ${what} was skipped as held, but nothing is held.`);
  return held;
}

/** The database, and the process state the survey service owns. */
interface SurveyServiceDeps {
  db: Db;
  scheduler: ResultsScheduler;
  textCache: SurveyTextCache;
}

/**
 * A page of surveys, as the UTF-8 JSON of a SurveyListResponse. With `confirm`, the same query checks
 * the caller's membership and hands the role it found to `confirm` (which throws when there is none)
 * before anything is returned.
 */
async function listJson(db: Db, auth: AuthContext, q: ListSurveysQuery, confirm?: ConfirmMembership): Promise<Buffer> {
  const { itemsJson, total, memberRole } = await listSurveysJson(db, auth.orgId, q, confirm ? auth : undefined);
  confirm?.(memberRole);
  return utf8(`{"items":${itemsJson},"total":${total},"page":${q.page},"pageSize":${q.pageSize}}`);
}

/**
 * One survey with its open conflicts and engine results. The results are those of the current
 * revision when `fresh` (computed now if needed); otherwise the latest stored ones, which may be of
 * an earlier revision while a burst of edits is still arriving (their `revision` says which) — the
 * recomputation of the latest revision is then already scheduled.
 */
async function get({ db, scheduler }: SurveyServiceDeps, auth: AuthContext, id: string, opts: { fresh?: boolean } = {}): Promise<SurveyDetail> {
  const s = await findSurvey(db, auth.orgId, id);
  if (!s) throw notFound(NO_SURVEY);
  const latest = opts.fresh ? undefined : await latestResults(db, id, ENGINE_VERSION);
  let results: StoredResults;
  if (latest) {
    results = latest;
    if (latest.revision < s.revision) scheduler.schedule(id);
  } else {
    results = await ensureResults(db, id, s.revision, s.doc);
  }
  const conflicts = await surveyConflicts(db, auth.orgId, id, 'open');
  return { ...s, results, conflicts };
}

/**
 * The same answer as `get` (latest stored results), as UTF-8 JSON bytes: the document and the
 * results go out as PostgreSQL stored them, never parsed and serialised again — the costly part of
 * reading a large survey — and the survey, its results and its conflicts come from one query. Text
 * already held for the same revisions is not read again. With `confirm`, that query also checks
 * the caller's membership (see listJson).
 */
async function getJson(ctx: SurveyServiceDeps, auth: AuthContext, id: string, confirm?: ConfirmMembership): Promise<Buffer> {
  const { db, scheduler, textCache } = ctx;
  const held = textCache.hold(id);
  const known = { docRevision: held.doc && held.docRevision, resultsRevision: held.results && held.resultsRevision };
  const read = await readSurveyRaw(db, auth.orgId, id, ENGINE_VERSION, confirm ? auth : undefined, known);
  confirm?.(read.memberRole);
  const s = read.survey;
  if (!s) throw notFound(NO_SURVEY);
  const results = read.results;
  if (!results) return utf8(JSON.stringify(await get(ctx, auth, id)));
  if (results.revision < s.revision) scheduler.schedule(id);
  const { docJson: docText, ...summary } = s;
  const { resultsJson: resultsText, ...meta } = results;
  const docJson = textOf(docText, held.doc, 'document');
  const resultsJson = textOf(resultsText, held.results, 'results');
  textCache.keep(id, { docRevision: s.revision, doc: docJson, resultsRevision: results.revision, results: resultsJson });
  // {...summary, doc, results: {...meta, results}, conflicts}, in that order, as `get` answers.
  const conflictsJson = utf8(JSON.stringify(read.conflicts));
  return Buffer.concat([open(summary), DOC_KEY, docJson, RESULTS_KEY, open(meta), RESULTS_KEY, resultsJson, CONFLICTS_KEY, conflictsJson, utf8('}')]);
}

/** Creates a survey from a whole document (import, or a client that is online). */
async function create(ctx: SurveyServiceDeps, auth: AuthContext, doc: Survey, deviceId: string | null = null): Promise<SurveyDetail> {
  const { db } = ctx;
  await db
    .transaction(async (trx) => {
      if (await surveyIdTaken(trx, doc.id)) throw conflict('A survey with this id already exists.');
      await insertSurvey(trx, { id: doc.id, orgId: auth.orgId, createdBy: auth.userId, ...(await columnsOf(trx, auth.orgId, doc, 1, {})) });
      await insertRevision(trx, {
        surveyId: doc.id,
        revision: 1,
        orgId: auth.orgId,
        userId: auth.userId,
        deviceId,
        changeId: null,
        changes: [{ entity: 'survey', field: null, old: null, new: 'created' }],
      });
    })
    .catch((err: { code?: string }) => {
      if (err?.code === '23505') throw conflict('A survey with this id already exists.');
      throw err;
    });
  return get(ctx, auth, doc.id);
}

export function createSurveyService(deps: { db: Db; logger: Logger; scheduler?: ResultsScheduler }) {
  const { db } = deps;
  const scheduler = deps.scheduler ?? createResultsScheduler(db, (err) => deps.logger.warn({ err }, 'results recomputation failed'));
  const ctx: SurveyServiceDeps = { db, scheduler, textCache: new SurveyTextCache() };
  return {
    listJson: (auth: AuthContext, q: ListSurveysQuery, confirm?: ConfirmMembership) => listJson(db, auth, q, confirm),
    get: (auth: AuthContext, id: string, opts?: { fresh?: boolean }) => get(ctx, auth, id, opts),
    getJson: (auth: AuthContext, id: string, confirm?: ConfirmMembership) => getJson(ctx, auth, id, confirm),
    create: (auth: AuthContext, doc: Survey, deviceId?: string | null) => create(ctx, auth, doc, deviceId),
    scheduler,
  };
}

export type SurveyService = ReturnType<typeof createSurveyService>;
