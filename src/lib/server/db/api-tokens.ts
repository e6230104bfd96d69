/**
 * Personal access tokens for scripts. The token is shown once when made; only its SHA-256 is kept.
 * Tokens look like `cs_<prefix>_<secret>`, the prefix kept in the clear so a person can tell them apart.
 */
import { createHash, randomBytes } from 'node:crypto';
import { db } from './index';

export interface ApiToken {
	id: number;
	userId: number;
	name: string;
	prefix: string;
	lastUsedAt: string | null;
	expiresAt: string | null;
	revokedAt: string | null;
	createdAt: string;
}

type Row = Record<string, unknown>;
const iso = (v: unknown): string | null => (v instanceof Date ? v.toISOString() : v ? String(v) : null);
const hash = (token: string) => createHash('sha256').update(token).digest('hex');

function fromRow(r: Row): ApiToken {
	return {
		id: r.id as number,
		userId: r.user_id as number,
		name: r.name as string,
		prefix: r.prefix as string,
		lastUsedAt: iso(r.last_used_at),
		expiresAt: iso(r.expires_at),
		revokedAt: iso(r.revoked_at),
		createdAt: iso(r.created_at) as string
	};
}

export async function create(userId: number, name: string, expiresAt: Date | null = null): Promise<{ token: string; record: ApiToken }> {
	const prefix = randomBytes(4).toString('hex');
	const token = `cs_${prefix}_${randomBytes(24).toString('base64url')}`;
	const [id] = await db('api_tokens').insert({ user_id: userId, name: name.slice(0, 120), token_hash: hash(token), prefix, expires_at: expiresAt });
	const row = await db('api_tokens').where({ id }).first();
	return { token, record: fromRow(row) };
}

export async function list(userId: number): Promise<ApiToken[]> {
	const rows = await db('api_tokens').where({ user_id: userId }).orderBy('id', 'desc');
	return rows.map(fromRow);
}

/** The user id a live token belongs to, or null; records when it was last used. */
export async function verify(token: string): Promise<number | null> {
	if (!/^cs_[0-9a-f]{8}_[A-Za-z0-9_-]{20,}$/.test(token)) return null;
	const row = await db('api_tokens').where({ token_hash: hash(token) }).whereNull('revoked_at').first();
	if (!row) return null;
	if (row.expires_at && new Date(row.expires_at as string) < new Date()) return null;
	await db('api_tokens').where({ id: row.id }).update({ last_used_at: db.fn.now(3) });
	return row.user_id as number;
}

export async function revoke(userId: number, id: number): Promise<boolean> {
	const n = await db('api_tokens').where({ id, user_id: userId }).whereNull('revoked_at').update({ revoked_at: db.fn.now(3) });
	return n === 1;
}
