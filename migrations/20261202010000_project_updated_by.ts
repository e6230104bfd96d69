import type { Knex } from 'knex';

/**
 * Who last changed a project (its name, notes or archived state), so a save that lost the race to
 * someone else's can say whose change it met, like the lighting log's edits do. Adds a column to an
 * existing InnoDB, utf8mb4 table that keeps its primary key; no new table.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('projects', (t) => {
		t.integer('updated_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('projects', (t) => {
		t.dropForeign(['updated_by']);
		t.dropColumn('updated_by');
	});
}
