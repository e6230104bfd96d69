/**
 * The `rate_limits` table: fixed-window counters per bucket. A bucket is the SHA-256 of
 * "scope:value" (e.g. "sign-in:address:a@b.test"), so neither addresses nor IPs are stored in the
 * clear. Counting is an `INSERT … ON DUPLICATE KEY UPDATE`, atomic across app instances.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from './index';

export function bucketOf(scope: string, value: string): string {
	return createHash('sha256').update(`${scope}:${value}`, 'utf8').digest('hex');
}

function windowStart(now: Date, windowSeconds: number): Date {
	const ms = windowSeconds * 1000;
	return new Date(Math.floor(now.getTime() / ms) * ms);
}

export interface Count {
	hits: number;
	/** When the current window ends and the count starts again. */
	resetsAt: Date;
}

/**
 * Adds one hit to the bucket's current window and returns the window's count including it. The
 * upsert and the read share a transaction (the row stays locked between them), so concurrent callers
 * each see their own count: 1, 2, 3 …
 */
export async function hit(bucket: string, windowSeconds: number, now = new Date(), q: Knex = db): Promise<Count> {
	const start = windowStart(now, windowSeconds);
	const resetsAt = new Date(start.getTime() + windowSeconds * 1000);
	const hits = await q.transaction(async (trx) => {
		await trx.raw(
			'INSERT INTO rate_limits (bucket, window_start, hits, expires_at) VALUES (?, ?, 1, ?) ON DUPLICATE KEY UPDATE hits = hits + 1',
			[bucket, start, resetsAt]
		);
		const row = await trx('rate_limits').where({ bucket, window_start: start }).first('hits');
		return Number(row?.hits ?? 1);
	});
	return { hits, resetsAt };
}

/** The bucket's count in the current window, without adding to it. */
export async function read(bucket: string, windowSeconds: number, now = new Date(), q: Knex = db): Promise<Count> {
	const start = windowStart(now, windowSeconds);
	const row = await q('rate_limits').where({ bucket, window_start: start }).first('hits');
	return { hits: Number(row?.hits ?? 0), resetsAt: new Date(start.getTime() + windowSeconds * 1000) };
}

/** Forgets a bucket (e.g. an address's failed sign-ins once it signs in). */
export async function destroy(bucket: string, q: Knex = db): Promise<void> {
	await q('rate_limits').where({ bucket }).delete();
}

/** Removes windows that have ended (housekeeping). */
export async function destroyExpired(now = new Date(), q: Knex = db): Promise<number> {
	return q('rate_limits').where('expires_at', '<=', now).delete();
}
