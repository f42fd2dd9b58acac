import type { Knex } from 'knex';
import type { Photo } from '@shared/api/photos';

type Q = Knex | Knex.Transaction;

interface PhotoRow {
  id: string;
  organisation_id: string;
  survey_id: string;
  entity_kind: Photo['entity']['kind'];
  entity_id: string;
  caption: string;
  content_type: string;
  size_bytes: number;
  sha256: string;
  storage_key: string;
  created_at: Date;
}

export type PhotoRecord = Photo & { organisationId: string; storageKey: string };

const toRecord = (r: PhotoRow): PhotoRecord => ({
  id: r.id,
  organisationId: r.organisation_id,
  surveyId: r.survey_id,
  entity: { kind: r.entity_kind, id: r.entity_id },
  caption: r.caption,
  contentType: r.content_type,
  sizeBytes: r.size_bytes,
  sha256: r.sha256,
  storageKey: r.storage_key,
  createdAt: r.created_at.toISOString(),
});

export const publicPhoto = ({ organisationId: _o, storageKey: _k, ...p }: PhotoRecord): Photo => p;

/** Any organisation's photo with this id (ids are client-made; the caller checks the organisation). */
export async function findPhotoAnyOrg(db: Q, id: string): Promise<PhotoRecord | undefined> {
  const r = await db<PhotoRow>('photos').where({ id }).first();
  return r ? toRecord(r) : undefined;
}

export async function findPhoto(db: Q, orgId: string, id: string): Promise<PhotoRecord | undefined> {
  const r = await db<PhotoRow>('photos').where({ id, organisation_id: orgId }).first();
  return r ? toRecord(r) : undefined;
}

export async function listPhotos(db: Q, orgId: string, surveyId: string): Promise<PhotoRecord[]> {
  const rows = await db<PhotoRow>('photos').where({ organisation_id: orgId, survey_id: surveyId }).orderBy('created_at');
  return rows.map(toRecord);
}

export async function surveyInOrg(db: Q, orgId: string, surveyId: string): Promise<boolean> {
  return !!(await db('surveys').where({ id: surveyId, organisation_id: orgId }).first('id'));
}

/** Inserts the row; false when a row with this id already exists (a concurrent retry won). */
export async function insertPhoto(
  db: Q,
  p: { id: string; orgId: string; surveyId: string; entityKind: string; entityId: string; caption: string; contentType: string; sizeBytes: number; sha256: string; storageKey: string; uploadedBy: string },
): Promise<boolean> {
  const rows = await db('photos')
    .insert({
      id: p.id,
      organisation_id: p.orgId,
      survey_id: p.surveyId,
      entity_kind: p.entityKind,
      entity_id: p.entityId,
      caption: p.caption,
      content_type: p.contentType,
      size_bytes: p.sizeBytes,
      sha256: p.sha256,
      storage_key: p.storageKey,
      uploaded_by: p.uploadedBy,
    })
    .onConflict('id')
    .ignore()
    .returning('id');
  return rows.length > 0;
}
