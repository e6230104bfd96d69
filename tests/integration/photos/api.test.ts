import exifr from 'exifr';
import type { Knex } from 'knex';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import { MAX_PHOTO_BYTES, GET_URL_SECONDS, HEIC_REFUSED, PUT_URL_SECONDS, sweepStalePhotos, STALE_PENDING_MS } from '../../../src/lib/server/services/photos';
import * as storage from '../../../src/lib/server/storage';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call } from '../helpers/route';
import { TEST_GPS_DECIMAL, notAnImage, photoWithGps, photoWithoutGps } from '../../unit/server/photos/images';
import { askUpload, base, finish, put, routes, uploadPhoto, type Grant } from './helpers';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
const prm = (photoId?: number) => ({ projectId: String(p.projectId), ...(photoId ? { photoId: String(photoId) } : {}) });

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Photos API');
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('upload: presign → PUT straight to storage → complete', () => {
	it('stores a cleaned original and a WebP thumbnail, with GPS gone and the incoming object deleted', async () => {
		const input = await photoWithGps('jpeg', 1200, 900);
		expect(await exifr.gps(input)).toEqual(TEST_GPS_DECIMAL);

		const res = await askUpload(p.projectId, p.crew.gaffer, { filename: 'wide key.jpg', type: 'image/jpeg', size: input.byteLength, setupId: p.setupId, caption: 'Key through the window' });
		expect(res.status).toBe(201);
		const grant = (await res.json()) as Grant;
		expect(grant.photo.status).toBe('pending');
		expect(grant.upload.method).toBe('PUT');
		expect(grant.upload.headers).toEqual({ 'content-type': 'image/jpeg' });
		const url = new URL(grant.upload.url);
		expect(url.origin).toBe(process.env.S3_ENDPOINT);
		expect(url.searchParams.get('X-Amz-Expires')).toBe(String(PUT_URL_SECONDS));
		expect(url.searchParams.get('X-Amz-SignedHeaders')).toContain('content-type');
		expect(new Date(grant.upload.expires_at).getTime()).toBeGreaterThan(Date.now());

		const row0 = await db('photos').where({ id: grant.photo.id }).first();
		expect(row0.status).toBe('pending');
		expect(row0.incoming_key).toMatch(new RegExp(`^incoming/${p.projectId}/${grant.photo.id}-`));

		expect((await put(grant, input)).status).toBe(200);
		expect(await storage.head(row0.incoming_key)).not.toBeNull();

		const done = await finish(p.projectId, p.crew.gaffer, grant.photo.id);
		expect(done.status).toBe(200);
		const photo = await done.json();
		expect(photo).toMatchObject({ status: 'ready', setup_id: p.setupId, light_id: null, caption: 'Key through the window', content_type: 'image/jpeg', width: 1200, height: 900, thumbnail_width: 480, thumbnail_height: 360, had_location: true });
		expect(photo.uploaded_by).toEqual({ id: p.crew.gaffer.id, name: p.crew.gaffer.name });
		expect(photo.thumbnail_url).toBe(`${base(p.projectId)}/${photo.id}/thumbnail`);

		const row = await db('photos').where({ id: photo.id }).first();
		expect(row.original_key).toBe(`projects/${p.projectId}/photos/${photo.id}/original.jpg`);
		expect(await storage.head(row.incoming_key)).toBeNull();

		const thumb = await storage.head(row.thumbnail_key);
		expect(thumb?.contentType).toBe('image/webp');
		const thumbBytes = (await storage.read(row.thumbnail_key, MAX_PHOTO_BYTES)) as Uint8Array;
		expect((await sharp(thumbBytes).metadata()).width).toBe(480);

		const stored = Buffer.from((await storage.read(row.original_key, MAX_PHOTO_BYTES)) as Uint8Array);
		expect(stored.byteLength).toBe(row.bytes);
		expect(await exifr.gps(stored)).toBeUndefined();
		expect((await sharp(stored).metadata()).exif).toBeUndefined();
	});

	it('finishing twice returns the same ready photo', async () => {
		const bytes = await photoWithoutGps('png');
		const first = await uploadPhoto(p.projectId, p.crew.gaffer, bytes, { filename: 'plot.png', type: 'image/png', setupId: p.setupId });
		expect(first.had_location).toBe(false);
		expect(first.content_type).toBe('image/png');
		const again = await finish(p.projectId, p.crew.gaffer, first.id);
		expect(again.status).toBe(200);
		expect((await again.json()).completed_at).toBe(first.completed_at);
	});

	it('judges by the bytes, not the declared type: a PNG declared as JPEG is stored as PNG', async () => {
		const photo = await uploadPhoto(p.projectId, p.crew.dp, await photoWithoutGps('png'), { filename: 'odd.jpg', type: 'image/jpeg', setupId: p.setupId });
		expect(photo.content_type).toBe('image/png');
	});

	it('a photo of a light records the light and its setup', async () => {
		const photo = await uploadPhoto(p.projectId, p.crew.gaffer, await photoWithoutGps(), { lightId: p.lightId });
		expect(photo).toMatchObject({ setup_id: p.setupId, light_id: p.lightId });
	});

	it('rejects a non-image named .jpg with a sentence, keeps the reason, and removes what arrived', async () => {
		const text = notAnImage();
		const res = await askUpload(p.projectId, p.crew.gaffer, { filename: 'lighting plan.jpg', type: 'image/jpeg', size: text.byteLength, setupId: p.setupId });
		expect(res.status).toBe(201);
		const grant = (await res.json()) as Grant;
		expect((await put(grant, text)).status).toBe(200);
		const done = await finish(p.projectId, p.crew.gaffer, grant.photo.id);
		expect(done.status).toBe(422);
		const body = await done.json();
		expect(body.error.code).toBe('not_an_image');
		expect(body.error.message).toMatch(/^That file is not a photo we can read: .+\. Export it as JPEG and upload it again\.$/);

		const row = await db('photos').where({ id: grant.photo.id }).first();
		expect(row.status).toBe('rejected');
		expect(row.reject_reason).toBe(body.error.message);
		expect(row.original_key).toBeNull();
		expect(await storage.head(row.incoming_key)).toBeNull();
		// Asking again repeats the reason.
		const again = await finish(p.projectId, p.crew.gaffer, grant.photo.id);
		expect(again.status).toBe(422);
		expect((await again.json()).error.message).toBe(body.error.message);
		// Not listed with the ready photos; listed when asked for.
		const ready = await (await call(routes.list.GET, base(p.projectId), { params: prm(), user: p.crew.viewer })).json();
		expect(ready.items.map((x: { id: number }) => x.id)).not.toContain(grant.photo.id);
		const rejected = await (await call(routes.list.GET, base(p.projectId), { params: prm(), user: p.crew.viewer, query: { status: 'rejected' } })).json();
		expect(rejected.items.map((x: { id: number }) => x.id)).toContain(grant.photo.id);
	});

	it('refuses more than 15 MB before granting an upload (413), with the size in the sentence', async () => {
		const res = await askUpload(p.projectId, p.crew.gaffer, { filename: 'pano.jpg', type: 'image/jpeg', size: MAX_PHOTO_BYTES + 1, setupId: p.setupId });
		expect(res.status).toBe(413);
		const body = await res.json();
		expect(body.error.code).toBe('too_large');
		expect(body.error.message).toContain('up to 15 MB');
	});

	it('rejects at completion a file bigger than it was declared when storage let it through (413)', async () => {
		const res = await askUpload(p.projectId, p.crew.gaffer, { filename: 'small.jpg', type: 'image/jpeg', size: 1000, setupId: p.setupId });
		const grant = (await res.json()) as Grant;
		// The local stand-in does not enforce the signed length (a strict service refuses this PUT), so
		// the check at completion is what stops it here.
		const sent = await put(grant, new Uint8Array(MAX_PHOTO_BYTES + 1));
		expect(sent.status).toBe(200);
		const done = await finish(p.projectId, p.crew.gaffer, grant.photo.id);
		expect(done.status).toBe(413);
		expect((await done.json()).error.code).toBe('too_large');
		expect((await db('photos').where({ id: grant.photo.id }).first()).status).toBe('rejected');
	});

	it('refuses types that are not photos (415) and HEIC with the export-JPEG sentence (415)', async () => {
		const gif = await askUpload(p.projectId, p.crew.gaffer, { filename: 'spin.gif', type: 'image/gif', size: 100, setupId: p.setupId });
		expect(gif.status).toBe(415);
		expect((await gif.json()).error.message).toMatch(/Photos can be JPEG, PNG or WebP/);
		const heic = await askUpload(p.projectId, p.crew.gaffer, { filename: 'IMG_0001.HEIC', type: 'image/heic', size: 100, setupId: p.setupId });
		expect(heic.status).toBe(415);
		expect((await heic.json()).error.message).toBe(HEIC_REFUSED);
		const pdf = await askUpload(p.projectId, p.crew.gaffer, { filename: 'plan.pdf', type: 'application/pdf', size: 100, setupId: p.setupId });
		expect(pdf.status).toBe(415);
		const notJson = await call(routes.list.POST, base(p.projectId), { params: prm(), user: p.crew.gaffer, body: 'x', headers: { 'content-type': 'image/jpeg' } });
		expect(notJson.status).toBe(415);
	});

	it('needs a setup or light of this project; a light must sit in the setup named with it', async () => {
		const none = await askUpload(p.projectId, p.crew.gaffer, { filename: 'a.jpg', type: 'image/jpeg', size: 100 });
		expect(none.status).toBe(400);
		expect((await none.json()).error.message).toBe('Choose the setup or the light this photo belongs to.');
		const wrong = await askUpload(p.projectId, p.crew.gaffer, { filename: 'a.jpg', type: 'image/jpeg', size: 100, setupId: p.otherSetupId, lightId: p.lightId });
		expect(wrong.status).toBe(400);
		expect((await wrong.json()).error.message).toMatch(/another setup/);
		const other = await makeProject(db, 'Other photos');
		const foreign = await askUpload(p.projectId, p.crew.gaffer, { filename: 'a.jpg', type: 'image/jpeg', size: 100, setupId: other.setupId });
		expect(foreign.status).toBe(400);
		const bad = await askUpload(p.projectId, p.crew.gaffer, { filename: '', type: 'image/jpeg', size: -1, setupId: p.setupId });
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.code).toBe('invalid');
	});

	it('says 409 when asked to finish before the file arrived, and leaves the photo pending', async () => {
		const grant = (await (await askUpload(p.projectId, p.crew.gaffer, { filename: 'a.jpg', type: 'image/jpeg', size: 100, setupId: p.setupId })).json()) as Grant;
		const done = await finish(p.projectId, p.crew.gaffer, grant.photo.id);
		expect(done.status).toBe(409);
		expect((await done.json()).error.code).toBe('not_uploaded');
		expect((await db('photos').where({ id: grant.photo.id }).first()).status).toBe('pending');
	});
});

describe('reading photos: permission first, then a short-lived presigned GET', () => {
	let photoId: number;
	beforeAll(async () => {
		photoId = (await uploadPhoto(p.projectId, p.crew.gaffer, await photoWithGps('jpeg', 800, 600), { setupId: p.otherSetupId, caption: 'Close-up reference' })).id;
	});

	it('redirects (303) a member to a presigned URL that lasts a minute and serves the image', async () => {
		for (const [which, type] of [['thumbnail', 'image/webp'], ['original', 'image/jpeg']] as const) {
			const res = await call(routes[which].GET, `${base(p.projectId)}/${photoId}/${which}`, { params: prm(photoId), user: p.crew.viewer });
			expect(res.status, which).toBe(303);
			expect(res.headers.get('cache-control')).toBe(`private, max-age=${GET_URL_SECONDS / 2}`);
			const location = new URL(res.headers.get('location') as string);
			expect(location.origin).toBe(process.env.S3_ENDPOINT);
			expect(location.searchParams.get('X-Amz-Expires')).toBe('60');
			expect(location.searchParams.get('X-Amz-Signature')).toMatch(/^[0-9a-f]{64}$/);
			const img = await fetch(location);
			expect(img.status, which).toBe(200);
			expect(img.headers.get('content-type'), which).toBe(type);
			const bytes = Buffer.from(await img.arrayBuffer());
			const meta = await sharp(bytes).metadata();
			expect(meta.format, which).toBe(which === 'thumbnail' ? 'webp' : 'jpeg');
			expect(meta.exif, which).toBeUndefined();
		}
	});

	it('gives no URL to a stranger (404) or to nobody (401)', async () => {
		for (const which of ['thumbnail', 'original'] as const) {
			const stranger = await call(routes[which].GET, `${base(p.projectId)}/${photoId}/${which}`, { params: prm(photoId), user: p.crew.stranger });
			expect(stranger.status).toBe(404);
			expect(stranger.headers.get('location')).toBeNull();
			expect(JSON.stringify(await stranger.json())).not.toContain('X-Amz');
			const nobody = await call(routes[which].GET, `${base(p.projectId)}/${photoId}/${which}`, { params: prm(photoId), user: null });
			expect(nobody.status).toBe(401);
			expect(nobody.headers.get('location')).toBeNull();
		}
	});

	it('does not serve a photo of one project through another project the user is on', async () => {
		const other = await makeProject(db, 'Elsewhere');
		await db('project_members').insert({ project_id: other.projectId, user_id: p.crew.gaffer.id, role: 'gaffer' });
		const res = await call(routes.original.GET, `/api/v1/projects/${other.projectId}/photos/${photoId}/original`, { params: { projectId: String(other.projectId), photoId: String(photoId) }, user: p.crew.gaffer });
		expect(res.status).toBe(404);
	});

	it('says 404 for a photo that is not ready yet', async () => {
		const grant = (await (await askUpload(p.projectId, p.crew.gaffer, { filename: 'a.jpg', type: 'image/jpeg', size: 100, setupId: p.setupId })).json()) as Grant;
		const res = await call(routes.thumbnail.GET, '/x', { params: prm(grant.photo.id), user: p.crew.gaffer });
		expect(res.status).toBe(404);
		expect((await res.json()).error.code).toBe('not_ready');
	});

	it('presigned links stop working once they expire', async () => {
		// (The local stand-in checks expiry but neither signatures nor bucket privacy; a real service does.)
		const row = await db('photos').where({ id: photoId }).first();
		const short = await storage.presignGet(row.thumbnail_key, { expiresIn: 1 });
		expect((await fetch(short)).status).toBe(200);
		await new Promise((r) => setTimeout(r, 2100));
		expect((await fetch(short)).status).toBe(403);
	});
});

describe('list, caption, delete, sweep', () => {
	it('filters by setup (including its lights) and by light, newest first', async () => {
		const q = await makeProject(db, 'Filters');
		const a = await uploadPhoto(q.projectId, q.crew.gaffer, await photoWithoutGps(), { setupId: q.setupId, caption: 'A' });
		const b = await uploadPhoto(q.projectId, q.crew.gaffer, await photoWithoutGps(), { lightId: q.lightId, caption: 'B' });
		const c = await uploadPhoto(q.projectId, q.crew.gaffer, await photoWithoutGps(), { setupId: q.otherSetupId, caption: 'C' });
		const get = async (query: Record<string, string | number>) => (await call(routes.list.GET, base(q.projectId), { params: { projectId: String(q.projectId) }, user: q.crew.colorist, query })).json();
		expect((await get({})).items.map((x: { id: number }) => x.id)).toEqual([c.id, b.id, a.id]);
		expect((await get({ setup: q.setupId })).items.map((x: { id: number }) => x.id)).toEqual([b.id, a.id]);
		expect((await get({ light: q.lightId })).items.map((x: { id: number }) => x.id)).toEqual([b.id]);
		expect((await get({ setup: q.otherSetupId })).total).toBe(1);
		expect((await get({ limit: 1, offset: 1 })).items.map((x: { id: number }) => x.id)).toEqual([b.id]);
		const bad = await call(routes.list.GET, base(q.projectId), { params: { projectId: String(q.projectId) }, user: q.crew.viewer, query: { status: 'lost' } });
		expect(bad.status).toBe(400);
	});

	it('edits a caption and deletes a photo with its objects', async () => {
		const photo = await uploadPhoto(p.projectId, p.crew.gaffer, await photoWithoutGps(), { setupId: p.setupId });
		const path = `${base(p.projectId)}/${photo.id}`;
		const patched = await call(routes.one.PATCH, path, { params: prm(photo.id), user: p.crew.owner, method: 'PATCH', json: { caption: 'Haze at 20 %' } });
		expect(patched.status).toBe(200);
		expect((await patched.json()).caption).toBe('Haze at 20 %');
		const long = await call(routes.one.PATCH, path, { params: prm(photo.id), user: p.crew.owner, method: 'PATCH', json: { caption: 'x'.repeat(501) } });
		expect(long.status).toBe(400);

		const row = await db('photos').where({ id: photo.id }).first();
		const gone = await call(routes.one.DELETE, path, { params: prm(photo.id), user: p.crew.gaffer, method: 'DELETE' });
		expect(gone.status).toBe(204);
		expect(await db('photos').where({ id: photo.id }).first()).toBeUndefined();
		expect(await storage.head(row.original_key)).toBeNull();
		expect(await storage.head(row.thumbnail_key)).toBeNull();
		expect((await call(routes.one.GET, path, { params: prm(photo.id), user: p.crew.gaffer })).status).toBe(404);
		expect((await call(routes.one.DELETE, path, { params: prm(photo.id), user: p.crew.gaffer, method: 'DELETE' })).status).toBe(404);
	});

	it('sweeps pending photos abandoned for a day, with their incoming objects', async () => {
		const grant = (await (await askUpload(p.projectId, p.crew.gaffer, { filename: 'a.jpg', type: 'image/jpeg', size: 100, setupId: p.setupId })).json()) as Grant;
		await put(grant, await photoWithoutGps());
		const fresh = (await (await askUpload(p.projectId, p.crew.gaffer, { filename: 'b.jpg', type: 'image/jpeg', size: 100, setupId: p.setupId })).json()) as Grant;
		const row = await db('photos').where({ id: grant.photo.id }).first();
		await db('photos').where({ id: grant.photo.id }).update({ created_at: new Date(Date.now() - STALE_PENDING_MS - 60_000) });
		expect(await sweepStalePhotos()).toBeGreaterThanOrEqual(1);
		expect(await db('photos').where({ id: grant.photo.id }).first()).toBeUndefined();
		expect(await storage.head(row.incoming_key)).toBeNull();
		expect(await db('photos').where({ id: fresh.photo.id }).first()).toBeDefined();
	});
});
