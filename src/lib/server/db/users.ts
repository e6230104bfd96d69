/**
 * The `users` table: people who can sign in. Addresses are stored normalised (see `normalizeEmail`),
 * so lookups by address are exact.
 */
import type { Knex } from 'knex';
import { db } from './index';

export interface User {
	id: number;
	email: string;
	name: string;
	emailVerified: Date | null;
	image: string | null;
	isAdmin: boolean;
	createdAt: Date;
	updatedAt: Date;
}

/** A user together with the password hash, for the sign-in check only. */
export interface UserWithPassword extends User {
	passwordHash: string | null;
}

interface Row {
	id: number;
	email: string;
	name: string;
	email_verified: Date | null;
	image: string | null;
	password_hash: string | null;
	is_admin: number | boolean;
	created_at: Date;
	updated_at: Date;
}

/** Trimmed, NFKC-normalised and lower-cased: the one form addresses are stored and compared in. */
export function normalizeEmail(email: string): string {
	return email.normalize('NFKC').trim().toLowerCase();
}

function toUser(row: Row): User {
	return {
		id: row.id,
		email: row.email,
		name: row.name,
		emailVerified: row.email_verified,
		image: row.image,
		isAdmin: Boolean(row.is_admin),
		createdAt: row.created_at,
		updatedAt: row.updated_at
	};
}

export async function read(id: number, q: Knex = db): Promise<User | null> {
	const row = await q<Row>('users').where({ id }).first();
	return row ? toUser(row) : null;
}

export async function readByEmail(email: string, q: Knex = db): Promise<User | null> {
	const row = await q<Row>('users').where({ email: normalizeEmail(email) }).first();
	return row ? toUser(row) : null;
}

export async function readWithPassword(email: string, q: Knex = db): Promise<UserWithPassword | null> {
	const row = await q<Row>('users').where({ email: normalizeEmail(email) }).first();
	return row ? { ...toUser(row), passwordHash: row.password_hash } : null;
}

export async function list(ids: readonly number[], q: Knex = db): Promise<User[]> {
	if (ids.length === 0) return [];
	const rows = await q<Row>('users').whereIn('id', ids).orderBy('name').orderBy('id');
	return rows.map(toUser);
}

export interface NewUser {
	email: string;
	name?: string;
	emailVerified?: Date | null;
	image?: string | null;
	passwordHash?: string | null;
	isAdmin?: boolean;
}

export async function create(input: NewUser, q: Knex = db): Promise<User> {
	const [id] = await q('users').insert({
		email: normalizeEmail(input.email),
		name: (input.name ?? '').trim(),
		email_verified: input.emailVerified ?? null,
		image: input.image ?? null,
		password_hash: input.passwordHash ?? null,
		is_admin: input.isAdmin ?? false
	});
	const user = await read(Number(id), q);
	if (!user) throw new Error(`users.create: row ${id} vanished after insert`);
	return user;
}

export interface UserChanges {
	email?: string;
	name?: string;
	emailVerified?: Date | null;
	image?: string | null;
	passwordHash?: string | null;
	isAdmin?: boolean;
}

export async function update(id: number, changes: UserChanges, q: Knex = db): Promise<User | null> {
	const row: Record<string, unknown> = { updated_at: new Date() };
	if (changes.email !== undefined) row.email = normalizeEmail(changes.email);
	if (changes.name !== undefined) row.name = changes.name.trim();
	if (changes.emailVerified !== undefined) row.email_verified = changes.emailVerified;
	if (changes.image !== undefined) row.image = changes.image;
	if (changes.passwordHash !== undefined) row.password_hash = changes.passwordHash;
	if (changes.isAdmin !== undefined) row.is_admin = changes.isAdmin;
	await q('users').where({ id }).update(row);
	return read(id, q);
}

export async function destroy(id: number, q: Knex = db): Promise<boolean> {
	return (await q('users').where({ id }).delete()) > 0;
}
