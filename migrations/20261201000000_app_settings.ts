import type { Knex } from 'knex';

// Site-wide key/value settings (e.g. the version of the colour computation readings were made with).
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('app_settings', (t) => {
		t.engine('InnoDB');
		t.charset('utf8mb4');
		t.collate('utf8mb4_unicode_ci');
		t.string('key', 100).primary();
		t.text('value').notNullable();
		t.timestamp('updated_at').notNullable().defaultTo(knex.fn.now());
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('app_settings');
}
