/** The lighting log's table modules, verb by verb, on a real MariaDB. */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import * as activity from '../../../src/lib/server/db/activity';
import * as circuits from '../../../src/lib/server/db/circuits';
import * as comments from '../../../src/lib/server/db/comments';
import * as fixes from '../../../src/lib/server/db/fixes';
import * as lights from '../../../src/lib/server/db/lights';
import * as setups from '../../../src/lib/server/db/setups';
import * as shootDays from '../../../src/lib/server/db/shoot-days';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
const dayFields = (over: Partial<shootDays.ShootDayFields> = {}): shootDays.ShootDayFields => ({ date: '2026-12-02', label: 'Night 2', locationName: 'Test laundromat', mainsVoltage: 230, mainsFrequency: 50, notes: '', ...over });

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Modules');
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('shoot-days', () => {
	it('create, read, update with the current version, and a conflict with a stale one', async () => {
		const d = await shootDays.create(p.projectId, dayFields({ notes: 'rain' }), p.crew.gaffer.id);
		expect(d).toMatchObject({ date: '2026-12-02', label: 'Night 2', mainsVoltage: 230, mainsFrequency: 50, notes: 'rain', version: 1, createdBy: p.crew.gaffer.id });
		expect(await shootDays.read(p.projectId, d.id)).toMatchObject({ id: d.id });
		expect(await shootDays.read(p.projectId + 100000, d.id)).toBeNull();
		const u = await shootDays.update(p.projectId, d.id, { label: 'Night two' }, 1, p.crew.dp.id);
		expect(u && 'day' in u && u.day).toMatchObject({ label: 'Night two', version: 2, updatedBy: p.crew.dp.id });
		const stale = await shootDays.update(p.projectId, d.id, { label: 'Lost' }, 1, p.crew.gaffer.id);
		expect(stale && 'conflict' in stale && stale.conflict).toMatchObject({ label: 'Night two', version: 2 });
		expect(await shootDays.update(p.projectId, 999999, { label: 'x' }, 1, null)).toBeNull();
	});

	it('list: search, sort, counts and paging', async () => {
		const q = await makeProject(db, 'Day list');
		await shootDays.create(q.projectId, dayFields({ date: '2026-12-05', label: 'Studio', locationName: 'Stage B' }), null);
		await shootDays.create(q.projectId, dayFields({ date: '2026-11-30', label: 'Prep', locationName: 'Office' }), null);
		const all = await shootDays.list(q.projectId);
		expect(all.items.map((d) => d.date)).toEqual(['2026-11-30', '2026-12-01', '2026-12-05']);
		expect(all.items.find((d) => d.date === '2026-12-01')).toMatchObject({ setupCount: 2, lightCount: 1 });
		expect((await shootDays.list(q.projectId, { sort: 'date', order: 'desc', limit: 1 })).items.map((d) => d.date)).toEqual(['2026-12-05']);
		expect((await shootDays.list(q.projectId, { q: 'stage' })).items.map((d) => d.label)).toEqual(['Studio']);
		expect((await shootDays.list(q.projectId, { q: '100%_' })).total).toBe(0);
		expect((await shootDays.list(q.projectId, { sort: 'setups', order: 'desc' })).items[0].date).toBe('2026-12-01');
	});

	it('destroy takes the setups and lights with it', async () => {
		const q = await makeProject(db, 'Day delete');
		expect(await shootDays.destroy(q.projectId, q.dayId)).toBe(true);
		expect(await setups.read(q.projectId, q.setupId)).toBeNull();
		expect(await lights.read(q.projectId, q.lightId, { includeDeleted: true })).toBeNull();
		expect(await shootDays.destroy(q.projectId, q.dayId)).toBe(false);
	});
});

describe('setups', () => {
	it('create places the setup last on its day; list is in shooting order', async () => {
		const s = await setups.create(p.projectId, { shootDayId: p.dayId, name: 'Insert' }, p.crew.gaffer.id);
		expect(s).toMatchObject({ name: 'Insert', status: 'planning', target: null, targetTolerance: 0.002, position: 1, version: 1 });
		const list = await setups.list(p.projectId, { shootDayId: p.dayId });
		expect(list.map((x) => x.name)).toEqual(['Wide', 'Close', 'Insert']);
		expect(list[0]).toMatchObject({ dayDate: '2026-12-01', dayLabel: 'Night 1' });
		expect(await setups.exists(p.projectId, s.id)).toBe(true);
		expect(await setups.exists(p.projectId + 1, s.id)).toBe(false);
	});

	it('update stores the target as JSON and the locks; a stale version is a conflict', async () => {
		const s = await setups.create(p.projectId, { shootDayId: p.dayId, name: 'Locks' }, null);
		const at = new Date('2026-12-01T22:00:00.000Z');
		const r = await setups.update(p.projectId, s.id, { target: { kind: 'cct_duv', cct_k: 3200, duv: 0 }, lockedAt: at, lockedBy: p.crew.dp.id, status: 'lit' }, 1, p.crew.dp.id);
		expect(r && 'setup' in r && r.setup).toMatchObject({ target: { kind: 'cct_duv', cct_k: 3200, duv: 0 }, lockedAt: at, lockedBy: p.crew.dp.id, status: 'lit', version: 2 });
		expect(await setups.lockedOnDay(p.projectId, p.dayId)).toBeGreaterThanOrEqual(1);
		const c = await setups.update(p.projectId, s.id, { name: 'x' }, 1, null);
		expect(c && 'conflict' in c).toBe(true);
		expect(await setups.destroy(p.projectId, s.id)).toBe(true);
	});
});

describe('lights', () => {
	it('keep gel stacks and LED settings through JSON, and filter by kind', async () => {
		const l = await lights.create(p.projectId, p.setupId, { label: 'Back', role: 'back', kind: 'tungsten', gelStack: ['cto-half', 'plusgreen-quarter'], ledSettings: null, dimmerPercent: 62.5, powerW: 650 }, p.crew.gaffer.id);
		expect(l).toMatchObject({ gelStack: ['cto-half', 'plusgreen-quarter'], ledSettings: null, dimmerPercent: 62.5, powerW: 650, position: 1 });
		const led = await lights.create(p.projectId, p.setupId, { label: 'Panel', kind: 'led-rgbw', ledSettings: { cct_k: 5600, gm: -10, channels: { R: 40, W: 80 } } }, null);
		expect((await lights.read(p.projectId, led.id))?.ledSettings).toEqual({ cct_k: 5600, gm: -10, channels: { R: 40, W: 80 } });
		expect((await lights.list(p.projectId, { setupId: p.setupId, kind: 'tungsten' })).map((x) => x.id)).toEqual([l.id]);
	});

	it('update and conflict; destroy hides the light but keeps the row (setupOf then says null)', async () => {
		const l = await lights.create(p.projectId, p.setupId, { label: 'Temp' }, null);
		const r = await lights.update(p.projectId, l.id, { dimmerPercent: null, gelStack: [] }, 1, p.crew.gaffer.id);
		expect(r && 'light' in r && r.light.version).toBe(2);
		expect(await lights.update(p.projectId, l.id, { label: 'Lost' }, 1, null)).toMatchObject({ conflict: { version: 2 } });
		expect(await lights.setupOf(p.projectId, l.id)).toBe(p.setupId);
		expect(await lights.destroy(p.projectId, l.id, p.crew.gaffer.id)).toBe(true);
		expect(await lights.read(p.projectId, l.id)).toBeNull();
		expect((await lights.read(p.projectId, l.id, { includeDeleted: true }))?.deletedAt).toBeInstanceOf(Date);
		expect(await lights.setupOf(p.projectId, l.id)).toBeNull();
		expect(await lights.destroy(p.projectId, l.id, null)).toBe(false);
		expect((await lights.list(p.projectId, { setupId: p.setupId })).some((x) => x.id === l.id)).toBe(false);
		expect((await lights.list(p.projectId, { setupId: p.setupId, includeDeleted: true })).some((x) => x.id === l.id)).toBe(true);
	});
});

describe('circuits', () => {
	it('create, update, conflict, and destroy leaves its lights unassigned', async () => {
		const c = await circuits.create(p.projectId, p.setupId, { label: 'Wall sockets', preset: 'eu-16', volts: 230, amps: 16, derating: 0.8 }, p.crew.gaffer.id);
		expect(c).toMatchObject({ volts: 230, amps: 16, derating: 0.8, preset: 'eu-16', version: 1 });
		const l = await lights.create(p.projectId, p.setupId, { label: 'On wall', circuitId: c.id, powerW: 300 }, null);
		expect(await circuits.update(p.projectId, c.id, { amps: 13 }, 1, null)).toMatchObject({ circuit: { amps: 13, version: 2 } });
		expect(await circuits.update(p.projectId, c.id, { amps: 10 }, 1, null)).toMatchObject({ conflict: { amps: 13 } });
		expect((await circuits.list(p.projectId, { setupId: p.setupId })).map((x) => x.id)).toContain(c.id);
		expect(await circuits.destroy(p.projectId, c.id)).toBe(true);
		expect((await lights.read(p.projectId, l.id))?.circuitId).toBeNull();
	});
});

describe('comments', () => {
	it('create with the author’s name, list by subject, edit with a version, hide on destroy', async () => {
		const c = await comments.create(p.projectId, { subjectType: 'setup', subjectId: p.setupId, body: 'Warm it up', authorId: p.crew.colorist.id });
		expect(c).toMatchObject({ authorName: 'Test colorist', body: 'Warm it up', version: 1, updatedAt: null });
		await comments.create(p.projectId, { subjectType: 'light', subjectId: p.lightId, body: 'Key is green', authorId: p.crew.dp.id });
		expect((await comments.list(p.projectId, { subjectType: 'setup', subjectId: p.setupId })).map((x) => x.body)).toContain('Warm it up');
		const both = await comments.list(p.projectId, { subjects: [{ type: 'setup', id: p.setupId }, { type: 'light', id: p.lightId }] });
		expect(both.map((x) => x.body)).toEqual(expect.arrayContaining(['Warm it up', 'Key is green']));
		expect(await comments.list(p.projectId, { subjects: [] })).toEqual([]);
		expect(await comments.update(p.projectId, c.id, 'Warm it up a touch', 1)).toMatchObject({ comment: { body: 'Warm it up a touch', version: 2 } });
		expect(await comments.update(p.projectId, c.id, 'Lost', 1)).toMatchObject({ conflict: { version: 2 } });
		expect(await comments.destroy(p.projectId, c.id)).toBe(true);
		expect(await comments.read(p.projectId, c.id)).toBeNull();
		expect((await comments.list(p.projectId, { includeDeleted: true })).some((x) => x.id === c.id)).toBe(true);
	});
});

describe('activity', () => {
	it('records and lists newest first, filtered by subject, person and words, with paging', async () => {
		const q = await makeProject(db, 'Activity');
		await activity.create(q.projectId, { userId: q.crew.gaffer.id, action: 'create', subjectType: 'light', subjectId: 1, summary: 'Added light “A”', createdAt: new Date('2026-12-01T20:00:00Z') });
		await activity.create(q.projectId, { userId: q.crew.dp.id, action: 'target.set', subjectType: 'setup', subjectId: 2, summary: 'Set the target', details: { before: null }, createdAt: new Date('2026-12-01T21:00:00Z') });
		const all = await activity.list(q.projectId);
		expect(all.total).toBe(2);
		expect(all.items.map((a) => a.summary)).toEqual(['Set the target', 'Added light “A”']);
		expect(all.items[0]).toMatchObject({ userName: 'Test dp', details: { before: null } });
		expect((await activity.list(q.projectId, { subjectType: 'light' })).items.map((a) => a.action)).toEqual(['create']);
		expect((await activity.list(q.projectId, { userId: q.crew.dp.id })).total).toBe(1);
		expect((await activity.list(q.projectId, { q: 'light' })).total).toBe(1);
		expect((await activity.list(q.projectId, { order: 'asc', limit: 1, offset: 1 })).items.map((a) => a.summary)).toEqual(['Set the target']);
	});
});

describe('fixes', () => {
	it('create with who and when; latest per light; list; destroy', async () => {
		const first = await fixes.create(p.projectId, { setupId: p.setupId, lightId: p.lightId, kind: 'gel', fix: { stack: ['cto-quarter'] }, acceptedBy: p.crew.gaffer.id, acceptedAt: new Date('2026-12-01T20:00:00Z') });
		const second = await fixes.create(p.projectId, { setupId: p.setupId, lightId: p.lightId, kind: 'led', fix: { levels: { R: 40 } }, predicted: { duv_prime: 0.001 }, target: { kind: 'cct_duv', cct_k: 3200, duv: 0 }, note: 'closer', acceptedBy: p.crew.dp.id, acceptedAt: new Date('2026-12-01T21:00:00Z') });
		expect(second).toMatchObject({ kind: 'led', fix: { levels: { R: 40 } }, predicted: { duv_prime: 0.001 }, note: 'closer', acceptedByName: 'Test dp' });
		expect((await fixes.latestByLight(p.projectId, { setupId: p.setupId })).get(p.lightId)?.id).toBe(second.id);
		expect((await fixes.list(p.projectId, { lightId: p.lightId })).map((f) => f.id)).toEqual([second.id, first.id]);
		expect(await fixes.destroy(p.projectId, first.id)).toBe(true);
		expect(await fixes.read(p.projectId, first.id)).toBeNull();
	});
});
