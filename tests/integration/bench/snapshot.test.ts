import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import * as benchRoute from '../../../src/routes/api/v1/projects/[projectId]/setups/[setupId]/bench/+server';
import * as readingsRoute from '../../../src/routes/api/v1/projects/[projectId]/readings/+server';
import * as acceptRoute from '../../../src/routes/api/v1/projects/[projectId]/lights/[lightId]/fixes/+server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call } from '../helpers/route';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
let tungstenId: number;
const path = () => `/api/v1/projects/${p.projectId}/setups/${p.setupId}/bench`;
const params = (setupId = p.setupId) => ({ projectId: String(p.projectId), setupId: String(setupId) });
const get = (user: (typeof p.crew)[keyof typeof p.crew] | null, headers?: Record<string, string>, setupId?: number) => call(benchRoute.GET, path(), { params: params(setupId), user, headers });

/** A typed reading of a light (CCT + Duv), as a gaffer enters it. */
async function addReading(label: string, cct_k: number, duv: number, lightId: number) {
	const res = await call(readingsRoute.POST, `/api/v1/projects/${p.projectId}/readings`, { params: { projectId: String(p.projectId) }, user: p.crew.gaffer, json: { label, raw: { kind: 'cct_duv', cct_k, duv }, setupId: p.setupId, lightId } });
	expect(res.status).toBe(201);
	return (await res.json()).id as number;
}

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Bench API');
	[tungstenId] = await db('lights').insert({ project_id: p.projectId, setup_id: p.setupId, label: 'Tungsten fresnel', role: 'back', kind: 'tungsten' });
	// Target: CCT 5600 K on the locus (a common daylight-balanced target; common practice).
	await db('setups').where({ id: p.setupId }).update({ target: JSON.stringify({ kind: 'cct_duv', cct_k: 5600, duv: 0 }), target_tolerance: 0.002 });
	await addReading('Tungsten as found', 3200, 0, tungstenId);
	await addReading('Panel as found', 5600, 0.0002, p.lightId);
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('GET /api/v1/projects/:id/setups/:id/bench', () => {
	it('is for members: every role 200, stranger 404, nobody 401, another setup id 404', async () => {
		for (const role of ['owner', 'dp', 'gaffer', 'colorist', 'viewer'] as const) expect((await get(p.crew[role])).status, role).toBe(200);
		expect((await get(p.crew.stranger)).status).toBe(404);
		expect((await get(null)).status).toBe(401);
		expect((await get(p.crew.gaffer, undefined, 999999)).status).toBe(404);
		expect((await call(benchRoute.GET, path(), { params: { projectId: String(p.projectId), setupId: 'abc' }, user: p.crew.gaffer })).status).toBe(404);
	});

	it('gives the target, camera white balance and lights sorted by distance', async () => {
		const res = await get(p.crew.gaffer);
		const s = await res.json();
		expect(res.headers.get('etag')).toBe(`"${s.version}"`);
		// CIE 15:2004: a 5600 K Planckian target has Duv 0; mired = 10⁶ / 5600 ≈ 178.6.
		expect(s.target.CCT).toBeCloseTo(5600, -1);
		expect(s.target.mired).toBeCloseTo(178.6, 0);
		expect(s.target.tolerance).toBe(0.002);
		expect(s.camera.kelvin).toBe(5600);
		expect(s.camera.tint).toBe('none');
		expect(s.lights.map((l: { label: string }) => l.label)).toEqual(['Key panel', 'Tungsten fresnel']);
		const [panel, tungsten] = s.lights;
		expect(panel.lastReading.distance.within).toBe(true);
		expect(tungsten.lastReading.distance.within).toBe(false);
		// 3200 K → 5600 K needs 10⁶/5600 − 10⁶/3200 ≈ −134 mired (cooler, CTB; arithmetic, common practice).
		expect(tungsten.lastReading.distance.mired).toBeCloseTo(-133.9, 0);
		expect(tungsten.hot).toBe(true);
		expect(panel.led).toBe(true);
		expect(tungsten.lastReading).not.toHaveProperty('spectrum');
	});

	it('answers 304 to the current version and changes after a new reading or an accepted fix', async () => {
		const first = await (await get(p.crew.viewer)).json();
		const same = await get(p.crew.viewer, { 'if-none-match': `"${first.version}"` });
		expect(same.status).toBe(304);
		await addReading('Tungsten with a full CTB', 5500, 0.001, tungstenId);
		const after = await get(p.crew.viewer, { 'if-none-match': `"${first.version}"` });
		expect(after.status).toBe(200);
		const second = await after.json();
		expect(second.version).not.toBe(first.version);
		const t = second.lights.find((l: { id: number }) => l.id === tungstenId);
		expect(t.lastReading.label).toBe('Tungsten with a full CTB');
		expect(t.lastReading.distance.duv_prime).toBeLessThan(first.lights.find((l: { id: number }) => l.id === tungstenId).lastReading.distance.duv_prime);

		const acc = await call(acceptRoute.POST, `/api/v1/projects/${p.projectId}/lights/${tungstenId}/fixes`, { params: { projectId: String(p.projectId), lightId: String(tungstenId) }, user: p.crew.gaffer, json: { kind: 'gel', fix: { stack: ['ctb-full'] } } });
		expect(acc.status).toBe(201);
		const third = await (await get(p.crew.viewer)).json();
		expect(third.version).not.toBe(second.version);
		const fixed = third.lights.find((l: { id: number }) => l.id === tungstenId);
		expect(fixed.latestFix.kind).toBe('gel');
		expect(fixed.latestFix.acceptedBy).toBe(p.crew.gaffer.name);
		expect(Date.parse(fixed.latestFix.acceptedAt)).not.toBeNaN();
	});

	it('says when there is no target: no distances, no camera', async () => {
		const res = await get(p.crew.gaffer, undefined, p.otherSetupId);
		expect(res.status).toBe(200);
		const s = await res.json();
		expect(s.target).toBeNull();
		expect(s.camera).toBeNull();
		expect(s.lights).toEqual([]);
	});
});
