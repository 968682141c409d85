import type { Knex } from 'knex';
// knex.raw treats every ? as a binding: write {0,1} in a regex, never ?.

/**
 * A job photo's client id: the phone's own id for the photo (uuid), like the install rows' client_row_id,
 * so that a resend after a lost answer finds the photo already stored instead of storing it twice. Unique
 * across the table (the phone makes a new id per photo); null for photos uploaded without one.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    alter table job_photos add column client_photo_id uuid;
    alter table job_photos add constraint job_photos_client_photo_id_key unique (client_photo_id);
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    alter table job_photos drop constraint job_photos_client_photo_id_key;
    alter table job_photos drop column client_photo_id;
  `);
}
