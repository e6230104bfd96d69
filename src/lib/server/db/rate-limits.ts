/**
 * The `rate_limits` table: one counter per bucket, whose window starts at the bucket's first hit and
 * lasts `windowSeconds` (so a refused caller always waits out a whole window; clock-aligned windows
 * would let someone try just before and just after a boundary). A bucket is the SHA-256 of
 * "scope:value" (e.g. "sign-in:address:a@b.test"), so neither addresses nor IPs are stored in the
 * clear. Counting is one `INSERT … ON DUPLICATE KEY UPDATE`, atomic across app instances.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from './index';

export function bucketOf(scope: string, value: string): string {
	return createHash('sha256').update(`${scope}:${value}`, 'utf8').digest('hex');
}

/** The table keeps whole seconds. */
function wholeSeconds(when: Date): Date {
	return new Date(Math.floor(when.getTime() / 1000) * 1000);
}

export interface Count {
	hits: number;
	/** When the current window ends and the count starts again. */
	resetsAt: Date;
}

/**
 * Adds one hit to the bucket's current window (opening a new one when there is none or it has
 * ended) and returns the window's count including it. The upsert and the read share a transaction
 * (the row stays locked between them), so concurrent callers each see their own count: 1, 2, 3 …
 *
 * The assignments in the UPDATE run left to right and each sees the columns already set, so
 * `expires_at` is assigned last: the tests on it before then still read the old window's end.
 */
export async function hit(bucket: string, windowSeconds: number, now = new Date(), q: Knex = db): Promise<Count> {
	const start = wholeSeconds(now);
	const ends = new Date(start.getTime() + windowSeconds * 1000);
	return q.transaction(async (trx) => {
		await trx.raw(
			`INSERT INTO rate_limits (bucket, window_start, hits, expires_at) VALUES (?, ?, 1, ?)
			 ON DUPLICATE KEY UPDATE
			   hits = IF(expires_at <= ?, 1, hits + 1),
			   window_start = IF(expires_at <= ?, VALUES(window_start), window_start),
			   expires_at = IF(expires_at <= ?, VALUES(expires_at), expires_at)`,
			[bucket, start, ends, start, start, start]
		);
		const row = await trx('rate_limits').where({ bucket }).first('hits', 'expires_at');
		return { hits: Number(row?.hits ?? 1), resetsAt: row?.expires_at ? new Date(row.expires_at) : ends };
	});
}

/** The bucket's count in its current window, without adding to it (0 when it has none open). */
export async function read(bucket: string, now = new Date(), q: Knex = db): Promise<Count> {
	const row = await q('rate_limits').where({ bucket }).where('expires_at', '>', wholeSeconds(now)).first('hits', 'expires_at');
	return row ? { hits: Number(row.hits), resetsAt: new Date(row.expires_at) } : { hits: 0, resetsAt: wholeSeconds(now) };
}

/** Forgets a bucket (e.g. an address's failed sign-ins once it signs in). */
export async function destroy(bucket: string, q: Knex = db): Promise<void> {
	await q('rate_limits').where({ bucket }).delete();
}

/** Removes windows that have ended (housekeeping). */
export async function destroyExpired(now = new Date(), q: Knex = db): Promise<number> {
	return q('rate_limits').where('expires_at', '<=', now).delete();
}
