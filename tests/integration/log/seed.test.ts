/** The demo lighting log seed: what it makes, that its readings are computed from its models, and that a second run adds nothing. */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import { loadProjectFor } from '../../../src/lib/server/authz';
import { setupPage } from '../../../src/lib/server/services/log';
import { seedAccounts } from '../../../scripts/seed/accounts';
import { seedDemoProject } from '../../../scripts/seed/project';
import { seedLightingLog } from '../../../scripts/seed/log';
import type { SeedContext } from '../../../scripts/seed/context';
import { testKnex } from '../helpers/db';

let db: Knex;
const ctx: SeedContext = { users: {} };
const count = async (table: string, projectId: number) => Number((await db(table).where({ project_id: projectId }).count({ n: '*' }))[0].n);

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	await seedAccounts(ctx);
	await seedDemoProject(ctx);
	await seedLightingLog(ctx);
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('demo lighting log', () => {
	it('has two laundromat nights on 230 V 50 Hz and a studio day, labelled as invented', async () => {
		const days = await db('shoot_days').where({ project_id: ctx.project!.id }).orderBy('shoot_date');
		expect(days.map((d) => d.label)).toEqual(['Night 1', 'Night 2', 'Studio day']);
		expect(days.every((d) => d.mains_voltage === 230 && d.mains_frequency === 50)).toBe(true);
		expect(days.every((d) => /invented/i.test(d.notes))).toBe(true);
	});

	it('models read as their sources should (regression on our own models, with trade expectations beside them)', async () => {
		const access = await loadProjectFor({ ...ctx.users.colorist!, isAdmin: false }, ctx.project!.id);
		const wideId = (await db('setups').where({ project_id: ctx.project!.id, name: 'Wide: the row of machines' }).first()).id;
		const wide = (await setupPage(access, wideId))!;
		const by = Object.fromEntries(wide.lights.map((l) => [l.label, l]));
		// Common practice: tube CCTs are quoted at 4000–5000 K; ours are modelled somewhere in 3500–5500 K.
		const tubes = by['House tubes (ceiling)'].lastReading!;
		expect(tubes.cct_k).toBeGreaterThan(3500);
		expect(tubes.cct_k).toBeLessThan(5500);
		// Low-pressure sodium, nearly one line at 589 nm: a nominal CCT near 1800–2000 K and a CRI far below
		// any usable value (from memory: Ra is quoted as negative), with xy near the spectral locus.
		const sodium = by['Streetlight through the window'].lastReading!;
		expect(sodium.cct_k).toBeGreaterThan(1700);
		expect(sodium.cct_k).toBeLessThan(2100);
		expect(sodium.ra).toBeLessThan(20);
		expect(sodium.x).toBeGreaterThan(0.55);
		// The target is the tubes' own reading, locked, and the tubes sit on it.
		expect(wide.setup.target?.label).toBe('reading “Tubes, centre of room”');
		expect(wide.setup.targetLocked).not.toBeNull();
		expect(wide.setup.locked).not.toBeNull();
		expect(tubes.distance?.duv_prime).toBe(0);
		// A Planckian at 3150 K reads 3150 K (CIE 15:2004 §9.1: the CCT of a Planckian is its temperature).
		const back = await db('readings').where({ project_id: ctx.project!.id, label: 'Back, bare' }).first();
		expect(back.cct_k).toBeCloseTo(3150, -1);
		expect(back.cri_ra).toBeGreaterThan(99);
		expect(by['Tungsten fresnel backlight'].latestFix?.acceptedBy).toBe('Demo Gaffer');
		expect(wide.power.circuits).toHaveLength(2);
	});

	it('plans one circuit over its limit, to show the warning', async () => {
		const access = await loadProjectFor({ ...ctx.users.gaffer!, isAdmin: false }, ctx.project!.id);
		const id = (await db('setups').where({ project_id: ctx.project!.id, name: 'Window two-shot' }).first()).id;
		const view = (await setupPage(access, id))!;
		expect(view.power.overCount).toBe(1);
		expect(view.power.circuits[0].level).toBe('over-continuous');
	});

	it('adds nothing on a second run', async () => {
		const before = await Promise.all(['shoot_days', 'setups', 'lights', 'readings', 'comments', 'accepted_fixes'].map((t) => count(t, ctx.project!.id)));
		await seedDemoProject(ctx);
		await seedLightingLog(ctx);
		const after = await Promise.all(['shoot_days', 'setups', 'lights', 'readings', 'comments', 'accepted_fixes'].map((t) => count(t, ctx.project!.id)));
		expect(after).toEqual(before);
		expect(before[3]).toBeGreaterThanOrEqual(12);
	});
});
