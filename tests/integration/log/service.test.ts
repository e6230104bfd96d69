/**
 * The log's rules through the pages' form actions and the services: optimistic concurrency, locks,
 * target whites with their CCT/Duv/xy, distances, accepted fixes and the activity every change writes.
 */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import * as activity from '../../../src/lib/server/db/activity';
import { loadProjectFor } from '../../../src/lib/server/authz';
import * as log from '../../../src/lib/server/services/log';
import * as setupRoute from '../../../src/routes/projects/[projectId]/setups/[setupId]/+page.server';
import * as lightRoute from '../../../src/routes/projects/[projectId]/setups/[setupId]/lights/[lightId]/+page.server';
import * as dayRoute from '../../../src/routes/projects/[projectId]/days/[dayId]/+page.server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { act, load } from './helpers';

let db: Knex;
beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

type P = Awaited<ReturnType<typeof makeProject>>;
const setupParams = (p: P, setupId = p.setupId) => ({ projectId: String(p.projectId), setupId: String(setupId) });
const lightParams = (p: P, lightId = p.lightId) => ({ ...setupParams(p), lightId: String(lightId) });
const version = async (table: string, id: number) => (await db(table).where({ id }).first('version')).version as number;
const lightForm = (over: Record<string, string> = {}) => ({ label: 'Key panel', role: 'key', kind: 'led-rgbw', gelStack: '', dimmerPercent: '', powerW: '', circuitId: '', notes: '', ledCct: '', ledGm: '', ledIntensity: '', ledChannels: '', ...over });

// CIE 15:2004 Table T.3: D65 x, y = 0.31272, 0.32903 (CCT ≈ 6504 K); A x, y = 0.44757, 0.40745 (CCT 2856 K).
const D65 = { kind: 'chromaticity_xy' as const, x: 0.31272, y: 0.32903 };
const A = { kind: 'chromaticity_xy' as const, x: 0.44757, y: 0.40745 };

describe('optimistic concurrency', () => {
	it('a second save from the same version is refused, says who saved first and shows both versions', async () => {
		const p = await makeProject(db, 'Conflict');
		const v = await version('lights', p.lightId);
		const first = await act(lightRoute.actions as never, 'update', '/l', { params: lightParams(p), user: p.crew.dp, form: { ...lightForm({ dimmerPercent: '60' }), version: v } });
		expect(first.status).toBe(200);
		const second = await act(lightRoute.actions as never, 'update', '/l', { params: lightParams(p), user: p.crew.gaffer, form: { ...lightForm({ dimmerPercent: '45', gelStack: 'cto-quarter' }), version: v } });
		expect(second.status).toBe(409);
		expect(second.data.code).toBe('conflict');
		expect(second.data.message).toMatch(/^Test dp changed this light first/);
		expect(second.data.conflict.changedBy).toEqual({ id: p.crew.dp.id, name: 'Test dp' });
		expect(second.data.conflict.version).toBe(v + 1);
		const fields = Object.fromEntries(second.data.conflict.fields.map((f: { field: string; yours: string; theirs: string }) => [f.field, [f.yours, f.theirs]]));
		expect(fields.dimmerPercent).toEqual(['45', '60']);
		expect(fields.gelStack[0]).toMatch(/CTO/);
		expect(second.data.values.dimmerPercent).toBe('45');
		// Saving again on the version the conflict reported keeps the second person's values.
		const again = await act(lightRoute.actions as never, 'update', '/l', { params: lightParams(p), user: p.crew.gaffer, form: { ...lightForm({ dimmerPercent: '45' }), version: second.data.conflict.version } });
		expect(again.status).toBe(200);
		expect((await db('lights').where({ id: p.lightId }).first()).dimmer_percent).toBe(45);
	});

	it('the same holds for shoot days and setups', async () => {
		const p = await makeProject(db, 'Conflict 2');
		const dv = await version('shoot_days', p.dayId);
		const day = { date: '2026-12-01', label: 'Night 1', locationName: 'Here', mainsVoltage: '230', mainsFrequency: '50', notes: '' };
		const params = { projectId: String(p.projectId), dayId: String(p.dayId) };
		expect((await act(dayRoute.actions as never, 'update', '/d', { params, user: p.crew.owner, form: { ...day, label: 'N1', version: dv } })).status).toBe(200);
		const lost = await act(dayRoute.actions as never, 'update', '/d', { params, user: p.crew.gaffer, form: { ...day, label: 'Night one', version: dv } });
		expect(lost.status).toBe(409);
		expect(lost.data.conflict.fields).toEqual([{ field: 'label', label: 'Label', yours: 'Night one', theirs: 'N1' }]);
		const sv = await version('setups', p.setupId);
		await act(setupRoute.actions as never, 'update', '/s', { params: setupParams(p), user: p.crew.dp, form: { name: 'Wide A', notes: '', status: 'lit', version: sv } });
		const s2 = await act(setupRoute.actions as never, 'update', '/s', { params: setupParams(p), user: p.crew.gaffer, form: { name: 'Wide B', notes: '', status: 'planning', version: sv } });
		expect(s2.status).toBe(409);
		expect(s2.data.conflict.changedBy.name).toBe('Test dp');
	});
});

describe('locks', () => {
	it('a locked setup refuses light and reading edits with who locked it, and opens again when unlocked', async () => {
		const p = await makeProject(db, 'Lock');
		const params = setupParams(p);
		expect((await act(setupRoute.actions as never, 'lock', '/s', { params, user: p.crew.dp, form: { version: await version('setups', p.setupId) } })).status).toBe(200);
		const add = await act(setupRoute.actions as never, 'addLight', '/s', { params, user: p.crew.gaffer, form: lightForm({ label: 'New' }) });
		expect(add.status).toBe(409);
		expect(add.data.code).toBe('locked');
		expect(add.data.message).toMatch(/locked by Test dp .* lights and readings are frozen/);
		const edit = await act(lightRoute.actions as never, 'update', '/l', { params: lightParams(p), user: p.crew.gaffer, form: { ...lightForm(), version: await version('lights', p.lightId) } });
		expect(edit.data.code).toBe('locked');
		expect((await act(lightRoute.actions as never, 'delete', '/l', { params: lightParams(p), user: p.crew.gaffer })).data.code).toBe('locked');
		const reading = await act(lightRoute.actions as never, 'addReading', '/l', { params: lightParams(p), user: p.crew.gaffer, form: { entry: 'cct_duv', cct_k: '3200', duv: '0' } });
		expect(reading.data.code).toBe('locked');
		expect((await db('readings').where({ light_id: p.lightId }).count({ n: '*' }))[0].n).toBe(0);
		const access = await loadProjectFor(p.crew.gaffer, p.projectId);
		await expect(log.acceptFix(access, p.lightId, { kind: 'gel', fix: { stack: ['cto-half'] } })).rejects.toMatchObject({ logCode: 'locked' });
		await expect(log.deleteSetup(access, p.setupId)).rejects.toMatchObject({ logCode: 'locked' });
		await expect(log.deleteDay(access, p.dayId)).rejects.toMatchObject({ logCode: 'locked' });
		await expect(log.assertSetupOpen(p.projectId, p.setupId)).rejects.toMatchObject({ logCode: 'locked' });
		// The power plan stays editable: a safety change must not wait for an unlock.
		expect((await act(setupRoute.actions as never, 'addCircuit', '/s', { params, user: p.crew.gaffer, form: { label: 'Wall', preset: 'eu-16' } })).status).toBe(200);
		// The gaffer cannot unlock; the DP can.
		expect((await act(setupRoute.actions as never, 'unlock', '/s', { params, user: p.crew.gaffer, form: { version: await version('setups', p.setupId) } })).status).toBe(403);
		expect((await act(setupRoute.actions as never, 'unlock', '/s', { params, user: p.crew.dp, form: { version: await version('setups', p.setupId) } })).status).toBe(200);
		expect((await act(setupRoute.actions as never, 'addLight', '/s', { params, user: p.crew.gaffer, form: lightForm({ label: 'New' }) })).status).toBe(200);
	});

	it('a locked target cannot be changed or cleared until it is unlocked; locking needs a target', async () => {
		const p = await makeProject(db, 'Target lock');
		const params = setupParams(p);
		const v = () => version('setups', p.setupId);
		expect((await act(setupRoute.actions as never, 'lockTarget', '/s', { params, user: p.crew.dp, form: { version: await v() } })).data.message).toMatch(/Choose a target white before locking/);
		expect((await act(setupRoute.actions as never, 'setTarget', '/s', { params, user: p.crew.dp, form: { kind: 'cct_duv', cct_k: '3200', duv: '0', version: await v() } })).status).toBe(200);
		expect((await act(setupRoute.actions as never, 'lockTarget', '/s', { params, user: p.crew.owner, form: { version: await v() } })).status).toBe(200);
		const change = await act(setupRoute.actions as never, 'setTarget', '/s', { params, user: p.crew.dp, form: { kind: 'illuminant', name: 'D65', version: await v() } });
		expect(change.status).toBe(409);
		expect(change.data.message).toMatch(/locked by Test owner\. Unlock it/);
		expect((await act(setupRoute.actions as never, 'clearTarget', '/s', { params, user: p.crew.dp, form: { version: await v() } })).data.code).toBe('locked');
		expect((await act(setupRoute.actions as never, 'unlockTarget', '/s', { params, user: p.crew.dp, form: { version: await v() } })).status).toBe(200);
		expect((await act(setupRoute.actions as never, 'setTarget', '/s', { params, user: p.crew.dp, form: { kind: 'illuminant', name: 'D65', version: await v() } })).status).toBe(200);
	});
});

describe('target white and distance', () => {
	it('targets a reading and shows its CCT/Duv/xy; readings get their Δu′v′ to it (CIE 15:2004 Table T.3)', async () => {
		const p = await makeProject(db, 'Target');
		const access = await loadProjectFor(p.crew.gaffer, p.projectId);
		const house = await log.addReading(access, p.lightId, { label: 'House tubes', raw: D65 });
		const other = await log.createLight(access, p.setupId, { label: 'Tungsten back', kind: 'tungsten', role: 'back', gelStack: ['cto-half'] });
		await log.addReading(access, other.id, { label: 'Back raw', raw: A });
		const dp = await loadProjectFor(p.crew.dp, p.projectId);
		await log.setTarget(dp, p.setupId, { kind: 'reading', readingId: house.id }, 0.002, await version('setups', p.setupId));
		const view = await load(setupRoute.load as never, '/s', { params: setupParams(p), user: p.crew.colorist });
		const t = view.data.setup.target;
		expect(t.label).toBe('reading “House tubes”');
		expect(t.x).toBeCloseTo(0.31272, 5);
		expect(t.y).toBeCloseTo(0.32903, 5);
		expect(t.CCT).toBeGreaterThan(6502); // CIE 15:2004 Table T.3: D65 ≈ 6504 K
		expect(t.CCT).toBeLessThan(6506);
		expect(t.u_prime).toBeCloseTo(0.1978, 4);
		const byLabel = Object.fromEntries(view.data.lights.map((l: log.LightView) => [l.label, l]));
		expect(byLabel['Key panel'].lastReading.distance).toMatchObject({ duv_prime: 0, within: true });
		// Δu′v′ from A to D65, computed from the published xy of both (derived): √((0.2560−0.1978)² + (0.5243−0.4683)²) ≈ 0.0808.
		expect(byLabel['Tungsten back'].lastReading.distance.duv_prime).toBeCloseTo(0.0808, 3);
		expect(byLabel['Tungsten back'].lastReading.distance.within).toBe(false);
		// Mired: 10⁶/2856 − 10⁶/6504 ≈ 196 mired warmer than the target, so the light needs about −196 (CTB direction).
		expect(byLabel['Tungsten back'].lastReading.distance.mired).toBeCloseTo(1e6 / 6504 - 1e6 / 2856, -1);
		expect(byLabel['Tungsten back'].heatCaution).toMatch(/heat-resistant gel/);
		expect(byLabel['Tungsten back'].lastReading.cct_k).toBeGreaterThan(2854); // CIE 15:2004 Table T.3: A 2856 K
		expect(byLabel['Tungsten back'].lastReading.cct_k).toBeLessThan(2858);
	});

	it('targets a CIE illuminant, a CCT + Duv and an xy; a removed target reading is reported', async () => {
		const p = await makeProject(db, 'Target kinds');
		const dp = await loadProjectFor(p.crew.dp, p.projectId);
		const a = await log.resolveTarget(p.projectId, { kind: 'illuminant', name: 'A' }, 0.002);
		expect(a?.x).toBeCloseTo(0.44757, 4); // CIE 15:2004 Table T.3
		expect(a?.y).toBeCloseTo(0.40745, 4);
		const c = await log.resolveTarget(p.projectId, { kind: 'cct_duv', cct_k: 3200, duv: 0 }, 0.002);
		expect(c?.CCT).toBeCloseTo(3200, 0);
		expect(c?.Duv).toBeCloseTo(0, 4);
		const xy = await log.resolveTarget(p.projectId, { kind: 'xy', x: 0.31272, y: 0.32903 }, 0.002);
		expect(xy?.CCT).toBeCloseTo(6504, -1);
		const r = await log.addReading(dp, p.lightId, { label: 'Gone soon', raw: D65 });
		await log.setTarget(dp, p.setupId, { kind: 'reading', readingId: r.id }, undefined, await version('setups', p.setupId));
		await db('readings').where({ id: r.id }).update({ deleted_at: new Date() });
		const view = await load(setupRoute.load as never, '/s', { params: setupParams(p), user: p.crew.dp });
		expect(view.data.setup.target).toBeNull();
		expect(view.data.setup.targetMissing).toBe(true);
		await expect(log.setTarget(dp, p.setupId, { kind: 'reading', readingId: 999999 }, undefined, await version('setups', p.setupId))).rejects.toMatchObject({ logCode: 'invalid' });
	});
});

describe('lights, readings and fixes through the pages', () => {
	it('adds a light with LED settings, types a reading, accepts a fix, and logs each change', async () => {
		const p = await makeProject(db, 'Flow');
		const add = await act(setupRoute.actions as never, 'addLight', '/s', { params: setupParams(p), user: p.crew.gaffer, form: lightForm({ label: 'Sign', kind: 'led-white', role: 'practical', ledCct: '6500', ledGm: '+5', powerW: '40' }) });
		expect(add.status).toBe(200);
		const lightId = add.data.lightId as number;
		const bad = await act(lightRoute.actions as never, 'addReading', '/l', { params: lightParams(p, lightId), user: p.crew.gaffer, form: { entry: 'cct_duv', cct_k: '90000' } });
		expect(bad.status).toBe(400);
		expect(bad.data.issues.cct_k[0]).toMatch(/1000 to 25000/);
		expect(bad.data.values.cct_k).toBe('90000');
		const ok = await act(lightRoute.actions as never, 'addReading', '/l', { params: lightParams(p, lightId), user: p.crew.gaffer, form: { entry: 'cct_duv', cct_k: '6400', duv: '0.004', lux: '120', label: '' } });
		expect(ok.status).toBe(200);
		const page = await load(lightRoute.load as never, '/l', { params: lightParams(p, lightId), user: p.crew.viewer });
		expect(page.data.readings).toHaveLength(1);
		expect(page.data.readings[0]).toMatchObject({ label: 'Sign', lux: 120 });
		expect(page.data.readings[0].cct_k).toBeCloseTo(6400, 0);
		expect(page.data.light.ledText).toBe('6500 K, G/M +5');

		const access = await loadProjectFor(p.crew.gaffer, p.projectId);
		const { fix, light } = await log.acceptFix(access, lightId, { kind: 'gel', fix: { stack: ['minusgreen-quarter'] }, predicted: { duv_prime: 0.0012 }, note: 'take the green out' });
		expect(fix).toMatchObject({ kind: 'gel', acceptedBy: p.crew.gaffer.id, acceptedByName: 'Test gaffer' });
		expect(light.gelStack).toEqual(['minusgreen-quarter']);
		await expect(log.acceptFix(access, lightId, { kind: 'gel', fix: { stack: 'nope' } })).rejects.toMatchObject({ logCode: 'invalid' });
		const colorist = await loadProjectFor(p.crew.colorist, p.projectId);
		await expect(log.acceptFix(colorist, lightId, { kind: 'gel', fix: { stack: [] } })).rejects.toMatchObject({ logCode: 'forbidden' });

		const { items } = await activity.list(p.projectId, { order: 'asc' });
		expect(items.map((a) => [a.action, a.subjectType, a.userName])).toEqual([
			['create', 'light', 'Test gaffer'],
			['create', 'reading', 'Test gaffer'],
			['fix.accept', 'light', 'Test gaffer']
		]);
		expect(items[0].summary).toBe('Added practical light “Sign” (LED, fixed white) to “Wide”');
		expect(items[1].summary).toMatch(/^Took reading “Sign” of “Sign”: 64\d\d K$/);
	});

	it('a blank field on the edit form clears the stored value', async () => {
		const p = await makeProject(db, 'Clear');
		const access = await loadProjectFor(p.crew.gaffer, p.projectId);
		await log.updateLight(access, p.lightId, { dimmerPercent: 50, powerW: 200 }, await version('lights', p.lightId));
		const r = await act(lightRoute.actions as never, 'update', '/l', { params: lightParams(p), user: p.crew.gaffer, form: { ...lightForm(), version: await version('lights', p.lightId) } });
		expect(r.status).toBe(200);
		const row = await db('lights').where({ id: p.lightId }).first();
		expect([row.dimmer_percent, row.power_w]).toEqual([null, null]);
		const entry = (await activity.list(p.projectId, { subjectType: 'light' })).items[0];
		expect(entry.details?.changes).toMatchObject({ dimmerPercent: ['50', '—'], powerW: ['200', '—'] });
	});

	it('a circuit from another setup is refused; over-limit circuits warn on the setup page', async () => {
		const p = await makeProject(db, 'Circuits');
		const access = await loadProjectFor(p.crew.gaffer, p.projectId);
		const elsewhere = await log.createCircuit(access, p.otherSetupId, { label: 'Other', volts: 230, amps: 16, derating: 0.8 });
		await expect(log.updateLight(access, p.lightId, { circuitId: elsewhere.id }, await version('lights', p.lightId))).rejects.toMatchObject({ logCode: 'invalid' });
		const c = await log.createCircuit(access, p.setupId, { label: 'Wall', preset: 'uk-13', volts: 230, amps: 13, derating: 0.8 });
		await log.updateLight(access, p.lightId, { circuitId: c.id, powerW: 2500 }, await version('lights', p.lightId));
		const view = await load(setupRoute.load as never, '/s', { params: setupParams(p), user: p.crew.viewer });
		// 13 A at 230 V: breaker 2,990 W, continuous limit 2,392 W (80 %, derived from common practice).
		expect(view.data.power.circuits[0]).toMatchObject({ breakerWatts: 2990, continuousWatts: 2392, watts: 2500, level: 'over-continuous' });
		expect(view.data.power.overCount).toBe(1);
	});
});
