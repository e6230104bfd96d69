import type { Knex } from 'knex';

/**
 * Rate-limit windows start at a bucket's first attempt instead of on the clock's quarter hours, so a
 * refused address always waits the whole window and nobody gets a fresh allowance by trying just
 * before and just after a boundary. One row per bucket: the counters are short-lived, so the old
 * rows are dropped rather than merged.
 */
export async function up(knex: Knex): Promise<void> {
	await knex('rate_limits').delete();
	await knex.raw('ALTER TABLE rate_limits DROP PRIMARY KEY, ADD PRIMARY KEY (bucket)');
}

export async function down(knex: Knex): Promise<void> {
	await knex.raw('ALTER TABLE rate_limits DROP PRIMARY KEY, ADD PRIMARY KEY (bucket, window_start)');
}
