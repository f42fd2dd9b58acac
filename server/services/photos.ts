/**
 * Photo rules: the type is read from the bytes (never trusted from the name or header), each photo
 * belongs to a survey of the caller's organisation, uploads are idempotent by the device-made id
 * (a retry after a dropped connection answers with the stored photo), and nobody outside the
 * organisation can learn a photo exists.
 */
import { createHash, randomUUID } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import type { Db } from '../db/knex';
import type { AuthContext } from '../http/auth-context';
import { conflict, notFound, unsupportedMediaType } from '../errors';
import { PHOTO_TYPES, type Photo, type PhotoUploadFields } from '@shared/api/photos';
import type { PhotoStorage, StoredObject } from '../storage/photo-store';
import { refuseReviewersEdits } from './editing';
import { findPhoto, findPhotoAnyOrg, insertPhoto, listPhotos as listRows, publicPhoto, surveyInOrg } from '../db/repositories/photos';

const unsupportedType = () =>
  unsupportedMediaType('This file is not a photo Brineline accepts. Send a JPEG, PNG, WebP or HEIC image.');

async function uploadPhoto(
  db: Db,
  storage: PhotoStorage,
  auth: AuthContext,
  id: string,
  fields: PhotoUploadFields,
  bytes: Buffer,
): Promise<{ photo: Photo; created: boolean }> {
  const type = await fileTypeFromBuffer(bytes);
  if (!type || !(PHOTO_TYPES as readonly string[]).includes(type.mime)) throw unsupportedType();
  const existing = await findPhotoAnyOrg(db, id);
  if (existing) {
    // Another firm's photo id answers as any id that names nothing of ours (no hint that it exists).
    if (existing.organisationId !== auth.orgId) throw notFound('No such photo.');
    return { photo: publicPhoto(existing), created: false };
  }
  if (!(await surveyInOrg(db, auth.orgId, fields.surveyId))) throw notFound('No survey of your organisation has this id. Sync the survey first.');
  await refuseReviewersEdits(db, auth, [fields.surveyId]);
  const ext = type.ext === 'jpg' ? 'jpg' : type.ext;
  const storageKey = `${auth.orgId}/${fields.surveyId}/${randomUUID()}.${ext}`;
  await storage.put(storageKey, bytes, type.mime);
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  // The bytes go first so a row never points at nothing; if the row is not written, they go too.
  const inserted = await insertPhoto(db, {
    id,
    orgId: auth.orgId,
    surveyId: fields.surveyId,
    entityKind: fields.entityKind,
    entityId: fields.entityId,
    caption: fields.caption,
    contentType: type.mime,
    sizeBytes: bytes.length,
    sha256,
    storageKey,
    uploadedBy: auth.userId,
  }).catch(async (err: unknown) => {
    await storage.delete(storageKey).catch(() => undefined);
    throw err;
  });
  if (!inserted) {
    // a concurrent retry of the same upload stored it first: keep theirs
    await storage.delete(storageKey).catch(() => undefined);
    const winner = await findPhoto(db, auth.orgId, id);
    if (!winner) throw conflict('This photo id is already in use. Attach the photo again to get a new one.');
    return { photo: publicPhoto(winner), created: false };
  }
  const stored = await findPhoto(db, auth.orgId, id);
  return { photo: publicPhoto(stored!), created: true };
}

async function readPhoto(db: Db, storage: PhotoStorage, auth: AuthContext, id: string): Promise<{ photo: Photo; object: StoredObject }> {
  const p = await findPhoto(db, auth.orgId, id);
  if (!p) throw notFound('No such photo.');
  const object = await storage.get(p.storageKey);
  // the row says it was uploaded: the device can tell this from a photo not uploaded yet
  if (!object) throw notFound('The photo’s file is missing from storage.', { reason: 'file_missing' });
  return { photo: publicPhoto(p), object };
}

async function listPhotos(db: Db, auth: AuthContext, surveyId: string): Promise<Photo[]> {
  if (!(await surveyInOrg(db, auth.orgId, surveyId))) throw notFound('No such survey.');
  return (await listRows(db, auth.orgId, surveyId)).map(publicPhoto);
}

export function createPhotoService(deps: { db: Db; storage: PhotoStorage }) {
  const { db, storage } = deps;
  return {
    upload: (auth: AuthContext, id: string, fields: PhotoUploadFields, bytes: Buffer) => uploadPhoto(db, storage, auth, id, fields, bytes),
    read: (auth: AuthContext, id: string) => readPhoto(db, storage, auth, id),
    list: (auth: AuthContext, surveyId: string) => listPhotos(db, auth, surveyId),
  };
}

export type PhotoService = ReturnType<typeof createPhotoService>;
