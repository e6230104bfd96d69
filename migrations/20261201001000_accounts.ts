import type { Knex } from 'knex';

/**
 * People and sign-in: users, their sign-in accounts (Auth.js), server-side sessions, magic-link
 * tokens (Auth.js stores them hashed), our own single-use tokens for address confirmation and
 * password reset (SHA-256 hashes only), and rate-limit counters that survive restarts and are shared
 * by every app instance.
 */

function table(t: Knex.CreateTableBuilder): void {
	t.engine('InnoDB');
	t.charset('utf8mb4');
	t.collate('utf8mb4_unicode_ci');
}

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('users', (t) => {
		table(t);
		t.increments('id').primary();
		// Stored trimmed and lower-cased, so the unique index is the one place that decides "same address".
		t.string('email', 255).notNullable().unique();
		t.string('name', 120).notNullable().defaultTo('');
		t.datetime('email_verified', { precision: 3 }).nullable();
		t.string('image', 500).nullable();
		// argon2id (PHC string); null for people who only ever sign in with a link.
		t.string('password_hash', 255).nullable();
		t.boolean('is_admin').notNullable().defaultTo(false);
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
	});

	await knex.schema.createTable('accounts', (t) => {
		table(t);
		t.increments('id').primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.string('type', 32).notNullable();
		t.string('provider', 64).notNullable();
		t.string('provider_account_id', 255).notNullable();
		t.text('refresh_token').nullable();
		t.text('access_token').nullable();
		t.integer('expires_at').nullable();
		t.string('token_type', 64).nullable();
		t.string('scope', 500).nullable();
		t.text('id_token').nullable();
		t.string('session_state', 255).nullable();
		t.unique(['provider', 'provider_account_id']);
		t.index(['user_id']);
	});

	await knex.schema.createTable('sessions', (t) => {
		table(t);
		t.string('session_token', 128).primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.datetime('expires', { precision: 3 }).notNullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.index(['user_id']);
		t.index(['expires']);
	});

	await knex.schema.createTable('verification_tokens', (t) => {
		table(t);
		t.string('identifier', 255).notNullable();
		t.string('token', 128).notNullable();
		t.datetime('expires', { precision: 3 }).notNullable();
		t.primary(['identifier', 'token']);
		t.unique(['token']);
	});

	await knex.schema.createTable('user_tokens', (t) => {
		table(t);
		t.increments('id').primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.enu('purpose', ['confirm-email', 'reset-password']).notNullable();
		t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
		t.datetime('expires_at', { precision: 3 }).notNullable();
		t.datetime('used_at', { precision: 3 }).nullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
		t.index(['user_id', 'purpose']);
	});

	await knex.schema.createTable('rate_limits', (t) => {
		table(t);
		// SHA-256 of "scope:value", so addresses and IPs are not kept in the clear.
		t.specificType('bucket', 'CHAR(64)').notNullable();
		t.datetime('window_start', { precision: 0 }).notNullable();
		t.integer('hits').unsigned().notNullable().defaultTo(0);
		t.datetime('expires_at', { precision: 0 }).notNullable();
		t.primary(['bucket', 'window_start']);
		t.index(['expires_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	for (const name of ['rate_limits', 'user_tokens', 'verification_tokens', 'sessions', 'accounts', 'users']) {
		await knex.schema.dropTableIfExists(name);
	}
}
