/**
 * The project library in the fixes: overrides change the gel arithmetic and the reshaped spectra,
 * uploaded custom filters join the stack search, and uploaded fixture profiles are solved for.
 */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planckianSpectrum } from '../../../src/lib/colour';
import { closeDb } from '../../../src/lib/server/db';
import * as fixesRoute from '../../../src/routes/api/v1/projects/[projectId]/fixes/+server';
import * as projectGels from '../../../src/routes/api/v1/projects/[projectId]/library/gels/+server';
import * as projectFixtures from '../../../src/routes/api/v1/projects/[projectId]/library/fixtures/+server';
import * as overrideRoute from '../../../src/routes/api/v1/projects/[projectId]/library/overrides/[gelId]/+server';
import * as sharedFixtures from '../../../src/routes/api/v1/library/fixtures/+server';
import * as sharedGels from '../../../src/routes/api/v1/library/gels/+server';
import * as projectLibraryRoute from '../../../src/routes/api/v1/projects/[projectId]/library/+server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call } from '../helpers/route';
import { longCsv, modelledGelCsv, rgbwChannels, rgbwCsv } from '../../unit/server/library/factories';
import { addReading, fixtureForm, gelForm, makeAdmin, spectralRaw, uniqueName } from './helpers';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
let tungstenId: number;
let typedId: number;
const params = () => ({ projectId: String(p.projectId) });
// Mired definition M = 10⁶/T: ½ CTB at −68 mired from 3200 K reaches 10⁶/(10⁶/3200 − 68) ≈ 4090 K.
const TARGET_K = 1e6 / (1e6 / 3200 - 68);

type Proposal = { gels: Array<{ id: string }>; residual: number; predicted: { CCT: number | null }; miredShift: { nominal: number } };

async function gelFixes(lightId: number, extra: Record<string, unknown> = {}) {
	const res = await call(fixesRoute.POST, `/api/v1/projects/${p.projectId}/fixes`, { params: params(), user: p.crew.gaffer, json: { lightId, kind: 'gel', maxGels: 1, top: 20, ...extra } });
	expect(res.status).toBe(200);
	return (await res.json()).result as { estimate: boolean; considered: number; proposals: Proposal[] };
}
const single = (r: { proposals: Proposal[] }, id: string) => r.proposals.find((x) => x.gels.length === 1 && x.gels[0].id === id);

async function ledFix(lightId: number, fixtureId?: string, projectId = p.projectId, user = p.crew.gaffer) {
	return call(fixesRoute.POST, `/api/v1/projects/${projectId}/fixes`, { params: { projectId: String(projectId) }, user, json: { lightId, kind: 'led', ...(fixtureId ? { fixtureId } : {}) } });
}

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Library fixes');
	await db('setups').where({ id: p.setupId }).update({ target: JSON.stringify({ kind: 'cct_duv', cct_k: TARGET_K, duv: 0 }), target_tolerance: 0.002 });
	[tungstenId] = await db('lights').insert({ project_id: p.projectId, setup_id: p.setupId, label: 'Tungsten fresnel', role: 'key', kind: 'tungsten' });
	[typedId] = await db('lights').insert({ project_id: p.projectId, setup_id: p.setupId, label: 'Typed tungsten', role: 'fill', kind: 'tungsten' });
	await addReading(p.projectId, p.setupId, p.crew.gaffer, 'Tungsten at full', spectralRaw(planckianSpectrum(3200, 380, 780, 5)), tungstenId);
	await addReading(p.projectId, p.setupId, p.crew.gaffer, 'Typed 3200 K', { kind: 'cct_duv', cct_k: 3200, duv: 0 }, typedId);
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('filter overrides in the fixes', () => {
	it('½ CTB overridden to −68 mired: the arithmetic (nominal) shift and the spectral prediction both follow, and clearing puts it back', async () => {
		const before = await gelFixes(tungstenId);
		const estBefore = await gelFixes(typedId);
		expect(single(before, 'ctb-half')?.miredShift.nominal).toBeCloseTo(-65.5, 10);
		expect(single(estBefore, 'ctb-half')?.miredShift.nominal).toBeCloseTo(-65.5, 10);

		const put = await call(overrideRoute.PUT, `/api/v1/projects/${p.projectId}/library/overrides/ctb-half`, {
			params: { ...params(), gelId: 'ctb-half' },
			user: p.crew.gaffer,
			method: 'PUT',
			json: { miredShift: -68, note: 'our swatch book' }
		});
		expect(put.status).toBe(200);
		const view = await put.json();
		expect(view.miredShift).toBe(-68);
		expect(view.builtIn.miredShift).toBeCloseTo(-65.5, 10);

		const after = await gelFixes(tungstenId);
		const half = single(after, 'ctb-half');
		expect(half?.miredShift.nominal).toBe(-68);
		// Spectral: the reshaped filter takes a 3200 K Planckian to 10⁶/(312.5 − 68) K (mired definition).
		expect(half?.residual).toBeLessThan(1e-4);
		expect(half?.residual).toBeLessThan(single(before, 'ctb-half')!.residual);
		expect(Math.abs((half?.predicted.CCT ?? 0) - TARGET_K)).toBeLessThan(2);
		expect(after.proposals[0].gels.map((g) => g.id)).toEqual(['ctb-half']);

		// Arithmetic: a typed 3200 K plus −68 mired lands on the target's mired.
		const est = await gelFixes(typedId);
		expect(est.estimate).toBe(true);
		const estHalf = single(est, 'ctb-half');
		expect(estHalf?.miredShift.nominal).toBe(-68);
		expect(Math.abs((estHalf?.predicted.CCT ?? 0) - TARGET_K)).toBeLessThan(2);

		const del = await call(overrideRoute.DELETE, `/api/v1/projects/${p.projectId}/library/overrides/ctb-half`, { params: { ...params(), gelId: 'ctb-half' }, user: p.crew.gaffer, method: 'DELETE' });
		expect(del.status).toBe(204);
		expect(single(await gelFixes(tungstenId), 'ctb-half')?.miredShift.nominal).toBeCloseTo(-65.5, 10);
	});

	it('an override in one project leaves another project alone', async () => {
		const other = await makeProject(db, 'Other library');
		await call(overrideRoute.PUT, `/api/v1/projects/${p.projectId}/library/overrides/cto-quarter`, {
			params: { ...params(), gelId: 'cto-quarter' },
			user: p.crew.owner,
			method: 'PUT',
			json: { miredShift: 42 }
		});
		const mine = await (await call(projectLibraryRoute.GET, '/x', { params: params(), user: p.crew.viewer })).json();
		const theirs = await (await call(projectLibraryRoute.GET, '/x', { params: { projectId: String(other.projectId) }, user: other.crew.viewer })).json();
		const q = (lib: { filters: Array<{ id: string; miredShift: number }> }) => lib.filters.find((f) => f.id === 'cto-quarter')?.miredShift;
		expect(q(mine)).toBe(42);
		expect(q(theirs)).toBeCloseTo(39.75, 10); // ¼ of +159 (common practice, proportional)
	});
});

describe('custom filters from a measured transmission', () => {
	it('regression/self-consistency: the modelled full CTO uploaded as a CSV comes back within 2 % of +159 mired, and joins the search', async () => {
		// Without custom filters of its own: 18 built-in non-ND filters + the empty stack, plus any shared custom filters.
		const shared = (await db('library_custom_gels').where({ scope_id: 0 }).count({ n: '*' }).first())?.n;
		const base = await gelFixes(tungstenId);
		expect(base.considered).toBe(19 + Number(shared));
		const res = await call(projectGels.POST, '/x', { params: params(), user: p.crew.dp, body: gelForm(modelledGelCsv('cto-full'), { name: 'Read-back CTO' }) });
		expect(res.status).toBe(201);
		const gel = await res.json();
		expect(gel.gelId).toMatch(/^custom-\d+$/);
		expect(gel.sourceUnit).toBe('percent');
		expect(gel.effects.map((e: { sourceK: number }) => e.sourceK)).toEqual([3200, 5600]);
		for (const e of gel.effects) {
			expect(Math.abs(e.miredShift - 159) / 159).toBeLessThan(0.02);
			expect(Math.abs(e.duvShift)).toBeLessThan(1e-3);
			expect(e.lossStops).toBeGreaterThan(0);
		}
		expect(Math.abs(gel.miredShift - 159) / 159).toBeLessThan(0.02);

		const r = await gelFixes(tungstenId);
		expect(r.considered).toBe(base.considered + 1);
		expect(r.proposals.some((x) => x.gels[0]?.id === gel.gelId)).toBe(true);
	});

	it('a shared custom filter (site admin) is searched in every project, after the project’s own', async () => {
		const admin = await makeAdmin(db);
		const before = (await gelFixes(tungstenId)).considered;
		const flat = longCsv({ Grey: () => 0.5 });
		const res = await call(sharedGels.POST, '/x', { user: admin, body: gelForm(flat, { name: uniqueName('Shared grey'), unit: 'fraction' }) });
		expect(res.status).toBe(201);
		const shared = await res.json();
		expect(shared.scope).toBe('shared');
		expect(shared.lossStops).toBeCloseTo(1, 6); // a factor of 2 is one stop
		const lib = await (await call(projectLibraryRoute.GET, '/x', { params: params(), user: p.crew.colorist })).json();
		const scopes = lib.customGels.map((g: { scope: string }) => g.scope);
		expect(scopes.indexOf('project')).toBeLessThan(scopes.indexOf('shared'));
		const r = await gelFixes(tungstenId);
		expect(r.considered).toBe(before + 1);
	});
});

describe('fixture profiles from measured channel spectra', () => {
	it('a profile uploaded with each channel’s maximum output solves an in-gamut target exactly (Δu′v′ ≤ 1e-4), named by the light or asked for', async () => {
		const res = await call(projectFixtures.POST, '/x', { params: params(), user: p.crew.gaffer, body: fixtureForm(rgbwCsv(), { name: 'Our RGBW panel', outputs: JSON.stringify([0.3, 0.6, 0.12, 1]) }) });
		expect(res.status).toBe(201);
		const profile = await res.json();
		expect(profile.key).toBe('our-rgbw-panel');
		expect(profile.channels.map((c: { label: string }) => c.label)).toEqual(['Red', 'Green', 'Blue', 'White']);
		// Maximum outputs as given: Y at full per channel.
		expect(profile.channels.map((c: { output: number }) => c.output)).toEqual([0.3, 0.6, 0.12, 1].map((v) => expect.closeTo(v, 9)));

		const [panel] = await db('lights').insert({ project_id: p.projectId, setup_id: p.setupId, label: 'Measured panel', role: 'key', kind: 'other', fixture_profile: 'our-rgbw-panel' });
		await addReading(p.projectId, p.setupId, p.crew.gaffer, 'Panel as found', { kind: 'cct_duv', cct_k: 5600, duv: 0 }, panel);
		for (const fixtureId of [undefined, 'our-rgbw-panel']) {
			const fix = await ledFix(panel, fixtureId);
			expect(fix.status).toBe(200);
			const { result } = await fix.json();
			expect(result.fixture.id).toBe('our-rgbw-panel');
			expect(result.fixture.generic).toBe(false);
			expect(result.inGamut).toBe(true);
			expect(result.distance.duv_prime).toBeLessThanOrEqual(1e-4);
			expect(result.channels).toHaveLength(4);
		}
		const unknown = await ledFix(panel, 'no-such-profile');
		expect(unknown.status).toBe(400);
		expect((await unknown.json()).error.code).toBe('no_fixture');
	});

	it('resolves a key to the generic profile first, then the project’s, then the shared one', async () => {
		const admin = await makeAdmin(db);
		const ch = rgbwChannels();
		const threeChannels = longCsv({ Red: ch.Red, Green: ch.Green, Blue: ch.Blue });
		const shared = await call(sharedFixtures.POST, '/x', { user: admin, body: fixtureForm(threeChannels, { key: 'house-unit', asMeasured: 'true' }) });
		expect(shared.status).toBe(201);
		expect((await shared.json()).outputBasis).toBe('as_measured');
		const other = await makeProject(db, 'Shared profile user');
		await db('setups').where({ id: other.setupId }).update({ target: JSON.stringify({ kind: 'cct_duv', cct_k: 5000, duv: 0 }) });
		await addReading(other.projectId, other.setupId, other.crew.gaffer, 'As found', { kind: 'cct_duv', cct_k: 4000, duv: 0 }, other.lightId);
		const viaShared = await (await ledFix(other.lightId, 'house-unit', other.projectId, other.crew.gaffer)).json();
		expect(viaShared.result.channels).toHaveLength(3);

		const own = await call(projectFixtures.POST, '/x', { params: { projectId: String(other.projectId) }, user: other.crew.owner, body: fixtureForm(rgbwCsv(), { key: 'house-unit', outputs: JSON.stringify({ Red: 0.3, Green: 0.6, Blue: 0.12, White: 1 }) }) });
		expect(own.status).toBe(201);
		const viaOwn = await (await ledFix(other.lightId, 'house-unit', other.projectId, other.crew.gaffer)).json();
		expect(viaOwn.result.channels).toHaveLength(4);

		const generic = await (await ledFix(other.lightId, 'generic-seven', other.projectId, other.crew.gaffer)).json();
		expect(generic.result.fixture.id).toBe('generic-seven');
	});
});
