/** Helpers for the library suites: an admin, CSV uploads as multipart forms, readings on lights. */
import type { Knex } from 'knex';
import { expect } from 'vitest';
import type { SessionUser } from '../../../src/lib/server/auth/types';
import * as readingsRoute from '../../../src/routes/api/v1/projects/[projectId]/readings/+server';
import { makeUser } from '../helpers/fixtures';
import { call, multipart } from '../helpers/route';

export async function makeAdmin(db: Knex, name = 'Test admin'): Promise<SessionUser> {
	const u = await makeUser(db, name);
	await db('users').where({ id: u.id }).update({ is_admin: true });
	return { ...u, isAdmin: true };
}

let n = 0;
/** A name no other test uses. */
export const uniqueName = (base: string) => `${base} ${Date.now().toString(36)}${(n++).toString(36)}`;

export function gelForm(csv: string, fields: Record<string, string> = {}) {
	return multipart({ name: fields.name ?? uniqueName('Test sheet'), ...fields, file: { name: 'sheet.csv', bytes: csv } });
}

export function fixtureForm(csv: string, fields: Record<string, string> = {}) {
	return multipart({ name: fields.name ?? uniqueName('Test unit'), ...fields, file: { name: 'channels.csv', bytes: csv } });
}

export function spectralRaw(s: { start: number; interval: number; values: Float64Array }) {
	return { kind: 'spectral', spectrum: { start: s.start, interval: s.interval, values: Array.from(s.values), scale: 'relative' } };
}

/** Adds a reading to a light through the readings API, as a gaffer would. */
export async function addReading(projectId: number, setupId: number, user: SessionUser, label: string, raw: unknown, lightId: number | null): Promise<number> {
	const res = await call(readingsRoute.POST, `/api/v1/projects/${projectId}/readings`, { params: { projectId: String(projectId) }, user, json: { label, raw, setupId, lightId } });
	expect(res.status).toBe(201);
	return (await res.json()).id as number;
}
