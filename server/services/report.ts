/** The calculation report's data: the survey as stored, the server's results, the review around it. */
import type { Knex } from 'knex';
import type { SurveyResults } from '@shared/engine/results';
import { UpgradingSurveySchema } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import type { AuthContext } from '../http/auth-context';
import { notFound } from '../errors';
import type { ReportData } from '../report/render-report';
import * as repo from '../db/repositories/review';
import { ensureResults } from './engine-results';

export function createReportService(deps: { db: Knex }) {
  const { db } = deps;
  async function data(auth: AuthContext, surveyId: string, units: UnitSystem): Promise<ReportData> {
    const s = await repo.findSurvey(db, auth.orgId, surveyId);
    if (!s) throw notFound('No such survey in your organisation.');
    const parsed = UpgradingSurveySchema.safeParse(s.doc);
    if (!parsed.success) throw notFound('This survey cannot be read as a survey document.');
    const [results, verdicts, limits, reviewed, organisationName, submitterId] = await Promise.all([
      ensureResults(db, s.id, s.revision, parsed.data),
      repo.listVerdicts(db, [s.id]),
      repo.listLimits(db, [s.id]),
      repo.lastReviewEvent(db, s.id),
      repo.organisationName(db, auth.orgId),
      repo.lastSubmitter(db, s.id),
    ]);
    const preparer = submitterId ?? s.createdBy;
    return {
      doc: parsed.data,
      results: (results.results as SurveyResults | null) ?? null,
      status: s.status,
      revision: s.revision,
      units,
      verdicts,
      limits,
      organisationName,
      surveyorName: preparer ? await repo.userName(db, preparer) : null,
      reviewedBy: reviewed?.name ?? null,
      reviewedAt: reviewed?.at ?? null,
      generatedAt: new Date(),
    };
  }
  return { data };
}
