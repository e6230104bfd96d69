import type { Knex } from 'knex';

/**
 * The lighting log: shoot days → setups → lights, with circuits for the power plan, readings (raw
 * input kept alongside the computed values), the original uploaded files, saved column mappings,
 * accepted fixes, comments, the activity log, and personal access tokens for scripts.
 *
 * Every editable row carries `version` for optimistic concurrency and `updated_by` so a conflicting
 * save can say who changed it.
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

function project(t: Knex.CreateTableBuilder): void {
	t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
}

const SETUP_STATUSES = ['planning', 'lit', 'shot'] as const;
const LIGHT_ROLES = ['key', 'fill', 'back', 'practical', 'ambient', 'background', 'effect'] as const;
const READING_KINDS = ['spectral', 'chromaticity_xy', 'chromaticity_uv_prime', 'cct_duv', 'tristimulus'] as const;

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('shoot_days', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.date('shoot_date').notNullable();
		t.string('label', 120).notNullable().defaultTo('');
		t.string('location_name', 200).notNullable().defaultTo('');
		t.smallint('mains_voltage').unsigned().notNullable().defaultTo(230);
		t.tinyint('mains_frequency').unsigned().notNullable().defaultTo(50);
		t.text('notes').nullable();
		stamps(t, knex);
		t.index(['project_id', 'shoot_date']);
	});

	await knex.schema.createTable('setups', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.integer('shoot_day_id').unsigned().notNullable().references('shoot_days.id').onDelete('CASCADE');
		t.string('name', 160).notNullable();
		t.text('notes').nullable();
		t.enu('status', [...SETUP_STATUSES]).notNullable().defaultTo('planning');
		// The target white as chosen (a reading, CCT + Duv, xy, u'v', an illuminant or an average).
		t.json('target').nullable();
		t.double('target_tolerance').notNullable().defaultTo(0.002);
		t.datetime('target_locked_at', { precision: 3 }).nullable();
		t.integer('target_locked_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.datetime('locked_at', { precision: 3 }).nullable();
		t.integer('locked_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.integer('position').notNullable().defaultTo(0);
		stamps(t, knex);
		t.index(['project_id']);
		t.index(['shoot_day_id', 'position']);
	});

	await knex.schema.createTable('circuits', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.integer('setup_id').unsigned().notNullable().references('setups.id').onDelete('CASCADE');
		t.string('label', 120).notNullable();
		t.string('preset', 40).nullable();
		t.smallint('volts').unsigned().notNullable();
		t.decimal('amps', 6, 2).notNullable();
		// Continuous-load factor (0.8 is the common North American practice).
		t.decimal('derating', 4, 3).notNullable().defaultTo(0.8);
		stamps(t, knex);
		t.index(['setup_id']);
	});

	await knex.schema.createTable('lights', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.integer('setup_id').unsigned().notNullable().references('setups.id').onDelete('CASCADE');
		t.string('label', 160).notNullable();
		t.enu('role', [...LIGHT_ROLES]).notNullable().defaultTo('key');
		// What sort of source: tungsten, hmi, fluorescent, sodium, led-bicolour, led-rgbw, daylight, practical…
		t.string('kind', 40).notNullable().defaultTo('other');
		t.string('fixture_profile', 80).nullable();
		t.json('gel_stack').nullable();
		t.json('led_settings').nullable();
		t.decimal('dimmer_percent', 5, 2).nullable();
		t.integer('power_w').unsigned().nullable();
		t.integer('circuit_id').unsigned().nullable().references('circuits.id').onDelete('SET NULL');
		t.text('notes').nullable();
		t.integer('position').notNullable().defaultTo(0);
		t.datetime('deleted_at', { precision: 3 }).nullable();
		stamps(t, knex);
		t.index(['setup_id', 'position']);
		t.index(['project_id']);
	});

	await knex.schema.createTable('uploads', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.string('filename', 255).notNullable();
		t.string('content_type', 120).notNullable().defaultTo('text/csv');
		t.integer('size_bytes').unsigned().notNullable();
		t.specificType('sha256', 'CHAR(64)').notNullable();
		// The original bytes, always kept, so a reading can be re-derived or re-imported.
		t.specificType('content', 'LONGBLOB').notNullable();
		t.enu('status', ['previewed', 'imported', 'discarded']).notNullable().defaultTo('previewed');
		t.json('mapping').nullable();
		t.json('report').nullable();
		t.integer('uploaded_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('imported_at', { precision: 3 }).nullable();
		t.index(['project_id', 'sha256']);
	});

	await knex.schema.createTable('column_mappings', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.string('name', 120).notNullable();
		t.json('mapping').notNullable();
		stamps(t, knex);
		t.unique(['project_id', 'name']);
	});

	await knex.schema.createTable('readings', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.integer('setup_id').unsigned().nullable().references('setups.id').onDelete('SET NULL');
		t.integer('light_id').unsigned().nullable().references('lights.id').onDelete('SET NULL');
		t.integer('upload_id').unsigned().nullable().references('uploads.id').onDelete('SET NULL');
		t.integer('source_row').unsigned().nullable();
		t.string('label', 200).notNullable().defaultTo('');
		t.enu('kind', [...READING_KINDS]).notNullable();
		t.datetime('taken_at', { precision: 3 }).nullable();
		t.string('meter', 120).nullable();
		t.text('notes').nullable();
		// The input exactly as read: a spectrum {start, interval, values, scale} or coordinates.
		t.json('raw').notNullable();
		// Computed values (recomputed from `raw` when the computation version changes).
		t.double('x').nullable();
		t.double('y').nullable();
		t.double('u_prime').nullable();
		t.double('v_prime').nullable();
		t.double('cct_k').nullable();
		t.double('duv').nullable();
		t.double('lux').nullable();
		t.double('cri_ra').nullable();
		t.double('cri_r9').nullable();
		t.double('ssi').nullable();
		t.json('analysis').nullable();
		t.string('computation_version', 40).notNullable();
		t.datetime('deleted_at', { precision: 3 }).nullable();
		t.integer('deleted_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		stamps(t, knex);
		t.index(['project_id', 'taken_at']);
		t.index(['setup_id']);
		t.index(['light_id']);
		t.index(['computation_version']);
	});

	await knex.schema.createTable('accepted_fixes', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.integer('setup_id').unsigned().notNullable().references('setups.id').onDelete('CASCADE');
		t.integer('light_id').unsigned().notNullable().references('lights.id').onDelete('CASCADE');
		t.enu('kind', ['gel', 'led']).notNullable();
		// The fix as proposed (stack or channel levels) and its prediction at the time.
		t.json('fix').notNullable();
		t.json('predicted').nullable();
		t.json('target').nullable();
		t.text('note').nullable();
		t.integer('accepted_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.datetime('accepted_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.index(['light_id', 'accepted_at']);
	});

	await knex.schema.createTable('comments', (t) => {
		table(t);
		t.increments('id').primary();
		project(t);
		t.enu('subject_type', ['setup', 'light', 'reading']).notNullable();
		t.integer('subject_id').unsigned().notNullable();
		t.integer('author_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.text('body').notNullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('deleted_at', { precision: 3 }).nullable();
		t.index(['project_id', 'subject_type', 'subject_id']);
	});

	await knex.schema.createTable('activity', (t) => {
		table(t);
		t.bigIncrements('id').primary();
		project(t);
		t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.string('action', 60).notNullable();
		t.string('subject_type', 40).notNullable();
		t.integer('subject_id').unsigned().nullable();
		t.string('summary', 500).notNullable();
		t.json('details').nullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.index(['project_id', 'created_at']);
	});

	await knex.schema.createTable('api_tokens', (t) => {
		table(t);
		t.increments('id').primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.string('name', 120).notNullable();
		// SHA-256 of the token; the token itself is shown once, at creation.
		t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
		t.string('prefix', 12).notNullable();
		t.datetime('last_used_at', { precision: 3 }).nullable();
		t.datetime('expires_at', { precision: 3 }).nullable();
		t.datetime('revoked_at', { precision: 3 }).nullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.index(['user_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	for (const name of [
		'api_tokens',
		'activity',
		'comments',
		'accepted_fixes',
		'readings',
		'column_mappings',
		'uploads',
		'lights',
		'circuits',
		'setups',
		'shoot_days'
	]) {
		await knex.schema.dropTableIfExists(name);
	}
}
