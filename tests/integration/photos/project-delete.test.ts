/**
 * Deleting a project deletes its photos from object storage too (the local S3 stand-in that
 * `npm test` starts): cleaned originals, thumbnails and uploads that never finished. Another
 * project's photos stay.
 */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import * as storage from '../../../src/lib/server/storage';
import { projectPrefixes } from '../../../src/lib/server/services/photos';
import * as overview from '../../../src/routes/projects/[projectId]/+page.server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { act } from '../log/helpers';
import { photoWithoutGps } from '../../unit/server/photos/images';
import { askUpload, put, uploadPhoto, type Grant } from './helpers';

let db: Knex;
beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

async function storedKeys(projectId: number): Promise<string[]> {
	return (await Promise.all(projectPrefixes(projectId).map((prefix) => storage.list(prefix)))).flat().sort();
}

describe('deleting a project', () => {
	it('removes its originals, thumbnails and unfinished uploads from storage, and nothing of another project', async () => {
		const p = await makeProject(db, 'Doomed');
		const other = await makeProject(db, 'Survivor');
		const bytes = await photoWithoutGps();
		const onSetup = await uploadPhoto(p.projectId, p.crew.gaffer, bytes, { setupId: p.setupId });
		const onLight = await uploadPhoto(p.projectId, p.crew.dp, await photoWithoutGps('png'), { filename: 'plot.png', type: 'image/png', lightId: p.lightId });
		// Sent to storage but never finished: only the incoming object exists.
		const grant = (await (await askUpload(p.projectId, p.crew.gaffer, { filename: 'half.jpg', type: 'image/jpeg', size: bytes.byteLength, setupId: p.setupId })).json()) as Grant;
		expect((await put(grant, bytes)).status).toBe(200);
		const kept = await uploadPhoto(other.projectId, other.crew.gaffer, bytes, { setupId: other.setupId });

		const rows = await db('photos').where({ project_id: p.projectId }).select('incoming_key', 'original_key', 'thumbnail_key');
		const keys = rows.flatMap((r) => [r.original_key, r.thumbnail_key]).filter(Boolean) as string[];
		expect(keys).toHaveLength(4);
		const incoming = rows.find((r) => r.original_key === null)!.incoming_key as string;
		for (const k of [...keys, incoming]) expect(await storage.head(k), k).not.toBeNull();
		expect(await storedKeys(p.projectId)).toEqual([...keys, incoming].sort());
		expect(onSetup.status).toBe('ready');
		expect(onLight.status).toBe('ready');

		const name = (await db('projects').where({ id: p.projectId }).first()).name as string;
		const res = await act(overview.actions as never, 'delete', `/projects/${p.projectId}`, { params: { projectId: String(p.projectId) }, user: p.crew.owner, form: { confirmName: name } });
		expect(res).toMatchObject({ status: 303, location: '/projects' });

		expect(await db('projects').where({ id: p.projectId }).first()).toBeUndefined();
		expect(await db('photos').where({ project_id: p.projectId })).toEqual([]);
		for (const k of [...keys, incoming]) expect(await storage.head(k), k).toBeNull();
		expect(await storedKeys(p.projectId)).toEqual([]);

		const survivor = await db('photos').where({ id: kept.id }).first();
		expect(await storage.head(survivor.original_key)).not.toBeNull();
		expect(await storage.head(survivor.thumbnail_key)).not.toBeNull();
	});

	it('a refused delete (wrong name) leaves the photos where they are', async () => {
		const p = await makeProject(db, 'Kept');
		const photo = await uploadPhoto(p.projectId, p.crew.gaffer, await photoWithoutGps(), { setupId: p.setupId });
		const res = await act(overview.actions as never, 'delete', `/projects/${p.projectId}`, { params: { projectId: String(p.projectId) }, user: p.crew.owner, form: { confirmName: 'not its name' } });
		expect(res.status).toBe(400);
		const row = await db('photos').where({ id: photo.id }).first();
		expect(await storage.head(row.original_key)).not.toBeNull();
	});
});
