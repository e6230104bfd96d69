/**
 * An Auth.js adapter over our MariaDB tables, through Knex: `users` and `accounts` via their table
 * modules, `sessions` and `verification_tokens` (Auth.js's own tables) here.
 *
 * Auth.js speaks string ids and camelCase fields (`emailVerified`, `userId`, `sessionToken`); our ids
 * are unsigned integers. An id that is not one of ours (Auth.js makes up a UUID for a person it has not
 * met yet) simply finds nothing.
 */
import type { Knex } from 'knex';
import type { Adapter, AdapterAccount, AdapterSession, AdapterUser, VerificationToken } from '@auth/sveltekit/adapters';
import * as accounts from '../db/accounts';
import * as users from '../db/users';
import type { User } from '../db/users';

function toAdapterUser(u: User): AdapterUser {
	return { id: String(u.id), email: u.email, name: u.name || null, emailVerified: u.emailVerified, image: u.image };
}

export function parseUserId(id: string | number | undefined | null): number | null {
	const s = String(id ?? '');
	return /^[1-9][0-9]{0,9}$/.test(s) ? Number(s) : null;
}

interface SessionRow {
	session_token: string;
	user_id: number;
	expires: Date;
}

const toAdapterSession = (r: SessionRow): AdapterSession => ({
	sessionToken: r.session_token,
	userId: String(r.user_id),
	expires: r.expires
});

export interface KnexAdapter extends Required<
	Pick<
		Adapter,
		| 'createUser'
		| 'getUser'
		| 'getUserByEmail'
		| 'getUserByAccount'
		| 'updateUser'
		| 'deleteUser'
		| 'linkAccount'
		| 'unlinkAccount'
		| 'createSession'
		| 'getSessionAndUser'
		| 'updateSession'
		| 'deleteSession'
		| 'createVerificationToken'
		| 'useVerificationToken'
	>
> {
	/** Ends every session of a user (after a password reset, for instance). Not part of Auth.js. */
	deleteUserSessions(userId: string): Promise<number>;
}

export function createKnexAdapter(knex: Knex): KnexAdapter {
	return {
		async createUser(user) {
			const created = await users.create(
				{ email: user.email, name: user.name ?? '', emailVerified: user.emailVerified ?? null, image: user.image ?? null },
				knex
			);
			return toAdapterUser(created);
		},

		async getUser(id) {
			const n = parseUserId(id);
			const u = n === null ? null : await users.read(n, knex);
			return u ? toAdapterUser(u) : null;
		},

		async getUserByEmail(email) {
			const u = await users.readByEmail(email, knex);
			return u ? toAdapterUser(u) : null;
		},

		async getUserByAccount({ provider, providerAccountId }) {
			const account = await accounts.readByProvider(provider, providerAccountId, knex);
			const u = account ? await users.read(account.userId, knex) : null;
			return u ? toAdapterUser(u) : null;
		},

		async updateUser(user) {
			const n = parseUserId(user.id);
			const updated =
				n === null
					? null
					: await users.update(
							n,
							{
								email: user.email ?? undefined,
								name: user.name === undefined ? undefined : (user.name ?? ''),
								emailVerified: user.emailVerified,
								image: user.image
							},
							knex
						);
			if (!updated) throw new Error(`No user with id ${user.id}`);
			return toAdapterUser(updated);
		},

		async deleteUser(userId) {
			const n = parseUserId(userId);
			const u = n === null ? null : await users.read(n, knex);
			if (u) await users.destroy(u.id, knex);
			return u ? toAdapterUser(u) : null;
		},

		async linkAccount(account) {
			const userId = parseUserId(account.userId);
			if (userId === null) throw new Error(`No user with id ${account.userId}`);
			await accounts.create(
				{
					userId,
					type: account.type,
					provider: account.provider,
					providerAccountId: account.providerAccountId,
					refreshToken: account.refresh_token ?? null,
					accessToken: account.access_token ?? null,
					expiresAt: account.expires_at ?? null,
					tokenType: account.token_type ?? null,
					scope: account.scope ?? null,
					idToken: account.id_token ?? null,
					sessionState: typeof account.session_state === 'string' ? account.session_state : null
				},
				knex
			);
			return account;
		},

		async unlinkAccount({ provider, providerAccountId }) {
			const gone = await accounts.destroyByProvider(provider, providerAccountId, knex);
			if (!gone) return undefined;
			const out: AdapterAccount = {
				userId: String(gone.userId),
				type: gone.type as AdapterAccount['type'],
				provider: gone.provider,
				providerAccountId: gone.providerAccountId
			};
			return out;
		},

		async createSession({ sessionToken, userId, expires }) {
			const n = parseUserId(userId);
			if (n === null) throw new Error(`No user with id ${userId}`);
			await knex('sessions').insert({ session_token: sessionToken, user_id: n, expires, created_at: new Date() });
			return { sessionToken, userId: String(n), expires };
		},

		async getSessionAndUser(sessionToken) {
			const row = await knex<SessionRow>('sessions').where({ session_token: sessionToken }).first();
			if (!row) return null;
			const u = await users.read(row.user_id, knex);
			return u ? { session: toAdapterSession(row), user: toAdapterUser(u) } : null;
		},

		async updateSession(session) {
			const changes: Record<string, unknown> = {};
			if (session.expires) changes.expires = session.expires;
			if (session.userId) {
				const n = parseUserId(session.userId);
				if (n === null) return null;
				changes.user_id = n;
			}
			if (Object.keys(changes).length > 0) {
				await knex('sessions').where({ session_token: session.sessionToken }).update(changes);
			}
			const row = await knex<SessionRow>('sessions').where({ session_token: session.sessionToken }).first();
			return row ? toAdapterSession(row) : null;
		},

		async deleteSession(sessionToken) {
			const row = await knex<SessionRow>('sessions').where({ session_token: sessionToken }).first();
			if (!row) return null;
			await knex('sessions').where({ session_token: sessionToken }).delete();
			return toAdapterSession(row);
		},

		async deleteUserSessions(userId) {
			const n = parseUserId(userId);
			return n === null ? 0 : knex('sessions').where({ user_id: n }).delete();
		},

		async createVerificationToken(token) {
			await knex('verification_tokens').insert({ identifier: token.identifier, token: token.token, expires: token.expires });
			return token;
		},

		// Single use: the row is locked, read and deleted in one transaction, so a second use finds nothing.
		async useVerificationToken({ identifier, token }) {
			return knex.transaction(async (trx) => {
				const where: Record<string, string> = { token };
				if (identifier) where.identifier = identifier;
				const row = await trx<VerificationToken>('verification_tokens').where(where).forUpdate().first();
				if (!row) return null;
				await trx('verification_tokens').where({ identifier: row.identifier, token: row.token }).delete();
				return { identifier: row.identifier, token: row.token, expires: row.expires };
			});
		}
	};
}

/**
 * A session with our full user (the per-request check behind `event.locals.user`), or null when the
 * token is unknown. Two primary-key lookups; expiry is left to the caller.
 */
export async function readSessionWithUser(knex: Knex, sessionToken: string): Promise<{ expires: Date; user: User } | null> {
	const row = await knex<SessionRow>('sessions').where({ session_token: sessionToken }).first();
	if (!row) return null;
	const user = await users.read(row.user_id, knex);
	return user ? { expires: row.expires, user } : null;
}
