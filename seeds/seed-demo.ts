/**
 * Seeds the demo firms, their people and the invented casualty. Idempotent: fixed ids and
 * ON CONFLICT DO NOTHING, so a second `npm start` changes nothing and duplicates nothing.
 */
import bcrypt from 'bcryptjs';
import type { Knex } from 'knex';
import { DEMO_ORG, DEMO_USERS, OTHER_ORG } from './demo-people';
import { seedSurveys } from './seed-surveys';
import { seedPhotos } from './seed-photos';
import type { PhotoStorage } from '../server/storage/photo-store';

/** `photos`: the store the server reads photos from; without it the demo photos get no files. */
export async function seedDemo(db: Knex, opts: { bcryptCost: number; photos?: PhotoStorage }): Promise<{ created: boolean }> {
  const existing = await db('organisations').where({ id: DEMO_ORG.id }).first('id');
  if (existing) {
    await seedSurveys(db);
    if (opts.photos) await seedPhotos(db, opts.photos);
    return { created: false };
  }
  await db.transaction(async (trx) => {
    await trx('organisations').insert([DEMO_ORG, OTHER_ORG]).onConflict('id').ignore();
    for (const u of DEMO_USERS) {
      const hash = await bcrypt.hash(u.password, opts.bcryptCost);
      await trx('users')
        .insert({ id: u.id, email: u.email, name: u.name, password_hash: hash })
        .onConflict('id')
        .ignore();
      await trx('memberships')
        .insert({ organisation_id: u.orgId, user_id: u.id, role: u.role, status: 'active' })
        .onConflict(['organisation_id', 'user_id'])
        .ignore();
    }
  });
  await seedSurveys(db);
  if (opts.photos) await seedPhotos(db, opts.photos);
  return { created: true };
}
