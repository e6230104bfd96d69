import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cieIlluminant } from '../../../src/lib/colour';
import { closeDb } from '../../../src/lib/server/db';
import * as list from '../../../src/routes/api/v1/projects/[projectId]/readings/+server';
import * as one from '../../../src/routes/api/v1/projects/[projectId]/readings/[readingId]/+server';
import * as uploadRoute from '../../../src/routes/api/v1/projects/[projectId]/uploads/+server';
import * as confirmRoute from '../../../src/routes/api/v1/projects/[projectId]/uploads/[uploadId]/confirm/+server';
import * as fileRoute from '../../../src/routes/api/v1/projects/[projectId]/uploads/[uploadId]/file/+server';
import * as analyzeRoute from '../../../src/routes/api/v1/analyze/+server';
import * as tokensRoute from '../../../src/routes/api/v1/tokens/+server';
import * as tokenRoute from '../../../src/routes/api/v1/tokens/[tokenId]/+server';
import { testKnex } from '../helpers/db';
import { makeProject, type Crew } from '../helpers/fixtures';
import { call, multipart } from '../helpers/route';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
let crew: Crew;
const base = () => `/api/v1/projects/${p.projectId}/readings`;
const params = () => ({ projectId: String(p.projectId) });

// CIE 15:2004 Table T.3: D65 x, y = 0.31272, 0.32903; CCT ≈ 6504 K.
const d65 = { kind: 'chromaticity_xy', x: 0.31272, y: 0.32903 } as const;

function wideCsvOfIlluminantA(label = 'Tungsten ref'): string {
	const a = cieIlluminant('A');
	const wl: number[] = [];
	const vals: number[] = [];
	for (let nm = 380; nm <= 780; nm += 5) {
		wl.push(nm);
		vals.push(a.values[Math.round((nm - a.start) / a.interval)]);
	}
	return `label,${wl.join(',')}\n${label},${vals.join(',')}\n`;
}

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Readings API');
	crew = p.crew;
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('POST /api/v1/projects/:id/readings', () => {
	it('stores a typed reading with its computed values (CIE 15:2004 Table T.3: D65 → 6504 K)', async () => {
		const res = await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: 'Window', raw: d65, setupId: p.setupId, lightId: p.lightId } });
		expect(res.status).toBe(201);
		const body = await res.json();
		expect(body.cct_k).toBeGreaterThan(6502);
		expect(body.cct_k).toBeLessThan(6506);
		expect(body.u_prime).toBeCloseTo(0.1978, 4);
		expect(body.raw).toEqual({ ...d65 });
		expect(body.computation_version).toBeTruthy();
		expect(body.version).toBe(1);
	});

	it('refuses bad input with a 400 that names the field', async () => {
		const res = await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: 'Bad', raw: { kind: 'chromaticity_xy', x: 1.4, y: 0.3 } } });
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.error.code).toBe('invalid');
		expect(JSON.stringify(body.error.details)).toContain('raw.x');
	});

	it('says 415 for a body that is not JSON and 400 for broken JSON', async () => {
		const r1 = await call(list.POST, base(), { params: params(), user: crew.gaffer, body: 'x=1', headers: { 'content-type': 'text/plain' } });
		expect(r1.status).toBe(415);
		const r2 = await call(list.POST, base(), { params: params(), user: crew.gaffer, body: '{nope', headers: { 'content-type': 'application/json' } });
		expect(r2.status).toBe(400);
		expect((await r2.json()).error.code).toBe('invalid_json');
	});

	it('refuses a light from another setup', async () => {
		const res = await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: 'X', raw: d65, setupId: p.otherSetupId, lightId: p.lightId } });
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toMatch(/another setup/);
	});

	it('lets only the crew add readings: colorist 403, stranger 404, nobody 401', async () => {
		const json = { label: 'X', raw: d65 };
		expect((await call(list.POST, base(), { params: params(), user: crew.colorist, json })).status).toBe(403);
		expect((await call(list.POST, base(), { params: params(), user: crew.viewer, json })).status).toBe(403);
		expect((await call(list.POST, base(), { params: params(), user: crew.stranger, json })).status).toBe(404);
		expect((await call(list.POST, base(), { params: params(), user: null, json })).status).toBe(401);
		expect((await call(list.POST, base(), { params: params(), user: crew.dp, json })).status).toBe(201);
		expect((await call(list.POST, base(), { params: params(), user: crew.owner, json })).status).toBe(201);
	});
});

describe('GET /api/v1/projects/:id/readings', () => {
	it('pages, filters by setup and sorts', async () => {
		for (let i = 0; i < 5; i++) {
			await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: `Sweep ${i}`, raw: { kind: 'cct_duv', cct_k: 3000 + i * 500, duv: 0 }, setupId: p.otherSetupId } });
		}
		const res = await call(list.GET, base(), { params: params(), user: crew.viewer, query: { setup: p.otherSetupId, sort: 'cct_k', order: 'asc', limit: 2, offset: 1 } });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.total).toBe(5);
		expect(body.items.map((r: { label: string }) => r.label)).toEqual(['Sweep 1', 'Sweep 2']);
		expect(body.items[0].cct_k).toBeCloseTo(3500, 0);
	});

	it('refuses a bad query with 400, and hides the project from strangers', async () => {
		expect((await call(list.GET, base(), { params: params(), user: crew.viewer, query: { limit: 0 } })).status).toBe(400);
		expect((await call(list.GET, base(), { params: params(), user: crew.stranger })).status).toBe(404);
		expect((await call(list.GET, '/api/v1/projects/abc/readings', { params: { projectId: 'abc' }, user: crew.owner })).status).toBe(404);
	});
});

describe('one reading: GET, PATCH (optimistic concurrency), DELETE (soft)', () => {
	it('updates with the current version and reports a conflict with who saved first', async () => {
		const created = await (await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: 'Before', raw: d65 } })).json();
		const path = `${base()}/${created.id}`;
		const prm = { ...params(), readingId: String(created.id) };

		const ok = await call(one.PATCH, path, { params: prm, user: crew.gaffer, method: 'PATCH', json: { version: 1, label: 'After', setupId: p.setupId } });
		expect(ok.status).toBe(200);
		expect((await ok.json()).version).toBe(2);

		const stale = await call(one.PATCH, path, { params: prm, user: crew.dp, method: 'PATCH', json: { version: 1, label: 'Mine' } });
		expect(stale.status).toBe(409);
		const conflict = await stale.json();
		expect(conflict.error.message).toContain('Test gaffer');
		expect(conflict.error.details.current.label).toBe('After');

		const got = await (await call(one.GET, path, { params: prm, user: crew.colorist })).json();
		expect(got.label).toBe('After');
	});

	it('soft-deletes: gone from the API, still in the log', async () => {
		const created = await (await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: 'Doomed', raw: d65 } })).json();
		const prm = { ...params(), readingId: String(created.id) };
		expect((await call(one.DELETE, `${base()}/${created.id}`, { params: prm, user: crew.colorist, method: 'DELETE' })).status).toBe(403);
		expect((await call(one.DELETE, `${base()}/${created.id}`, { params: prm, user: crew.gaffer, method: 'DELETE' })).status).toBe(204);
		expect((await call(one.GET, `${base()}/${created.id}`, { params: prm, user: crew.gaffer })).status).toBe(404);
		const row = await db('readings').where({ id: created.id }).first();
		expect(row.deleted_at).not.toBeNull();
		expect(row.deleted_by).toBe(crew.gaffer.id);
	});

	it('returns the spectrum of a spectral reading', async () => {
		const a = cieIlluminant('A');
		const raw = { kind: 'spectral', spectrum: { start: a.start, interval: a.interval, values: Array.from(a.values), scale: 'relative' } };
		const created = await (await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: 'A', raw } })).json();
		const got = await (await call(one.GET, `${base()}/${created.id}`, { params: { ...params(), readingId: String(created.id) }, user: crew.viewer })).json();
		expect(got.raw.spectrum.values).toHaveLength(a.values.length);
		// CIE 15:2004 Table T.3: illuminant A x, y = 0.44758, 0.40745.
		expect(got.x).toBeCloseTo(0.44758, 4);
		expect(got.y).toBeCloseTo(0.40745, 4);
		expect(got.cri.ra).toBeGreaterThan(99.5);
	});
});

describe('uploads: preview, confirm, original kept', () => {
	const uploads = () => `/api/v1/projects/${p.projectId}/uploads`;

	it('previews with row errors, keeps the file, warns of a repeat, imports all good rows in one go', async () => {
		const csv = 'label,x,y\nHouse tube,0.3805,0.3768\nBroken,1.4,0.3\nStreet,0.5,0.41\n';
		const res = await call(uploadRoute.POST, uploads(), { params: params(), user: crew.gaffer, body: multipart({ file: { name: 'meter.csv', bytes: csv } }) });
		expect(res.status).toBe(201);
		const preview = await res.json();
		expect(preview.totalReadings).toBe(2);
		expect(preview.errors).toHaveLength(1);
		expect(preview.errors[0]).toMatchObject({ row: 2, column: 'x' });
		expect(preview.sameAs).toEqual([]);

		const again = await (await call(uploadRoute.POST, uploads(), { params: params(), user: crew.gaffer, body: multipart({ file: { name: 'meter-copy.csv', bytes: csv } }) })).json();
		expect(again.sameAs.map((u: { id: number }) => u.id)).toEqual([preview.uploadId]);

		const before = await db('readings').where({ project_id: p.projectId }).count({ n: '*' });
		const confirm = await call(confirmRoute.POST, `${uploads()}/${preview.uploadId}/confirm`, {
			params: { ...params(), uploadId: String(preview.uploadId) },
			user: crew.gaffer,
			json: { setupId: p.setupId }
		});
		expect(confirm.status).toBe(200);
		expect((await confirm.json()).imported).toBe(2);
		const after = await db('readings').where({ project_id: p.projectId }).count({ n: '*' });
		expect(Number(after[0].n) - Number(before[0].n)).toBe(2);
		const stored = await db('readings').where({ upload_id: preview.uploadId }).orderBy('source_row');
		expect(stored.map((r) => r.source_row)).toEqual([1, 3]);
		expect(stored.every((r) => r.setup_id === p.setupId)).toBe(true);

		const twice = await call(confirmRoute.POST, `${uploads()}/${preview.uploadId}/confirm`, { params: { ...params(), uploadId: String(preview.uploadId) }, user: crew.gaffer, json: {} });
		expect(twice.status).toBe(409);

		const file = await call(fileRoute.GET, `${uploads()}/${preview.uploadId}/file`, { params: { ...params(), uploadId: String(preview.uploadId) }, user: crew.colorist });
		expect(file.status).toBe(200);
		expect(await file.text()).toBe(csv);
		expect(file.headers.get('x-content-sha256')).toBe(preview.sha256);
	});

	it('imports a spectral file with published chromaticity (CIE 15:2004 Table T.3: A)', async () => {
		const res = await call(uploadRoute.POST, uploads(), { params: params(), user: crew.gaffer, body: multipart({ file: { name: 'spectra.csv', bytes: wideCsvOfIlluminantA() } }) });
		const preview = await res.json();
		expect(preview.format).toBe('wide_spectral');
		expect(preview.readings[0].computed.x).toBeCloseTo(0.44758, 4);
		expect(preview.readings[0].computed.y).toBeCloseTo(0.40745, 4);
	});

	it('refuses unusable files with a sentence and the right status, keeping nothing half-imported', async () => {
		const empty = await call(uploadRoute.POST, uploads(), { params: params(), user: crew.gaffer, body: multipart({ file: { name: 'empty.csv', bytes: '' } }) });
		expect(empty.status).toBe(400);
		expect((await empty.json()).error.message).toMatch(/\w+ \w+/);
		const binary = await call(uploadRoute.POST, uploads(), { params: params(), user: crew.gaffer, body: multipart({ file: { name: 'photo.jpg', bytes: new Uint8Array([0xff, 0xd8, 0xff, 0, 0, 0, 1, 2, 0, 0]) } }) });
		expect(binary.status).toBe(400);
		expect((await binary.json()).error.code).toBe('binary');
		const notForm = await call(uploadRoute.POST, uploads(), { params: params(), user: crew.gaffer, json: { file: 'x' } });
		expect(notForm.status).toBe(415);
		const huge = await call(uploadRoute.POST, uploads(), { params: params(), user: crew.gaffer, body: 'x', headers: { 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(30 * 1024 * 1024) } });
		expect(huge.status).toBe(413);
		expect((await call(uploadRoute.POST, uploads(), { params: params(), user: crew.colorist, body: multipart({ file: { name: 'a.csv', bytes: 'label,x,y\na,0.3,0.3\n' } }) })).status).toBe(403);
	});

	it('keeps a label with markup as plain text', async () => {
		const csv = 'label,x,y\n<script>alert(1)</script>,0.3127,0.329\n';
		const preview = await (await call(uploadRoute.POST, uploads(), { params: params(), user: crew.gaffer, body: multipart({ file: { name: 'x.csv', bytes: csv } }) })).json();
		expect(preview.readings[0].label).toBe('<script>alert(1)</script>');
	});
});

describe('POST /api/v1/analyze (stateless)', () => {
	it('analyses CSV text and JSON readings without storing anything', async () => {
		const before = await db('readings').count({ n: '*' });
		const csv = await call(analyzeRoute.POST, '/api/v1/analyze', { user: crew.viewer, body: 'label,x,y\nD65,0.31272,0.32903\nbad,2,2\n', headers: { 'content-type': 'text/csv' } });
		expect(csv.status).toBe(200);
		const out = await csv.json();
		expect(out.readings[0].cct_k).toBeCloseTo(6504, -1);
		// One bad row with two bad cells: both are reported, both on row 2.
		expect(out.errors.map((e: { row: number; column: string }) => [e.row, e.column])).toEqual([[2, 'x'], [2, 'y']]);
		const js = await call(analyzeRoute.POST, '/api/v1/analyze', { user: crew.viewer, json: { readings: [{ raw: d65 }, { raw: { kind: 'cct_duv', cct_k: 3200, duv: 0 } }, { raw: { kind: 'nope' } }] } });
		const j = await js.json();
		expect(j.readings).toHaveLength(2);
		expect(j.readings[1].cct_k).toBeCloseTo(3200, 0);
		expect(j.errors[0].index).toBe(2);
		const after = await db('readings').count({ n: '*' });
		expect(after[0].n).toBe(before[0].n);
		expect((await call(analyzeRoute.POST, '/api/v1/analyze', { user: null, body: 'x', headers: { 'content-type': 'text/csv' } })).status).toBe(401);
		expect((await call(analyzeRoute.POST, '/api/v1/analyze', { user: crew.viewer, body: '', headers: { 'content-type': 'text/csv' } })).status).toBe(400);
	});
});

describe('personal access tokens', () => {
	it('are made with a session, work as Bearer tokens, and stop working when revoked', async () => {
		const made = await call(tokensRoute.POST, '/api/v1/tokens', { user: crew.gaffer, json: { name: 'meter script' } });
		expect(made.status).toBe(201);
		const { token, id } = await made.json();
		const stored = await db('api_tokens').where({ id }).first();
		expect(stored.token_hash).not.toContain(token);
		expect(stored.token_hash).toHaveLength(64);

		const viaToken = await call(list.GET, base(), { params: params(), headers: { authorization: `Bearer ${token}` } });
		expect(viaToken.status).toBe(200);
		const write = await call(list.POST, base(), { params: params(), headers: { authorization: `Bearer ${token}` }, json: { label: 'From script', raw: d65 } });
		expect(write.status).toBe(201);

		expect((await call(tokensRoute.POST, '/api/v1/tokens', { headers: { authorization: `Bearer ${token}` }, json: { name: 'more' } })).status).toBe(401);
		expect((await call(tokenRoute.DELETE, `/api/v1/tokens/${id}`, { params: { tokenId: String(id) }, user: crew.gaffer, method: 'DELETE' })).status).toBe(204);
		const after = await call(list.GET, base(), { params: params(), headers: { authorization: `Bearer ${token}` } });
		expect(after.status).toBe(401);
		expect((await after.json()).error.code).toBe('invalid_token');
		expect((await call(list.GET, base(), { params: params(), headers: { authorization: 'Bearer cs_nonsense' } })).status).toBe(401);
	});
});

describe('a locked setup is frozen for readings', () => {
	it('refuses new readings, imports and edits on it, with a sentence', async () => {
		const created = await (await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: 'Before the lock', raw: d65, setupId: p.otherSetupId } })).json();
		await db('setups').where({ id: p.otherSetupId }).update({ locked_at: new Date(), locked_by: crew.dp.id });
		try {
			const add = await call(list.POST, base(), { params: params(), user: crew.gaffer, json: { label: 'After', raw: d65, setupId: p.otherSetupId } });
			expect(add.status).toBe(409);
			expect((await add.json()).error.message).toMatch(/lock/i);
			const edit = await call(one.PATCH, `${base()}/${created.id}`, { params: { ...params(), readingId: String(created.id) }, user: crew.gaffer, method: 'PATCH', json: { version: created.version, label: 'Changed' } });
			expect(edit.status).toBe(409);
		} finally {
			await db('setups').where({ id: p.otherSetupId }).update({ locked_at: null, locked_by: null });
		}
	});
});
