/** The log's page loads: sorting, filtering and paging, and bad query values that fall back quietly. */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import { loadProjectFor } from '../../../src/lib/server/authz';
import * as log from '../../../src/lib/server/services/log';
import * as daysPage from '../../../src/routes/projects/[projectId]/days/+page.server';
import * as setupPage from '../../../src/routes/projects/[projectId]/setups/[setupId]/+page.server';
import * as reviewPage from '../../../src/routes/projects/[projectId]/review/+page.server';
import * as activityPage from '../../../src/routes/projects/[projectId]/activity/+page.server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { load } from './helpers';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
const P = () => ({ projectId: String(p.projectId) });

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Pages');
	const gaffer = await loadProjectFor(p.crew.gaffer, p.projectId);
	for (let i = 0; i < 30; i++) await log.createDay(gaffer, { date: `2027-01-${String(i + 1).padStart(2, '0')}`, label: i % 2 ? `Night ${i}` : `Day ${i}`, locationName: i === 7 ? 'Harbour (invented)' : 'Stage', mainsVoltage: 120, mainsFrequency: 60, notes: '' });
	await log.createLight(gaffer, p.setupId, { label: 'Zed fill', kind: 'tungsten', role: 'fill', powerW: 650 });
	await log.createLight(gaffer, p.setupId, { label: 'Alpha back', kind: 'hmi', role: 'back', powerW: 1800 });
	for (let i = 0; i < 9; i++) await log.createSetup(gaffer, { shootDayId: p.dayId, name: `Extra ${i}`, notes: '', status: 'planning' });
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('shoot days page', () => {
	it('pages 25 at a time, sorts on a column, finds by location, and ignores a nonsense sort', async () => {
		const first = await load(daysPage.load as never, '/days', { params: P(), user: p.crew.viewer });
		expect(first.data).toMatchObject({ total: 31, pageCount: 2, page: 1 });
		expect(first.data.days).toHaveLength(25);
		const second = await load(daysPage.load as never, '/days?page=2', { params: P(), user: p.crew.viewer });
		expect(second.data.days).toHaveLength(6);
		const desc = await load(daysPage.load as never, '/days?sort=date&order=desc', { params: P(), user: p.crew.viewer });
		expect(desc.data.days[0].date).toBe('2027-01-30');
		const found = await load(daysPage.load as never, '/days?q=harbour', { params: P(), user: p.crew.viewer });
		expect(found.data.days.map((d: { label: string }) => d.label)).toEqual(['Night 7']);
		const odd = await load(daysPage.load as never, '/days?sort=drop%20table&order=sideways&page=-3', { params: P(), user: p.crew.viewer });
		expect(odd.status).toBe(200);
		expect(odd.data.query).toMatchObject({ sort: 'date', order: 'asc', page: 1 });
	});
});

describe('setup page', () => {
	it('sorts lights by label or power and filters by kind and role', async () => {
		const byLabel = await load(setupPage.load as never, '/s?sort=label', { params: { ...P(), setupId: String(p.setupId) }, user: p.crew.viewer });
		expect(byLabel.data.lights.map((l: { label: string }) => l.label)).toEqual(['Alpha back', 'Key panel', 'Zed fill']);
		const byPower = await load(setupPage.load as never, '/s?sort=power&order=desc', { params: { ...P(), setupId: String(p.setupId) }, user: p.crew.viewer });
		// Lights without a draw go last whichever way the column is sorted.
		expect(byPower.data.lights.map((l: { label: string }) => l.label)).toEqual(['Alpha back', 'Zed fill', 'Key panel']);
		const tungsten = await load(setupPage.load as never, '/s?kind=tungsten', { params: { ...P(), setupId: String(p.setupId) }, user: p.crew.viewer });
		expect(tungsten.data.lights.map((l: { label: string }) => l.label)).toEqual(['Zed fill']);
		expect(tungsten.data.lightCount).toBe(3);
		const back = await load(setupPage.load as never, '/s?role=back', { params: { ...P(), setupId: String(p.setupId) }, user: p.crew.viewer });
		expect(back.data.lights.map((l: { label: string }) => l.label)).toEqual(['Alpha back']);
		expect((await load(setupPage.load as never, '/s', { params: { ...P(), setupId: String(p.otherSetupId + 100000) }, user: p.crew.viewer })).status).toBe(404);
		expect((await load(setupPage.load as never, '/s', { params: { ...P(), setupId: 'abc' }, user: p.crew.viewer })).status).toBe(404);
	});
});

describe('review page', () => {
	it('filters by day, setup and light kind, and pages the setups', async () => {
		const all = await load(reviewPage.load as never, '/r', { params: P(), user: p.crew.colorist });
		expect(all.data.review).toMatchObject({ total: 11, pageCount: 2, page: 1 });
		expect(all.data.review.setups).toHaveLength(8);
		const page2 = await load(reviewPage.load as never, '/r?page=2', { params: P(), user: p.crew.colorist });
		expect(page2.data.review.setups).toHaveLength(3);
		const one = await load(reviewPage.load as never, `/r?setup=${p.setupId}`, { params: P(), user: p.crew.colorist });
		expect(one.data.review.setups.map((s: { name: string }) => s.name)).toEqual(['Wide']);
		const hmi = await load(reviewPage.load as never, '/r?kind=hmi', { params: P(), user: p.crew.colorist });
		expect(hmi.data.review.setups).toHaveLength(1);
		expect(hmi.data.review.setups[0].lights.map((l: { light: { label: string } }) => l.light.label)).toEqual(['Alpha back']);
		expect(hmi.data.review.kinds.map((k: { id: string }) => k.id).sort()).toEqual(['hmi', 'led-rgbw', 'tungsten']);
		const otherDay = (await db('shoot_days').where({ project_id: p.projectId, label: 'Night 7' }).first()).id;
		const none = await load(reviewPage.load as never, `/r?day=${otherDay}`, { params: P(), user: p.crew.colorist });
		expect(none.data.review.setups).toEqual([]);
		expect(none.data.review.setupOptions).toEqual([]);
	});
});

describe('activity page', () => {
	it('lists the changes newest first, filtered by what, who and words, 50 a page', async () => {
		const all = await load(activityPage.load as never, '/a', { params: P(), user: p.crew.viewer });
		expect(all.data.total).toBe(30 + 2 + 9);
		expect(all.data.entries).toHaveLength(41);
		expect(all.data.entries[0].summary).toBe('Added setup “Extra 8” on Night 1 (2026-12-01)');
		const lights = await load(activityPage.load as never, '/a?type=light', { params: P(), user: p.crew.viewer });
		expect(lights.data.entries.map((e: { summary: string }) => e.summary)).toEqual(['Added back light “Alpha back” (HMI) to “Wide”', 'Added fill light “Zed fill” (Tungsten) to “Wide”']);
		const byDp = await load(activityPage.load as never, `/a?user=${p.crew.dp.id}`, { params: P(), user: p.crew.viewer });
		expect(byDp.data.entries).toEqual([]);
		const words = await load(activityPage.load as never, '/a?q=Harbour', { params: P(), user: p.crew.viewer });
		expect(words.data.entries).toHaveLength(1);
		const asc = await load(activityPage.load as never, '/a?order=asc', { params: P(), user: p.crew.viewer });
		expect(asc.data.entries[0].summary).toMatch(/^Added shoot day Day 0 \(2027-01-01\)/);
	});
});
