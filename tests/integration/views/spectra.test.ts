/**
 * The reading page's load and the light-spectra API: who may see them (outsiders are told the
 * project does not exist), what a spectral reading and a chromaticity-only one bring, and the
 * predicted spectrum through a gel stack.
 */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cieIlluminant, daylightSpectrum, planckianSpectrum } from '../../../src/lib/colour';
import { gelLibrary } from '../../../src/lib/matching';
import { closeDb } from '../../../src/lib/server/db';
import * as readingsRoute from '../../../src/routes/api/v1/projects/[projectId]/readings/+server';
import * as spectraRoute from '../../../src/routes/api/v1/projects/[projectId]/lights/[lightId]/spectra/+server';
import * as readingPage from '../../../src/routes/projects/[projectId]/readings/[readingId]/+page.server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call } from '../helpers/route';
import { load } from '../log/helpers';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
let tungstenId: number;
let spectralId: number;
let typedId: number;

const A = cieIlluminant('A');
const P = () => ({ projectId: String(p.projectId) });

async function addReading(label: string, raw: unknown, lightId: number): Promise<number> {
	const res = await call(readingsRoute.POST, `/api/v1/projects/${p.projectId}/readings`, { params: P(), user: p.crew.gaffer, json: { label, raw, setupId: p.setupId, lightId } });
	expect(res.status, await res.clone().text()).toBe(201);
	return (await res.json()).id as number;
}
const page = (readingId: number | string, user = p.crew.viewer) => load(readingPage.load as never, `/projects/${p.projectId}/readings/${readingId}`, { params: { ...P(), readingId: String(readingId) }, user });
const spectra = (lightId: number | string, query: Record<string, string> = {}, user = p.crew.viewer) =>
	call(spectraRoute.GET, `/api/v1/projects/${p.projectId}/lights/${lightId}/spectra`, { params: { ...P(), lightId: String(lightId) }, query, user });

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Views');
	[tungstenId] = await db('lights').insert({ project_id: p.projectId, setup_id: p.setupId, label: 'Tungsten fresnel', role: 'back', kind: 'tungsten' });
	// Target: 5600 K on the Planckian locus (a daylight-balanced target; common practice).
	await db('setups').where({ id: p.setupId }).update({ target: JSON.stringify({ kind: 'cct_duv', cct_k: 5600, duv: 0 }), target_tolerance: 0.002 });
	// CIE illuminant A as a measured spectrum (CIE 15:2004 Table T.1, 380–780 nm at 5 nm).
	const from380 = Array.from(A.values).slice((380 - A.start) / A.interval, (780 - A.start) / A.interval + 1);
	spectralId = await addReading('Tungsten as found', { kind: 'spectral', spectrum: { start: 380, interval: 5, values: from380, scale: 'relative' } }, tungstenId);
	typedId = await addReading('Panel typed', { kind: 'cct_duv', cct_k: 5600, duv: 0.002 }, p.lightId);
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('reading page', () => {
	it('is for members only: every role 200, a stranger 404 (the project does not exist for them), a bad id 404', async () => {
		for (const role of ['owner', 'dp', 'gaffer', 'colorist', 'viewer'] as const) expect((await page(spectralId, p.crew[role])).status, role).toBe(200);
		expect((await page(spectralId, p.crew.stranger)).status).toBe(404);
		expect((await page(999999)).status).toBe(404);
		expect((await page('abc')).status).toBe(404);
	});

	it('a reading of another project is not found here', async () => {
		const other = await makeProject(db, 'Views other');
		const [id] = await db('readings').select('id').where({ project_id: p.projectId, id: spectralId });
		expect(id).toBeDefined();
		const r = await load(readingPage.load as never, `/projects/${other.projectId}/readings/${spectralId}`, { params: { projectId: String(other.projectId), readingId: String(spectralId) }, user: other.crew.viewer });
		expect(r.status).toBe(404);
	});

	it('a spectral reading brings its spectrum, the CRI reference at its CCT and the target white', async () => {
		const { data } = await page(spectralId);
		expect(data.reading.spectral).toBe(true);
		// CIE 15:2004: illuminant A has a CCT of 2856 K; CIE 13.3 §5.3: below 5000 K the reference is Planckian.
		expect(data.reading.analysis.cct_k).toBeCloseTo(2856, -1);
		expect(data.lines.map((l: { role: string }) => l.role)).toEqual(['reading', 'reference', 'target']);
		const [reading, reference, target] = data.lines;
		expect(reading.spectrum.values[(560 - 380) / 5]).toBe(100);
		expect(reference.label).toMatch(/^CRI reference: Planckian radiator at 285[67] K$/);
		// CIE 13.3 §5.3: a 5600 K target is compared with CIE daylight at that CCT.
		expect(target.label).toBe('Target white as CIE daylight at 5600 K');
		const d = daylightSpectrum(5600, 380, 780, 5);
		expect(target.spectrum.values[36]).toBeCloseTo(d.values[36], 3);
		expect(data.setup).toEqual({ id: p.setupId, name: 'Wide' });
		expect(data.light).toEqual({ id: tungstenId, label: 'Tungsten fresnel' });
		expect(data.target.CCT).toBeCloseTo(5600, -1);
	});

	it('a chromaticity-only reading has no spectrum lines and no CRI', async () => {
		const { data } = await page(typedId);
		expect(data.reading.spectral).toBe(false);
		expect(data.lines).toEqual([]);
		expect(data.reading.analysis.cri).toBeNull();
	});
});

describe('GET /api/v1/projects/:id/lights/:id/spectra', () => {
	it('is for members: a stranger 404, nobody 401, an unknown light 404', async () => {
		expect((await spectra(tungstenId)).status).toBe(200);
		expect((await spectra(tungstenId, {}, p.crew.stranger)).status).toBe(404);
		expect((await spectra(tungstenId, {}, null as never)).status).toBe(401);
		expect((await spectra(999999)).status).toBe(404);
		// A reading of another light is not this light's.
		expect((await spectra(tungstenId, { reading: String(typedId) })).status).toBe(404);
	});

	it('through ½ CTB: the stack’s transmission and the reading times it', async () => {
		const res = await spectra(tungstenId, { reading: String(spectralId), stack: 'ctb-half' });
		expect(res.status).toBe(200);
		const s = await res.json();
		expect(s.stack).toEqual({ ids: ['ctb-half'], label: expect.any(String) });
		expect(s.lines.map((l: { role: string }) => l.role)).toEqual(['reading', 'target', 'predicted']);
		const tau = s.transmissions[0].transmission;
		expect(tau).toMatchObject({ start: 380, interval: 1 });
		expect(tau.values).toHaveLength(401);
		// The library's model of ½ CTB at 450 and 650 nm (regression against the matching library).
		const half = gelLibrary().find((g) => g.id === 'ctb-half')!;
		const at = (nm: number) => half.transmission.values[(nm - half.transmission.start) / half.transmission.interval];
		expect(tau.values[450 - 380]).toBeCloseTo(at(450), 5);
		expect(tau.values[650 - 380]).toBeGreaterThanOrEqual(0);
		// A CTB passes more blue than red (common practice: it cools a warm source).
		expect(tau.values[450 - 380]).toBeGreaterThan(tau.values[650 - 380]);
		const predicted = s.lines[2].spectrum;
		const reading = s.lines[0].spectrum;
		expect(predicted.values[(560 - 380) / 5]).toBeCloseTo(reading.values[(560 - 380) / 5] * tau.values[560 - 380], 3);
	});

	it('a stack of two multiplies; an unknown filter is a 400; more than three is refused', async () => {
		const two = await (await spectra(tungstenId, { stack: 'ctb-half,ctb-half' })).json();
		const one = await (await spectra(tungstenId, { stack: 'ctb-half' })).json();
		expect(two.transmissions[0].transmission.values[450 - 380]).toBeCloseTo(one.transmissions[0].transmission.values[450 - 380] ** 2, 5);
		const bad = await spectra(tungstenId, { stack: 'no-such-gel' });
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.code).toBe('unknown_filter');
		expect((await spectra(tungstenId, { stack: 'ctb-half,ctb-half,ctb-half,ctb-half' })).status).toBe(400);
	});

	it('a light whose latest reading is a chromaticity says so and draws nothing', async () => {
		const s = await (await spectra(p.lightId)).json();
		expect(s.reading).toEqual({ id: typedId, label: 'Panel typed', spectral: false });
		expect(s.lines).toEqual([]);
		expect(s.transmissions).toEqual([]);
	});

	it('the Planckian reference matches the colour core (CIE 15:2004 §3.1, 100 at 560 nm)', async () => {
		const { data } = await page(spectralId);
		const ref = data.lines[1].spectrum;
		const core = planckianSpectrum(data.reading.analysis.cct_k, 380, 780, 5);
		expect(ref.values[(560 - 380) / 5]).toBeCloseTo(100, 6);
		expect(ref.values[0]).toBeCloseTo(core.values[0], 3);
	});
});
