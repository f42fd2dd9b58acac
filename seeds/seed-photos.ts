/**
 * Puts the demo casualty's photos where uploaded photos live: the bytes in the photo store (the local
 * S3 fake under `npm start` and the browser tests) and a row in `photos`, as an upload from the demo
 * surveyor would. Without them the desk and the workspace show a photo the server does not have.
 * Idempotent: a row already there is kept, and its file is put back if the store lost it (a wiped
 * `.data/s3` beside a kept database).
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Knex } from 'knex';
import type { PhotoStorage } from '../server/storage/photo-store';
import { findPhotoAnyOrg, insertPhoto } from '../server/db/repositories/photos';
import { DEMO_ORG, DEMO_USERS } from './demo-people';
import { DEMO_PHOTO_FILES, demoSubmittedSurvey, demoSurvey } from './demo-survey';

const PHOTO_DIR = path.join(path.dirname(fileURLToPath(import.meta.url)), 'demo-photos');

export async function seedPhotos(db: Knex, storage: PhotoStorage): Promise<void> {
  const surveyor = DEMO_USERS.find((u) => u.orgId === DEMO_ORG.id && u.role === 'surveyor')!;
  for (const survey of [demoSurvey(), demoSubmittedSurvey()]) {
    // the survey as stored: one seeded by an older seed may name its photos by other ids
    const stored = await db('surveys').where({ id: survey.id, organisation_id: DEMO_ORG.id }).first('doc');
    if (!stored) continue;
    const photos = ((typeof stored.doc === 'string' ? JSON.parse(stored.doc) : stored.doc) as typeof survey).photos ?? [];
    for (const photo of photos) {
      const file = DEMO_PHOTO_FILES[photo.id];
      if (!file) continue;
      const bytes = fs.readFileSync(path.join(PHOTO_DIR, file));
      const existing = await findPhotoAnyOrg(db, photo.id);
      if (existing) {
        if (existing.organisationId === DEMO_ORG.id && !(await storage.get(existing.storageKey))) await storage.put(existing.storageKey, bytes, 'image/jpeg');
        continue;
      }
      const storageKey = `${DEMO_ORG.id}/${survey.id}/${photo.id}.jpg`;
      await storage.put(storageKey, bytes, 'image/jpeg');
      await insertPhoto(db, {
        id: photo.id,
        orgId: DEMO_ORG.id,
        surveyId: survey.id,
        entityKind: photo.entity.kind,
        entityId: photo.entity.id,
        caption: photo.caption,
        contentType: 'image/jpeg',
        sizeBytes: bytes.length,
        sha256: createHash('sha256').update(bytes).digest('hex'),
        storageKey,
        uploadedBy: surveyor.id,
      });
    }
  }
}
