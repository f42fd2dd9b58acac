/** Survey fixtures for tests: the demo casualty with a fresh id, and a survey stored straight in a test org. */
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import type { Survey } from '@shared/schemas/survey';
import type { SurveyChange, SurveyOp } from '@shared/schemas/sync';
import type { Role } from '@shared/api/roles';
import { demoSurvey } from '../../seeds/demo-survey';
import { pino } from 'pino';
import { createSurveyService } from '../../server/services/surveys';
import { signAccessToken } from '../../server/services/tokens';

/** The demo casualty as a new survey (fresh survey id, same entity ids). */
export function newSurvey(patch: Partial<Survey> = {}): Survey {
  const s = demoSurvey();
  return { ...s, id: randomUUID(), vesselId: undefined, ...patch };
}

export interface Caller {
  id: string;
  orgId: string;
  role: Role;
  email: string;
}

/** An access token for a member, without going through sign-in (in a session of its own that nobody ends). */
export function tokenFor(secret: string, m: Caller, sessionId: string = randomUUID()): Promise<string> {
  return signAccessToken(secret, { userId: m.id, orgId: m.orgId, role: m.role, email: m.email, sessionId });
}

/** Stores a new survey in the member's organisation and returns it. */
export async function storeSurvey(db: Knex, m: Caller, patch: Partial<Survey> = {}): Promise<Survey> {
  const survey = newSurvey(patch);
  const surveys = createSurveyService({ db, logger: pino({ level: 'silent' }) });
  await surveys.create({ userId: m.id, orgId: m.orgId, role: m.role, email: m.email }, survey);
  return survey;
}

let seqs = new Map<string, number>();
/** A change from `deviceId` with the next sequence number of that device. */
export function change(deviceId: string, surveyId: string, op: SurveyOp, baseRevision = 0): SurveyChange {
  const seq = (seqs.get(deviceId) ?? 0) + 1;
  seqs.set(deviceId, seq);
  return { id: randomUUID(), deviceId, seq, surveyId, baseRevision, createdAt: new Date().toISOString(), op };
}

export function resetSeqs(): void {
  seqs = new Map();
}
