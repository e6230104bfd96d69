/** Photos in the project's activity: who added or deleted which photo of which setup or light, and when. */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import * as activityPage from '../../../src/routes/projects/[projectId]/activity/+page.server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call } from '../helpers/route';
import { load } from '../log/helpers';
import { photoWithoutGps } from '../../unit/server/photos/images';
import { askUpload, finish, routes, uploadPhoto, type Grant } from './helpers';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Photo activity');
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

const photoEntries = async () => db('activity').where({ project_id: p.projectId, subject_type: 'photo' }).orderBy('id');
const del = (photoId: number, user = p.crew.dp) => call(routes.one.DELETE, '/x', { params: { projectId: String(p.projectId), photoId: String(photoId) }, user, method: 'DELETE' });

describe('photo activity', () => {
	it('an upload of a light’s photo is logged once, with who, when, the light and its setup', async () => {
		const before = new Date(Date.now() - 1000);
		const photo = await uploadPhoto(p.projectId, p.crew.gaffer, await photoWithoutGps(), { filename: 'key side.jpg', lightId: p.lightId, caption: 'Key from the door' });
		expect((await finish(p.projectId, p.crew.gaffer, photo.id)).status).toBe(200); // finishing again logs nothing more
		const entries = await photoEntries();
		expect(entries).toHaveLength(1);
		const e = entries[0];
		expect(e).toMatchObject({ user_id: p.crew.gaffer.id, action: 'photo.add', subject_id: photo.id, summary: 'Added photo “key side.jpg” of light “Key panel” in setup “Wide”: Key from the door' });
		expect(new Date(e.created_at).getTime()).toBeGreaterThanOrEqual(before.getTime());
		const details = typeof e.details === 'string' ? JSON.parse(e.details) : e.details;
		expect(details).toMatchObject({ setupId: p.setupId, lightId: p.lightId });
	});

	it('a setup’s photo, then its deletion by someone else, are both logged; a refused or unfinished upload is not', async () => {
		const photo = await uploadPhoto(p.projectId, p.crew.owner, await photoWithoutGps('png'), { filename: 'plot.png', type: 'image/png', setupId: p.otherSetupId });
		expect((await del(photo.id)).status).toBe(204);

		// Asked for and dropped without ever finishing (the uploader cancelled).
		const grant = (await (await askUpload(p.projectId, p.crew.gaffer, { filename: 'never.jpg', type: 'image/jpeg', size: 1000, setupId: p.setupId })).json()) as Grant;
		expect((await del(grant.photo.id, p.crew.gaffer)).status).toBe(204);

		const entries = (await photoEntries()).filter((e) => e.subject_id !== null && e.subject_id >= photo.id);
		expect(entries.map((e) => [e.action, e.user_id, e.summary])).toEqual([
			['photo.add', p.crew.owner.id, 'Added photo “plot.png” of setup “Close”'],
			['photo.delete', p.crew.dp.id, 'Deleted photo “plot.png” of setup “Close”']
		]);
	});

	it('the activity page filters photos and links each to the photos of its light or setup', async () => {
		const r = await load(activityPage.load as never, `/projects/${p.projectId}/activity?type=photo`, { params: { projectId: String(p.projectId) }, user: p.crew.viewer });
		expect(r.status).toBe(200);
		const entries = r.data.entries as { subjectType: string; who: string; summary: string; photoOf: { setupId: number | null; lightId: number | null } }[];
		expect(entries.length).toBeGreaterThanOrEqual(3);
		expect(entries.every((e) => e.subjectType === 'photo')).toBe(true);
		const added = entries.find((e) => e.summary.startsWith('Added photo “key side.jpg”'))!;
		expect(added).toMatchObject({ who: 'Test gaffer', photoOf: { setupId: p.setupId, lightId: p.lightId } });
		expect(entries.find((e) => e.summary.startsWith('Deleted'))).toMatchObject({ who: 'Test dp', photoOf: { setupId: p.otherSetupId, lightId: null } });
	});
});
