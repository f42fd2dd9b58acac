import type { Knex } from 'knex';

// A refresh answer can be lost after the server rotated the token (the link drops, the page is
// closed mid-request); the device then still holds the token it sent. Each token now records the
// one issued for it, so the server can tell that case (the successor was never used) from a copied
// token (the successor was used). A successor set aside that way is `superseded`: presenting it
// later means two holders, and ends the whole family.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('refresh_tokens', (t) => {
    t.uuid('replaced_by').references('refresh_tokens.id').onDelete('SET NULL');
    t.timestamp('superseded_at', { useTz: true });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('refresh_tokens', (t) => {
    t.dropColumn('superseded_at');
    t.dropColumn('replaced_by');
  });
}
