/** The columns kept beside a survey's document (title, vessel, time of soundings), for lists and the brief. */
import type { Knex } from 'knex';
import type { Survey } from '@shared/schemas/survey';
import type { Db } from '../db/knex';
import { findOrCreateVessel, type SurveyColumns } from '../db/repositories/surveys';

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
  revs: SurveyColumns['revs'],
  /** The vessel row already linked, and the name it was linked under: reused while the name is unchanged. */
  known?: { vesselId: string | null; vesselName: string },
): Promise<SurveyColumns> {
  const vesselId =
    known?.vesselId && known.vesselName.toLowerCase() === doc.vessel.name.toLowerCase()
      ? known.vesselId
      : await findOrCreateVessel(db, orgId, { name: doc.vessel.name, imo: doc.vessel.imo });
  return { doc, revision, revs, title: doc.title, vesselName: doc.vessel.name, vesselId, soundingsAt: soundingsAt(doc) };
}
