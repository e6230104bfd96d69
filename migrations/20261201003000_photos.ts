import type { Knex } from 'knex';

/**
 * Photos of the set (reference stills, lighting diagrams) attached to a setup or to one light.
 *
 * The bytes live in object storage, never in the database: a row holds the object keys. A photo is
 * `pending` from the moment an upload is granted until the server has checked and cleaned the file;
 * then `ready` (cleaned original and thumbnail written, location metadata removed) or `rejected`
 * (with a reason a person can act on).
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('photos', (t) => {
		t.engine('InnoDB');
		t.charset('utf8mb4');
		t.collate('utf8mb4_unicode_ci');
		t.increments('id').primary();
		t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
		// A photo of one light also names that light's setup, so filtering by setup finds it.
		t.integer('setup_id').unsigned().nullable().references('setups.id').onDelete('CASCADE');
		t.integer('light_id').unsigned().nullable().references('lights.id').onDelete('SET NULL');
		t.string('caption', 500).notNullable().defaultTo('');
		t.string('original_name', 255).notNullable().defaultTo('');
		// What the browser said it was sending; the stored type below comes from the bytes.
		t.string('declared_type', 100).notNullable();
		t.integer('declared_bytes').unsigned().notNullable();
		t.string('incoming_key', 300).notNullable();
		t.string('original_key', 300).nullable();
		t.string('thumbnail_key', 300).nullable();
		t.string('content_type', 100).nullable();
		t.integer('bytes').unsigned().nullable();
		t.integer('width').unsigned().nullable();
		t.integer('height').unsigned().nullable();
		t.integer('thumbnail_width').unsigned().nullable();
		t.integer('thumbnail_height').unsigned().nullable();
		t.enu('status', ['pending', 'ready', 'rejected']).notNullable().defaultTo('pending');
		t.string('reject_code', 40).nullable();
		t.string('reject_reason', 500).nullable();
		// Whether the file as received carried GPS coordinates (they are never stored). Null until checked.
		t.boolean('had_location').nullable();
		t.integer('uploaded_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('completed_at', { precision: 3 }).nullable();
		t.index(['project_id', 'status', 'created_at']);
		t.index(['setup_id']);
		t.index(['light_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('photos');
}
