import type { Knex } from 'knex';

/**
 * Comments can be corrected by their author: a version for optimistic concurrency and the time of
 * the last edit. The activity log gets an index to list one subject's history.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('comments', (t) => {
		t.integer('version').unsigned().notNullable().defaultTo(1);
		t.datetime('updated_at', { precision: 3 }).nullable();
	});
	await knex.schema.alterTable('activity', (t) => {
		t.index(['project_id', 'subject_type', 'subject_id'], 'activity_subject_index');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('activity', (t) => {
		t.dropIndex(['project_id', 'subject_type', 'subject_id'], 'activity_subject_index');
	});
	await knex.schema.alterTable('comments', (t) => {
		t.dropColumn('updated_at');
		t.dropColumn('version');
	});
}
