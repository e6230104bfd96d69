import type { Knex } from 'knex';

/**
 * Projects, who is on each with which role, and invitations by e-mail (the token is kept only as a
 * SHA-256 hash). `projects.version` is bumped on every update for optimistic concurrency.
 */

const ROLES = ['owner', 'dp', 'gaffer', 'colorist', 'viewer'];

function table(t: Knex.CreateTableBuilder): void {
	t.engine('InnoDB');
	t.charset('utf8mb4');
	t.collate('utf8mb4_unicode_ci');
}

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('projects', (t) => {
		table(t);
		t.increments('id').primary();
		t.string('name', 160).notNullable();
		t.text('notes').nullable();
		t.datetime('archived_at', { precision: 3 }).nullable();
		t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.integer('version').unsigned().notNullable().defaultTo(1);
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
	});

	await knex.schema.createTable('project_members', (t) => {
		table(t);
		t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.enu('role', ROLES).notNullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.primary(['project_id', 'user_id']);
		t.index(['user_id']);
	});

	await knex.schema.createTable('invitations', (t) => {
		table(t);
		t.increments('id').primary();
		t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
		t.string('email', 255).notNullable();
		t.enu('role', ROLES).notNullable();
		t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
		t.datetime('expires_at', { precision: 3 }).notNullable();
		t.datetime('used_at', { precision: 3 }).nullable();
		t.integer('used_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.integer('invited_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.index(['project_id', 'email']);
	});
}

export async function down(knex: Knex): Promise<void> {
	for (const name of ['invitations', 'project_members', 'projects']) {
		await knex.schema.dropTableIfExists(name);
	}
}
