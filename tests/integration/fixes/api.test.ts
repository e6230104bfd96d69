import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cieIlluminant, planckianSpectrum } from '../../../src/lib/colour';
import { closeDb } from '../../../src/lib/server/db';
import * as log from '../../../src/lib/server/services/log';
import * as fixesRoute from '../../../src/routes/api/v1/projects/[projectId]/fixes/+server';
import * as readingsRoute from '../../../src/routes/api/v1/projects/[projectId]/readings/+server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call } from '../helpers/route';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
let tungstenId: number;
let panelId: number;
const path = () => `/api/v1/projects/${p.projectId}/fixes`;
const params = () => ({ projectId: String(p.projectId) });

function spectral(s: { start: number; interval: number; values: Float64Array }) {
	return { kind: 'spectral', spectrum: { start: s.start, interval: s.interval, values: Array.from(s.values), scale: 'relative' } };
}

async function addReading(label: string, raw: unknown, lightId: number | null) {
	const res = await call(readingsRoute.POST, `/api/v1/projects/${p.projectId}/readings`, { params: params(), user: p.crew.gaffer, json: { label, raw, setupId: p.setupId, lightId } });
	expect(res.status).toBe(201);
	return (await res.json()).id as number;
}

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Fixes API');
	[tungstenId] = await db('lights').insert({ project_id: p.projectId, setup_id: p.setupId, label: 'Tungsten fresnel', role: 'back', kind: 'tungsten' });
	panelId = p.lightId; // an RGBW panel (kind led-rgbw)
	// The house light: CIE F2 (cool white fluorescent), measured as a spectrum.
	const houseId = await addReading('House tubes', spectral(cieIlluminant('F2')), null);
	await db('setups').where({ id: p.setupId }).update({ target: JSON.stringify({ kind: 'reading', readingId: houseId }), target_tolerance: 0.002 });
	await addReading('Tungsten at full', spectral(planckianSpectrum(3200, 380, 780, 5)), tungstenId);
	await addReading('Panel as found', { kind: 'cct_duv', cct_k: 5600, duv: 0 }, panelId);
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('POST /api/v1/projects/:id/fixes', () => {
	it('proposes gel stacks that bring a 3200 K tungsten unit to fluorescent house light (CIE F2), predicted spectrally', async () => {
		const res = await call(fixesRoute.POST, path(), { params: params(), user: p.crew.gaffer, json: { lightId: tungstenId, kind: 'gel' } });
		expect(res.status).toBe(200);
		const { result } = await res.json();
		expect(result.estimate).toBe(false);
		// CIE 15:2004 Table T.8: F2 CCT 4230 K, above the locus (greenish): the fix needs blue and green.
		expect(result.target.CCT).toBeGreaterThan(4150);
		expect(result.target.CCT).toBeLessThan(4300);
		const best = result.proposals[0];
		expect(best.residual).toBeLessThan(result.before.duv_prime);
		expect(best.label).toMatch(/CTB/);
		expect(best.label).toMatch(/green/i);
		expect(best.lossStops).toBeGreaterThan(0);
		expect(result.cautions.join(' ')).toMatch(/burn|heat|hot/i);
		// Ranked by residual distance first.
		const residuals = result.proposals.map((x: { residual: number }) => x.residual);
		expect(residuals[0]).toBeLessThanOrEqual(residuals.at(-1));
	});

	it('proposes RGBW levels that meet the fluorescent target exactly (Δu′v′ ≤ 1e-4), with DMX values', async () => {
		const res = await call(fixesRoute.POST, path(), { params: params(), user: p.crew.dp, json: { lightId: panelId, kind: 'led' } });
		expect(res.status).toBe(200);
		const { result } = await res.json();
		expect(result.fixture.id).toBe('generic-rgbw');
		expect(result.inGamut).toBe(true);
		expect(result.distance.duv_prime).toBeLessThanOrEqual(1e-4);
		expect(result.channels).toHaveLength(4);
		for (const c of result.channels) {
			expect(c.dmx8).toBe(Math.round(c.level * 255));
			expect(c.level).toBeGreaterThanOrEqual(0);
			expect(c.level).toBeLessThanOrEqual(1);
		}
		expect(Math.max(...result.channels.map((c: { level: number }) => c.level))).toBeCloseTo(1, 6);
	});

	it('says what is missing: no reading, no target, no fixture', async () => {
		const [bare] = await db('lights').insert({ project_id: p.projectId, setup_id: p.setupId, label: 'Unmeasured', role: 'fill', kind: 'tungsten' });
		const noReading = await call(fixesRoute.POST, path(), { params: params(), user: p.crew.gaffer, json: { lightId: bare, kind: 'gel' } });
		expect(noReading.status).toBe(409);
		expect((await noReading.json()).error.code).toBe('no_reading');
		const [other] = await db('lights').insert({ project_id: p.projectId, setup_id: p.otherSetupId, label: 'Elsewhere', role: 'fill', kind: 'tungsten' });
		await addReading('Elsewhere', { kind: 'cct_duv', cct_k: 3200, duv: 0 }, null).then((id) => db('readings').where({ id }).update({ light_id: other, setup_id: p.otherSetupId }));
		const noTarget = await call(fixesRoute.POST, path(), { params: params(), user: p.crew.gaffer, json: { lightId: other, kind: 'gel' } });
		expect(noTarget.status).toBe(409);
		expect((await noTarget.json()).error.code).toBe('no_target');
		const noFixture = await call(fixesRoute.POST, path(), { params: params(), user: p.crew.gaffer, json: { lightId: tungstenId, kind: 'led' } });
		expect(noFixture.status).toBe(400);
	});

	it('agrees with the lighting log about the target: same chromaticity, and a removed target reading is missing for both', async () => {
		const setup = await db('setups').where({ id: p.setupId }).first();
		const stored = typeof setup.target === 'string' ? JSON.parse(setup.target) : setup.target;
		const shown = await log.resolveTarget(p.projectId, stored, 0.002);
		const res = await call(fixesRoute.POST, path(), { params: params(), user: p.crew.gaffer, json: { lightId: tungstenId, kind: 'gel' } });
		const { result } = await res.json();
		expect(shown?.label).toBe('reading “House tubes”');
		expect(result.target.x).toBeCloseTo(shown!.x, 10);
		expect(result.target.y).toBeCloseTo(shown!.y, 10);

		await db('readings').where({ id: stored.readingId }).update({ deleted_at: new Date() });
		try {
			expect(await log.resolveTarget(p.projectId, stored, 0.002)).toBeNull();
			const gone = await call(fixesRoute.POST, path(), { params: params(), user: p.crew.gaffer, json: { lightId: tungstenId, kind: 'gel' } });
			expect(gone.status).toBe(409);
			expect((await gone.json()).error).toMatchObject({ code: 'target_missing', message: expect.stringMatching(/no longer exists/) });
		} finally {
			await db('readings').where({ id: stored.readingId }).update({ deleted_at: null });
		}
	});

	it('is for the crew: colorist and viewer 403, stranger 404, nobody 401', async () => {
		const json = { lightId: tungstenId, kind: 'gel' };
		expect((await call(fixesRoute.POST, path(), { params: params(), user: p.crew.colorist, json })).status).toBe(403);
		expect((await call(fixesRoute.POST, path(), { params: params(), user: p.crew.viewer, json })).status).toBe(403);
		expect((await call(fixesRoute.POST, path(), { params: params(), user: p.crew.stranger, json })).status).toBe(404);
		expect((await call(fixesRoute.POST, path(), { params: params(), user: null, json })).status).toBe(401);
		expect((await call(fixesRoute.POST, path(), { params: params(), user: p.crew.owner, json })).status).toBe(200);
	});
});
