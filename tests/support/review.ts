/** Review fixtures: a survey of a test org brought to any status, and brief links with known tokens. */
import type { Knex } from 'knex';
import type { Survey } from '@shared/schemas/survey';
import type { SurveyStatus } from '@shared/review/status';
import { issueSecret } from '../../server/services/secrets';
import type { TestOrg } from './auth';
import { storeSurvey } from './surveys';

/** The moves (and who makes them) that lead from draft to each status. */
const PATH: Record<SurveyStatus, { to: SurveyStatus; by: 'surveyor' | 'engineer'; note?: string }[]> = {
  draft: [],
  submitted: [{ to: 'submitted', by: 'surveyor' }],
  in_review: [
    { to: 'submitted', by: 'surveyor' },
    { to: 'in_review', by: 'engineer' },
  ],
  accepted: [
    { to: 'submitted', by: 'surveyor' },
    { to: 'in_review', by: 'engineer' },
    { to: 'accepted', by: 'engineer' },
  ],
  returned: [
    { to: 'submitted', by: 'surveyor' },
    { to: 'returned', by: 'engineer', note: 'Add the soundings of No. 2 hold.' },
  ],
  changed_since_review: [
    { to: 'submitted', by: 'surveyor' },
    { to: 'in_review', by: 'engineer' },
    { to: 'accepted', by: 'engineer' },
    { to: 'changed_since_review', by: 'surveyor' },
  ],
};

/** Stores a new survey (made by the org's surveyor) and writes the status trail that leads to `status`. */
export async function surveyInStatus(db: Knex, org: TestOrg, status: SurveyStatus): Promise<Survey> {
  const survey = await storeSurvey(db, org.surveyor);
  let from: SurveyStatus = 'draft';
  for (const step of PATH[status]) {
    await db('status_events').insert({
      survey_id: survey.id,
      organisation_id: org.id,
      from_status: from,
      to_status: step.to,
      note: step.note ?? null,
      actor_id: org.members[step.by].id,
      revision: 1,
    });
    from = step.to;
  }
  if (status !== 'draft') await db('surveys').where({ id: survey.id }).update({ status });
  return survey;
}

/** Writes a brief link straight into the database and returns its token. */
export async function briefLink(
  db: Knex,
  org: TestOrg,
  surveyId: string,
  opts: { expiresAt?: Date; revoked?: boolean; units?: 'si' | 'us' } = {},
): Promise<{ id: string; token: string }> {
  const { token, hash } = issueSecret();
  const [row] = await db('brief_links')
    .insert({
      survey_id: surveyId,
      organisation_id: org.id,
      token_hash: hash,
      recipient_email: 'master@ship.example',
      units: opts.units ?? 'si',
      revision: 1,
      expires_at: opts.expiresAt ?? new Date(Date.now() + 86_400_000),
      created_by: org.engineer.id,
      revoked_at: opts.revoked ? new Date() : null,
      revoked_by: opts.revoked ? org.engineer.id : null,
    })
    .returning('id');
  return { id: row.id, token };
}
