/**
 * Project settings: renaming a project and editing its notes, on the settings page (superforms) and
 * through the JSON API; field errors refill the form; a save from an old version is refused as a
 * conflict that says who saved first and shows both versions; every change goes into the activity.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '$lib/server/db';
import * as projects from '$lib/server/db/projects';
import { closeMail } from '$lib/server/mail';
import * as settingsPage from '../../../src/routes/projects/[projectId]/settings/+page.server';
import * as apiProject from '../../../src/routes/api/v1/projects/[projectId]/+server';
import { call } from '../helpers/route';
import { fakeEvent, makeCrew, outcome, sessionUser, type Crew } from './helpers';

beforeAll(async () => {
	await db.migrate.latest();
});
afterAll(async () => {
	closeMail();
	await closeDb();
});

type Form = { valid: boolean; data: { name: string; notes: string; version: number }; errors: Record<string, string[] | undefined>; message?: { tone: string; text: string; conflict?: { changedBy: { name: string } | null; version: number; fields: { field: string; yours: string; theirs: string }[] } } };

async function save(crew: Crew, who: keyof Crew['byRole'], form: Record<string, string | number>) {
	const e = fakeEvent({ user: sessionUser(crew.byRole[who]), path: `/projects/${crew.project.id}/settings`, params: { projectId: String(crew.project.id) }, form });
	const r = await outcome(() => settingsPage.actions.default(e as never));
	const data = (r as { data?: { form: Form } }).data;
	return { kind: r.kind, status: 'status' in r ? r.status : 200, form: data?.form as Form };
}

const activityOf = (projectId: number) => db('activity').where({ project_id: projectId, action: 'project.update' }).orderBy('id');

describe('project settings page', () => {
	it('loads the current name, notes and version for the owner', async () => {
		const crew = await makeCrew('Settings load');
		const e = fakeEvent({ user: sessionUser(crew.byRole.owner), path: `/projects/${crew.project.id}/settings`, params: { projectId: String(crew.project.id) } });
		const r = (await outcome(() => settingsPage.load(e as never))) as { kind: string; data: { form: Form } };
		expect(r.kind).toBe('ok');
		expect(r.data.form.data).toEqual({ name: 'Settings load', notes: 'Invented test project.', version: crew.project.version });
		expect(r.data.form.errors).toEqual({});
	});

	it('renames and edits the notes, bumps the version, and logs who changed what', async () => {
		const crew = await makeCrew('Laundromat nights');
		const r = await save(crew, 'dp', { name: '  Laundromat nights (reshoot)  ', notes: 'Invented. Two nights, then a studio day.', version: crew.project.version });
		expect(r.kind).toBe('ok');
		expect(r.form.message).toEqual({ tone: 'good', text: 'Saved.' });
		expect(r.form.data).toEqual({ name: 'Laundromat nights (reshoot)', notes: 'Invented. Two nights, then a studio day.', version: crew.project.version + 1 });
		const stored = await projects.read(crew.project.id);
		expect(stored).toMatchObject({ name: 'Laundromat nights (reshoot)', notes: 'Invented. Two nights, then a studio day.', version: crew.project.version + 1, updatedBy: crew.byRole.dp.id });
		const [entry, ...more] = await activityOf(crew.project.id);
		expect(more).toEqual([]);
		expect(entry).toMatchObject({ user_id: crew.byRole.dp.id, subject_type: 'project', subject_id: crew.project.id, summary: 'Renamed the project “Laundromat nights” to “Laundromat nights (reshoot)” and changed its notes' });
		const details = typeof entry.details === 'string' ? JSON.parse(entry.details) : entry.details;
		expect(details.changes.name).toEqual(['Laundromat nights', 'Laundromat nights (reshoot)']);
		expect(details.changes.notes).toEqual(['Invented test project.', 'Invented. Two nights, then a studio day.']);
	});

	it('refuses an empty name and over-long notes on their fields, and keeps what was typed', async () => {
		const crew = await makeCrew('Field errors');
		const long = 'x'.repeat(5001);
		const r = await save(crew, 'owner', { name: '   ', notes: long, version: crew.project.version });
		expect(r).toMatchObject({ kind: 'fail', status: 400 });
		expect(r.form.valid).toBe(false);
		expect(r.form.errors.name).toEqual(['Give the project a name.']);
		expect(r.form.errors.notes).toEqual(['Keep the notes under 5000 characters.']);
		expect(r.form.data.notes).toBe(long);
		expect(await projects.read(crew.project.id)).toMatchObject({ name: 'Field errors', version: crew.project.version });
		expect(await activityOf(crew.project.id)).toEqual([]);
	});

	it('a save from an old version says who saved first, shows both, keeps yours, and saving again wins', async () => {
		const crew = await makeCrew('Studio day');
		const v = crew.project.version;
		expect((await save(crew, 'owner', { name: 'Studio day (owner)', notes: 'Invented test project.', version: v })).kind).toBe('ok');

		const late = await save(crew, 'dp', { name: 'Studio day (DP)', notes: 'Invented test project.', version: v });
		expect(late).toMatchObject({ kind: 'fail', status: 409 });
		expect(late.form.message?.text).toMatch(/^Crew owner changed this project first/);
		expect(late.form.message?.conflict).toMatchObject({ changedBy: { name: 'Crew owner' }, version: v + 1, fields: [{ field: 'name', yours: 'Studio day (DP)', theirs: 'Studio day (owner)' }] });
		// The form keeps what the DP typed, now over the stored version.
		expect(late.form.data).toEqual({ name: 'Studio day (DP)', notes: 'Invented test project.', version: v + 1 });
		expect((await projects.read(crew.project.id))?.name).toBe('Studio day (owner)');

		const again = await save(crew, 'dp', late.form.data);
		expect(again.kind).toBe('ok');
		expect((await projects.read(crew.project.id))?.name).toBe('Studio day (DP)');
		expect((await activityOf(crew.project.id)).map((a) => a.user_id)).toEqual([crew.byRole.owner.id, crew.byRole.dp.id]);
	});

	it('saving what is already stored changes nothing and logs nothing', async () => {
		const crew = await makeCrew('Unchanged');
		const r = await save(crew, 'owner', { name: 'Unchanged', notes: 'Invented test project.', version: crew.project.version });
		expect(r.kind).toBe('ok');
		expect((await projects.read(crew.project.id))?.version).toBe(crew.project.version);
		expect(await activityOf(crew.project.id)).toEqual([]);
	});
});

describe('PATCH /api/v1/projects/:id', () => {
	const patch = (crew: Crew, who: keyof Crew['byRole'], json: unknown) =>
		call(apiProject.PATCH as never, `/api/v1/projects/${crew.project.id}`, { params: { projectId: String(crew.project.id) }, user: sessionUser(crew.byRole[who]), method: 'PATCH', json });

	it('renames with the version; a stale version is a 409 with who and both versions; bad input a 400', async () => {
		const crew = await makeCrew('API rename');
		const ok = await patch(crew, 'owner', { version: crew.project.version, name: 'API renamed' });
		expect(ok.status).toBe(200);
		expect(await ok.json()).toMatchObject({ id: crew.project.id, name: 'API renamed', notes: 'Invented test project.', version: crew.project.version + 1, role: 'owner', archived: false });

		const stale = await patch(crew, 'dp', { version: crew.project.version, notes: 'Mine' });
		expect(stale.status).toBe(409);
		const { error } = await stale.json();
		expect(error.code).toBe('conflict');
		expect(error.details).toMatchObject({ changedBy: { name: 'Crew owner' }, version: crew.project.version + 1, fields: [{ field: 'notes', yours: 'Mine', theirs: 'Invented test project.' }], current: { name: 'API renamed', version: crew.project.version + 1 } });

		expect((await patch(crew, 'owner', { version: crew.project.version + 1, name: '' })).status).toBe(400);
		expect((await patch(crew, 'owner', { version: crew.project.version + 1, archived: true })).status).toBe(400);
		expect((await projects.read(crew.project.id))?.name).toBe('API renamed');
	});
});
