/**
 * Puts the demo casualty surveys (seeds/demo-survey.ts: one draft, one sent for review) on the server for the demo firm, made by the
 * demo surveyor, as revision 1, with their readings taken about an hour before the seeding (`demoAsOf`).
 * Idempotent: fixed ids, and nothing is written when it is already there.
 */
import type { Knex } from 'knex';
import { computeSurvey, ENGINE_VERSION } from '@shared/engine';
import { SurveySchema } from '@shared/schemas/survey';
import { DEMO_ORG, DEMO_USERS } from './demo-people';
import { demoAsOf, demoSubmittedSurvey, demoSurvey } from './demo-survey';

export async function seedSurveys(db: Knex, now: Date = new Date()): Promise<{ created: boolean }> {
  const created = await seedOne(db, demoAsOf(demoSurvey(), now), 'draft');
  await seedOne(db, demoAsOf(demoSubmittedSurvey(), now), 'submitted');
  return created;
}

async function seedOne(db: Knex, raw: unknown, status: 'draft' | 'submitted'): Promise<{ created: boolean }> {
  const doc = SurveySchema.parse(raw);
  if (await db('surveys').where({ id: doc.id }).first('id')) return { created: false };
  const surveyor = DEMO_USERS.find((u) => u.orgId === DEMO_ORG.id && u.role === 'surveyor')!;
  const soundingsAt = doc.conditions.find((c) => c.id === doc.activeConditionId)?.time ?? null;
  await db.transaction(async (trx) => {
    let vesselId = doc.vesselId ?? null;
    if (vesselId) {
      await trx('vessels')
        .insert({ id: vesselId, organisation_id: DEMO_ORG.id, name: doc.vessel.name, imo: doc.vessel.imo ?? null })
        .onConflict()
        .ignore();
      const v = await trx('vessels').where({ id: vesselId, organisation_id: DEMO_ORG.id }).first('id');
      vesselId = v?.id ?? null;
    }
    const inserted = await trx('surveys')
      .insert({
        id: doc.id,
        organisation_id: DEMO_ORG.id,
        vessel_id: vesselId,
        vessel_name: doc.vessel.name,
        title: doc.title,
        created_by: surveyor.id,
        doc: JSON.stringify(doc),
        revision: 1,
        soundings_at: soundingsAt,
        status,
      })
      .onConflict('id')
      .ignore()
      .returning('id');
    if (inserted.length === 0) return;
    await trx('survey_revisions').insert({
      survey_id: doc.id,
      revision: 1,
      organisation_id: DEMO_ORG.id,
      user_id: surveyor.id,
      changes: JSON.stringify([{ entity: 'survey', field: null, old: null, new: 'created' }]),
    });
    if (status === 'submitted') {
      await trx('status_events').insert({ survey_id: doc.id, organisation_id: DEMO_ORG.id, from_status: 'draft', to_status: 'submitted', note: null, actor_id: surveyor.id, revision: 1 });
    }
    let results: unknown = null;
    let error: string | null = null;
    try {
      results = computeSurvey(doc);
    } catch (err) {
      error = err instanceof Error ? err.message : String(err);
    }
    await trx('survey_results').insert({
      survey_id: doc.id,
      revision: 1,
      engine_version: ENGINE_VERSION,
      results: JSON.stringify(results),
      error,
    });
  });
  return { created: true };
}
