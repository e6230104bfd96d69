/**
 * The `accounts` table: how a user signs in with an outside provider (Auth.js "accounts"). E-mail and
 * password sign-ins need no row here; the table is kept so a provider can be added without a migration.
 */
import type { Knex } from 'knex';
import { db } from './index';

export interface Account {
	id: number;
	userId: number;
	type: string;
	provider: string;
	providerAccountId: string;
	refreshToken: string | null;
	accessToken: string | null;
	/** Seconds since the epoch, as the provider gives it. */
	expiresAt: number | null;
	tokenType: string | null;
	scope: string | null;
	idToken: string | null;
	sessionState: string | null;
}

interface Row {
	id: number;
	user_id: number;
	type: string;
	provider: string;
	provider_account_id: string;
	refresh_token: string | null;
	access_token: string | null;
	expires_at: number | null;
	token_type: string | null;
	scope: string | null;
	id_token: string | null;
	session_state: string | null;
}

function toAccount(row: Row): Account {
	return {
		id: row.id,
		userId: row.user_id,
		type: row.type,
		provider: row.provider,
		providerAccountId: row.provider_account_id,
		refreshToken: row.refresh_token,
		accessToken: row.access_token,
		expiresAt: row.expires_at,
		tokenType: row.token_type,
		scope: row.scope,
		idToken: row.id_token,
		sessionState: row.session_state
	};
}

export async function readByProvider(provider: string, providerAccountId: string, q: Knex = db): Promise<Account | null> {
	const row = await q<Row>('accounts').where({ provider, provider_account_id: providerAccountId }).first();
	return row ? toAccount(row) : null;
}

export async function listForUser(userId: number, q: Knex = db): Promise<Account[]> {
	return (await q<Row>('accounts').where({ user_id: userId }).orderBy('id')).map(toAccount);
}

export type NewAccount = Omit<Account, 'id'>;

export async function create(input: NewAccount, q: Knex = db): Promise<Account> {
	const [id] = await q('accounts').insert({
		user_id: input.userId,
		type: input.type,
		provider: input.provider,
		provider_account_id: input.providerAccountId,
		refresh_token: input.refreshToken,
		access_token: input.accessToken,
		expires_at: input.expiresAt,
		token_type: input.tokenType,
		scope: input.scope,
		id_token: input.idToken,
		session_state: input.sessionState
	});
	const row = await q<Row>('accounts').where({ id: Number(id) }).first();
	if (!row) throw new Error(`accounts.create: row ${id} vanished after insert`);
	return toAccount(row);
}

export async function destroyByProvider(provider: string, providerAccountId: string, q: Knex = db): Promise<Account | null> {
	const found = await readByProvider(provider, providerAccountId, q);
	if (found) await q('accounts').where({ id: found.id }).delete();
	return found;
}
