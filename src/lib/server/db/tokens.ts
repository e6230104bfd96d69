/**
 * The `user_tokens` table: single-use, expiring tokens we mail out to confirm an address or reset a
 * password. Only the SHA-256 of a token is stored; the token itself exists in the mail alone.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from './index';

export type TokenPurpose = 'confirm-email' | 'reset-password';

/** 32 random bytes, base64url (43 characters): what goes into a link. */
export function randomToken(): string {
	return randomBytes(32).toString('base64url');
}

/** Lower-case hex SHA-256 of the token's UTF-8 bytes: what the database keeps. */
export function hashToken(token: string): string {
	return createHash('sha256').update(token, 'utf8').digest('hex');
}

export interface IssuedToken {
	/** The plain token, to put in a link; never stored. */
	token: string;
	expiresAt: Date;
}

export interface StoredToken {
	id: number;
	userId: number;
	purpose: TokenPurpose;
	expiresAt: Date;
	usedAt: Date | null;
}

interface Row {
	id: number;
	user_id: number;
	purpose: TokenPurpose;
	token_hash: string;
	expires_at: Date;
	used_at: Date | null;
}

const toStored = (r: Row): StoredToken => ({ id: r.id, userId: r.user_id, purpose: r.purpose, expiresAt: r.expires_at, usedAt: r.used_at });

export async function create(userId: number, purpose: TokenPurpose, ttlSeconds: number, q: Knex = db): Promise<IssuedToken> {
	const token = randomToken();
	const expiresAt = new Date(Date.now() + ttlSeconds * 1000);
	await q('user_tokens').insert({ user_id: userId, purpose, token_hash: hashToken(token), expires_at: expiresAt });
	return { token, expiresAt };
}

/** The token's row if it exists for that purpose, whether or not it is still usable. */
export async function read(token: string, purpose: TokenPurpose, q: Knex = db): Promise<StoredToken | null> {
	const row = await q<Row>('user_tokens').where({ token_hash: hashToken(token), purpose }).first();
	return row ? toStored(row) : null;
}

export function isUsable(t: StoredToken | null, now = new Date()): t is StoredToken {
	return t !== null && t.usedAt === null && t.expiresAt.getTime() > now.getTime();
}

/**
 * Marks the token used and returns its user, or null when it is unknown, expired or already used.
 * One conditional UPDATE, so two concurrent uses cannot both succeed.
 */
export async function consume(token: string, purpose: TokenPurpose, q: Knex = db): Promise<number | null> {
	const now = new Date();
	const hash = hashToken(token);
	const changed = await q('user_tokens')
		.where({ token_hash: hash, purpose })
		.whereNull('used_at')
		.where('expires_at', '>', now)
		.update({ used_at: now });
	if (changed !== 1) return null;
	const row = await q<Row>('user_tokens').where({ token_hash: hash }).first();
	return row ? row.user_id : null;
}

/** Removes a user's unused tokens of one purpose (e.g. older reset links once a password is set). */
export async function destroyUnused(userId: number, purpose: TokenPurpose, q: Knex = db): Promise<number> {
	return q('user_tokens').where({ user_id: userId, purpose }).whereNull('used_at').delete();
}

/** Removes tokens that expired before `before` (housekeeping). */
export async function destroyExpired(before = new Date(), q: Knex = db): Promise<number> {
	return q('user_tokens').where('expires_at', '<', before).delete();
}
