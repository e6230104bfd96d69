/** The library API: the public shared library, uploads that are refused with a clear 400 (or 409/413/415), and the details returned. */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import * as sharedLibraryRoute from '../../../src/routes/api/v1/library/+server';
import * as projectGels from '../../../src/routes/api/v1/projects/[projectId]/library/gels/+server';
import * as projectGel from '../../../src/routes/api/v1/projects/[projectId]/library/gels/[gelId]/+server';
import * as projectFixtures from '../../../src/routes/api/v1/projects/[projectId]/library/fixtures/+server';
import * as overrideRoute from '../../../src/routes/api/v1/projects/[projectId]/library/overrides/[gelId]/+server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call, multipart } from '../helpers/route';
import { longCsv, modelledGelCsv, rgbwCsv } from '../../unit/server/library/factories';
import { fixtureForm, gelForm } from './helpers';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
const params = () => ({ projectId: String(p.projectId) });

async function postGel(body: BodyInit, headers?: Record<string, string>) {
	const res = await call(projectGels.POST, '/x', { params: params(), user: p.crew.gaffer, body, headers, method: 'POST' });
	return { status: res.status, body: await res.json() };
}
async function postFixture(body: BodyInit) {
	const res = await call(projectFixtures.POST, '/x', { params: params(), user: p.crew.gaffer, body, method: 'POST' });
	return { status: res.status, body: await res.json() };
}

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Library API');
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('GET /api/v1/library (no sign-in needed)', () => {
	it('lists every built-in filter with its nominal figures, disputed ranges, curve and effects, and the generic fixtures', async () => {
		const res = await call(sharedLibraryRoute.GET, '/api/v1/library', { user: null });
		expect(res.status).toBe(200);
		const lib = await res.json();
		expect(lib.filters).toHaveLength(21); // 5 CTO, 5 CTB, 4 plus green, 4 minus green, 3 ND
		const cto = lib.filters.find((f: { id: string }) => f.id === 'cto-full');
		expect(cto.miredShift).toBe(159); // common practice
		expect(cto.miredRange).toEqual({ min: 144, max: 174 }); // ±15 mired, the spread of quoted figures
		expect(cto.curve.values).toHaveLength(81);
		expect(cto.effects.map((e: { sourceK: number }) => e.sourceK)).toEqual([3200, 5600]);
		const ctb = lib.filters.find((f: { id: string }) => f.id === 'ctb-full');
		expect(ctb.lossRange).toEqual({ min: 1, max: 2 }); // 1–2 stops, disputed
		expect(lib.fixtures.filter((f: { scope: string }) => f.scope === 'generic').map((f: { key: string }) => f.key)).toEqual(['generic-bicolour', 'generic-rgb', 'generic-rgbw', 'generic-seven']);
		expect(lib.heatCaution).toMatch(/burn/);
		// No maker names or numbers: every built-in id is one of ours.
		for (const f of lib.filters) expect(f.id).toMatch(/^(cto|ctb|plusgreen|minusgreen)-(full|threequarter|half|quarter|eighth)$|^nd-0\.[369]$/);
	});
});

describe('bad uploads are refused with a reason', () => {
	it('415 without multipart, 400 without a file, 400 for an empty file', async () => {
		expect((await postGel('wavelength_nm,a\n', { 'content-type': 'text/csv' })).status).toBe(415);
		const noFile = await postGel(multipart({ name: 'No file' }));
		expect(noFile).toMatchObject({ status: 400, body: { error: { code: 'file_missing' } } });
		const empty = await postGel(multipart({ name: 'Empty', file: { name: 'e.csv', bytes: '' } }));
		expect(empty.status).toBe(400);
		expect(empty.body.error.code).toBe('empty');
	});

	it('400 for a file that is not spectral, has two filters, a bad cell, or more than 100 %', async () => {
		const xy = await postGel(gelForm('label,x,y\nSheet,0.31,0.33\n'));
		expect(xy).toMatchObject({ status: 400, body: { error: { code: 'not_spectral' } } });
		expect(xy.body.error.message).toMatch(/wavelength_nm/);
		const two = await postGel(gelForm(longCsv({ A: () => 0.5, B: () => 0.6 })));
		expect(two).toMatchObject({ status: 400, body: { error: { code: 'one_filter_per_file' } } });
		const cell = await postGel(gelForm(longCsv({ A: () => 0.5 }).replace('\n500,0.500000', '\n500,n/a')));
		expect(cell).toMatchObject({ status: 400, body: { error: { code: 'csv_invalid' } } });
		expect(cell.body.error.details[0]).toMatchObject({ row: 25 });
		const over = await postGel(gelForm(longCsv({ A: () => 130 }), { unit: 'percent' }));
		expect(over).toMatchObject({ status: 400, body: { error: { code: 'transmission_invalid' } } });
		const wrongUnit = await postGel(gelForm(modelledGelCsv('cto-half'), { unit: 'fraction' }));
		expect(wrongUnit.body.error.message).toMatch(/percent/);
	});

	it('400 for fields: no name, an unknown unit', async () => {
		const noName = await postGel(gelForm(longCsv({ A: () => 0.5 }), { name: '' }));
		expect(noName.status).toBe(400);
		expect(noName.body.error.code).toBe('invalid');
		expect(noName.body.error.details[0].path).toBe('name');
		expect((await postGel(gelForm(longCsv({ A: () => 0.5 }), { unit: 'furlongs' }))).status).toBe(400);
	});

	it('409 for a second filter of the same name in the project; 404 for another project’s filter', async () => {
		const ok = await postGel(gelForm(longCsv({ A: () => 0.7 }), { name: 'Pale grey' }));
		expect(ok.status).toBe(201);
		expect((await postGel(gelForm(longCsv({ A: () => 0.6 }), { name: 'pale grey' }))).status).toBe(409);
		const other = await makeProject(db, 'Elsewhere');
		const res = await call(projectGel.GET, '/x', { params: { projectId: String(other.projectId), gelId: String(ok.body.id) }, user: other.crew.owner });
		expect(res.status).toBe(404);
	});

	it('409 once a project has 20 custom filters (each joins the stack search)', async () => {
		const q = await makeProject(db, 'Full library');
		const post = (name: string) => call(projectGels.POST, '/x', { params: { projectId: String(q.projectId) }, user: q.crew.owner, body: gelForm(longCsv({ A: () => 0.5 }), { name }), method: 'POST' });
		for (let i = 1; i <= 20; i++) expect((await post(`Sheet ${i}`)).status).toBe(201);
		const full = await post('Sheet 21');
		expect(full.status).toBe(409);
		expect((await full.json()).error.code).toBe('library_full');
	});

	it('fixture profiles: outputs needed (listing the channels), a bad output, a reserved key, a taken key', async () => {
		const needed = await postFixture(fixtureForm(rgbwCsv()));
		expect(needed).toMatchObject({ status: 400, body: { error: { code: 'outputs_needed', details: { channels: ['Red', 'Green', 'Blue', 'White'] } } } });
		const partial = await postFixture(fixtureForm(rgbwCsv(), { output_1: '0.3', output_2: '0.6', output_3: '0.12' }));
		expect(partial.body.error.message).toMatch(/missing: White/);
		const negative = await postFixture(fixtureForm(rgbwCsv(), { outputs: JSON.stringify([0.3, -1, 0.1, 1]) }));
		expect(negative).toMatchObject({ status: 400, body: { error: { code: 'invalid_output' } } });
		expect(negative.body.error.message).toMatch(/^Green: /);
		const brokenJson = await postFixture(fixtureForm(rgbwCsv(), { outputs: '[0.3,' }));
		expect(brokenJson.status).toBe(400);
		const reserved = await postFixture(fixtureForm(rgbwCsv(), { key: 'generic-rgbw', asMeasured: 'true' }));
		expect(reserved.status).toBe(400);
		const first = await postFixture(fixtureForm(rgbwCsv(), { key: 'stage-left', output_1: '0,3', output_2: '0,6', output_3: '0,12', output_4: '1' }));
		expect(first.status).toBe(201);
		expect(first.body.outputBasis).toBe('max_output');
		expect((await postFixture(fixtureForm(rgbwCsv(), { key: 'stage-left', asMeasured: 'true' }))).status).toBe(409);
		// A channel that emits nothing (all zero) cannot be part of a profile.
		const dark = await postFixture(fixtureForm(longCsv({ Lit: () => 1, Dark: () => 0 }), { asMeasured: 'true' }));
		expect(dark).toMatchObject({ status: 400, body: { error: { code: 'csv_invalid' } } });
		expect(dark.body.error.message).toMatch(/Dark/);
	});

	it('overrides: unknown filter 404, no figures 400, a shift a filter cannot have 400, an ND with a mired shift 400', async () => {
		const put = (gelId: string, json: unknown) => call(overrideRoute.PUT, '/x', { params: { ...params(), gelId }, user: p.crew.dp, method: 'PUT', json });
		expect((await put('ctb-huge', { miredShift: -68 })).status).toBe(404);
		const none = await put('ctb-half', {});
		expect(none.status).toBe(400);
		expect((await none.json()).error.details[0].message).toMatch(/mired shift or a light loss/);
		expect((await put('ctb-half', { lossStops: -1 })).status).toBe(400);
		const nd = await put('nd-0.3', { miredShift: 10 });
		expect(nd.status).toBe(400);
		expect((await nd.json()).error.message).toMatch(/neutral density/);
		expect((await put('nd-0.3', { lossStops: 1 })).status).toBe(200);
		// A CTO "shift" from 6500 K of −400 mired has no colour temperature (10⁶/6500 − 400 < 0).
		expect((await put('cto-full', { miredShift: -400 })).status).toBe(400);
		const clear = await call(overrideRoute.DELETE, '/x', { params: { ...params(), gelId: 'ctb-eighth' }, user: p.crew.dp, method: 'DELETE' });
		expect(clear.status).toBe(404);
	});
});
