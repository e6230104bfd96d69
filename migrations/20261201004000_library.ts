import type { Knex } from 'knex';

/**
 * The library: per-project changes to the built-in filters' nominal figures, custom filters made
 * from a measured transmission, and fixture profiles made from measured channel spectra.
 *
 * Custom filters and fixture profiles are either shared (project_id NULL, managed by a site admin)
 * or belong to one project. `scope_id` is the project id, or 0 for the shared library: a plain
 * NOT NULL column so that one unique index keeps names (and profile keys) unique within a scope,
 * which a nullable project_id cannot do (NULLs never collide in a unique index).
 *
 * Uploaded names, notes and channel labels are the user's own text, stored as given.
 */

function table(t: Knex.CreateTableBuilder): void {
	t.engine('InnoDB');
	t.charset('utf8mb4');
	t.collate('utf8mb4_unicode_ci');
}

function stamps(t: Knex.CreateTableBuilder, knex: Knex): void {
	t.integer('version').unsigned().notNullable().defaultTo(1);
	t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
	t.integer('updated_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
	t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
	t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
}

/** Shared (project_id NULL, scope_id 0) or one project's (scope_id = project_id). */
function scoped(t: Knex.CreateTableBuilder): void {
	t.integer('project_id').unsigned().nullable().references('projects.id').onDelete('CASCADE');
	t.integer('scope_id').unsigned().notNullable().defaultTo(0);
}

/** The uploaded file as received, so a filter or profile can be derived again. */
function source(t: Knex.CreateTableBuilder): void {
	t.string('original_name', 255).notNullable().defaultTo('');
	t.specificType('sha256', 'CHAR(64)').notNullable();
	t.specificType('source_csv', 'LONGBLOB').notNullable();
}

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('library_filter_overrides', (t) => {
		table(t);
		t.increments('id').primary();
		t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
		// A built-in filter id such as `ctb-half` (checked by the service against the built-in list).
		t.string('gel_id', 40).notNullable();
		t.double('mired_shift').nullable();
		t.double('loss_stops').nullable();
		t.string('note', 500).notNullable().defaultTo('');
		stamps(t, knex);
		t.unique(['project_id', 'gel_id']);
	});

	await knex.schema.createTable('library_custom_gels', (t) => {
		table(t);
		t.increments('id').primary();
		scoped(t);
		t.string('name', 160).notNullable();
		t.text('notes').nullable();
		// {start, interval, values}: transmission as fractions 0..1 on the measured grid (nm).
		t.json('transmission').notNullable();
		// How the file gave the values: percent (0..100) or fractions (0..1).
		t.enu('source_unit', ['percent', 'fraction']).notNullable();
		source(t);
		stamps(t, knex);
		t.unique(['scope_id', 'name']);
		t.index(['project_id']);
	});

	await knex.schema.createTable('library_fixture_profiles', (t) => {
		table(t);
		t.increments('id').primary();
		scoped(t);
		// What a light names in its fixture profile field (lights.fixture_profile is 80 characters).
		t.string('profile_key', 80).notNullable();
		t.string('name', 160).notNullable();
		t.text('notes').nullable();
		// [{id, label, spectrum: {start, interval, values}, maxFlux | null}], one grid for all channels.
		t.json('channels').notNullable();
		// max_output: each channel rescaled to the maximum output given; as_measured: spectra used as they are.
		t.enu('output_basis', ['max_output', 'as_measured']).notNullable();
		source(t);
		stamps(t, knex);
		t.unique(['scope_id', 'profile_key']);
		t.index(['project_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('library_fixture_profiles');
	await knex.schema.dropTableIfExists('library_custom_gels');
	await knex.schema.dropTableIfExists('library_filter_overrides');
}
