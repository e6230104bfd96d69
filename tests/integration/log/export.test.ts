/** The lighting log's CSV export, the printable report's data, and backup → restore. */
import Papa from 'papaparse';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planckianSpectrum } from '../../../src/lib/colour';
import { closeDb } from '../../../src/lib/server/db';
import * as readingsDb from '../../../src/lib/server/db/readings';
import * as uploads from '../../../src/lib/server/db/uploads';
import { loadProjectFor } from '../../../src/lib/server/authz';
import * as log from '../../../src/lib/server/services/log';
import { analyzeRaw } from '../../../src/lib/server/services/readings';
import { backupProject, parseBackup, restoreProject, BACKUP_TABLES, type ProjectBackup } from '../../../src/lib/server/services/backup';
import { LOG_CSV_COLUMNS } from '../../../src/lib/server/services/export';
import { COMPUTATION_VERSION } from '../../../src/lib/colour';
import * as csvRoute from '../../../src/routes/projects/[projectId]/export/log.csv/+server';
import * as backupRoute from '../../../src/routes/projects/[projectId]/export/backup.json/+server';
import * as exportPage from '../../../src/routes/projects/[projectId]/export/+page.server';
import * as reportPage from '../../../src/routes/projects/[projectId]/export/report/+page.server';
import * as overviewPage from '../../../src/routes/projects/[projectId]/+page.server';
import * as projectGels from '../../../src/routes/api/v1/projects/[projectId]/library/gels/+server';
import * as projectFixtures from '../../../src/routes/api/v1/projects/[projectId]/library/fixtures/+server';
import * as overrideRoute from '../../../src/routes/api/v1/projects/[projectId]/library/overrides/[gelId]/+server';
import * as storage from '../../../src/lib/server/storage';
import { MAX_PHOTO_BYTES } from '../../../src/lib/server/services/photos';
import { testKnex } from '../helpers/db';
import { makeProject, makeUser } from '../helpers/fixtures';
import { call } from '../helpers/route';
import { fixtureForm, gelForm } from '../library/helpers';
import { modelledGelCsv, rgbwCsv } from '../../unit/server/library/factories';
import { askUpload, finish, put, uploadPhoto, type Grant } from '../photos/helpers';
import { notAnImage, photoWithGps, photoWithoutGps, TEST_GPS_DECIMAL } from '../../unit/server/photos/images';
import exifr from 'exifr';
import sharp from 'sharp';
import { waitForMail } from '../auth/helpers/mail';
import { act, get, load } from './helpers';

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
const version = async (table: string, id: number) => (await db(table).where({ id }).first('version')).version as number;
// CIE 15:2004 Table T.3: D65 x, y = 0.31272, 0.32903 (≈ 6504 K); A x, y = 0.44757, 0.40745 (2856 K).
const D65 = { kind: 'chromaticity_xy' as const, x: 0.31272, y: 0.32903 };
const A = { kind: 'chromaticity_xy' as const, x: 0.44757, y: 0.40745 };

/**
 * A project with a bit of everything: targets and locks, circuits, gels and LED settings, files,
 * readings, fixes, comments; with `whole`, also a library of its own and photos.
 */
async function richProject({ whole = false } = {}): Promise<P & { houseReading: number; customGel: string | null }> {
	const p = await makeProject(db, 'Rich');
	const gaffer = await loadProjectFor(p.crew.gaffer, p.projectId);
	const dp = await loadProjectFor(p.crew.dp, p.projectId);
	const colorist = await loadProjectFor(p.crew.colorist, p.projectId);
	const c = await log.createCircuit(gaffer, p.setupId, { label: 'Wall', preset: 'eu-16', volts: 230, amps: 16, derating: 0.8 });
	await log.updateLight(gaffer, p.lightId, { ledSettings: { cct_k: 5600, gm: -10, channels: { R: 40, G: 20, B: 10, W: 80 } }, powerW: 200, circuitId: c.id }, await version('lights', p.lightId));
	const back = await log.createLight(gaffer, p.setupId, { label: 'Tungsten back', kind: 'tungsten', role: 'back', gelStack: ['cto-half'], dimmerPercent: 70, powerW: 650, circuitId: c.id });
	const formula = await log.createLight(gaffer, p.setupId, { label: '=SUM(A1)', kind: 'practical', role: 'practical' });
	const gone = await log.createLight(gaffer, p.otherSetupId, { label: 'Removed later', kind: 'hmi' });
	const house = await log.addReading(gaffer, p.lightId, { label: 'House tubes', raw: D65, takenAt: '2026-12-01T21:00:00.000Z' });
	const spectral = await log.addReading(gaffer, back.id, { label: 'Back spectrum', raw: { kind: 'spectral', spectrum: { ...planckianSpectrum(2856, 380, 780, 5), values: Array.from(planckianSpectrum(2856, 380, 780, 5).values) } }, takenAt: '2026-12-01T21:05:00.000Z' });
	await log.addReading(gaffer, gone.id, { label: 'Gone light', raw: A });
	const bytes = new TextEncoder().encode('label,x,y\nWindow,0.3127,0.329\n');
	const upload = await uploads.create({ projectId: p.projectId, filename: 'window.csv', contentType: 'text/csv', bytes, uploadedBy: p.crew.gaffer.id, report: { format: 'xy' } });
	await readingsDb.create({ projectId: p.projectId, setupId: p.otherSetupId, uploadId: upload.id, sourceRow: 2, label: 'Window', raw: { kind: 'chromaticity_xy', x: 0.3127, y: 0.329 }, computed: analyzeRaw({ kind: 'chromaticity_xy', x: 0.3127, y: 0.329 }), computationVersion: COMPUTATION_VERSION, createdBy: p.crew.gaffer.id });
	const deleted = await log.addReading(gaffer, back.id, { label: 'Mistake', raw: A });
	await readingsDb.destroy(p.projectId, deleted.id, p.crew.gaffer.id);
	await db('column_mappings').insert({ project_id: p.projectId, name: 'Meter layout', mapping: JSON.stringify({ label: 0, x: 1, y: 2 }), created_by: p.crew.gaffer.id });
	await log.deleteLight(gaffer, gone.id);
	await log.setTarget(dp, p.setupId, { kind: 'reading', readingId: house.id }, 0.002, await version('setups', p.setupId));
	await log.lockTarget(dp, p.setupId, true, await version('setups', p.setupId));
	await log.setTarget(dp, p.otherSetupId, { kind: 'cct_duv', cct_k: 3200, duv: 0 }, undefined, await version('setups', p.otherSetupId));
	await log.lockSetup(dp, p.otherSetupId, true, await version('setups', p.otherSetupId));
	await log.acceptFix(gaffer, back.id, { kind: 'gel', fix: { stack: ['cto-half', 'minusgreen-eighth'] }, predicted: { duv_prime: 0.0011 } });
	await log.addComment(colorist, { subjectType: 'setup', subjectId: p.setupId, body: 'The wide matches the house tubes.' }, 'http://127.0.0.1');
	await log.addComment(colorist, { subjectType: 'light', subjectId: back.id, body: 'Warm on purpose?' }, 'http://127.0.0.1');
	await log.addComment(dp, { subjectType: 'reading', subjectId: spectral.id, body: 'Yes, half CTO on purpose.' }, 'http://127.0.0.1');
	void formula;
	if (!whole) return { ...p, houseReading: house.id, customGel: null };

	// The project's library: an override of a built-in filter, a custom filter of its own (used in a
	// gel stack and in an accepted fix), and a fixture profile a light names.
	const prm = { projectId: String(p.projectId) };
	const override = await call(overrideRoute.PUT, '/x', { params: { ...prm, gelId: 'ctb-half' }, user: p.crew.gaffer, method: 'PUT', json: { miredShift: -68, note: 'our swatch book' } });
	expect(override.status).toBe(200);
	const gel = await (await call(projectGels.POST, '/x', { params: prm, user: p.crew.dp, body: gelForm(modelledGelCsv('cto-full'), { name: 'House CTO sheet' }) })).json();
	expect(gel.gelId).toMatch(/^custom-\d+$/);
	const fixture = await (await call(projectFixtures.POST, '/x', { params: prm, user: p.crew.gaffer, body: fixtureForm(rgbwCsv(), { name: 'Our RGBW panel', outputs: JSON.stringify([0.3, 0.6, 0.12, 1]) }) })).json();
	const sheeted = await log.createLight(gaffer, p.setupId, { label: 'Sheeted window', kind: 'daylight', role: 'ambient', gelStack: [gel.gelId, 'ctb-half'] });
	await log.acceptFix(gaffer, sheeted.id, { kind: 'gel', fix: { stack: [gel.gelId] }, predicted: { duv_prime: 0.002 } });
	await log.createLight(gaffer, p.setupId, { label: 'Measured panel', kind: 'led-rgbw', role: 'fill', fixtureProfile: fixture.key });

	// Photos: one of the setup, one of a light, one refused, one never finished (not backed up).
	const jpeg = await photoWithoutGps('jpeg', 320, 240);
	await uploadPhoto(p.projectId, p.crew.gaffer, jpeg, { filename: 'wide.jpg', setupId: p.setupId, caption: 'Wide from the door' });
	await uploadPhoto(p.projectId, p.crew.dp, await photoWithoutGps('png', 200, 100), { filename: 'back.png', type: 'image/png', lightId: back.id });
	const text = notAnImage();
	const refused = (await (await askUpload(p.projectId, p.crew.gaffer, { filename: 'notes.jpg', type: 'image/jpeg', size: text.byteLength, setupId: p.setupId })).json()) as Grant;
	await put(refused, text);
	expect((await finish(p.projectId, p.crew.gaffer, refused.photo.id)).status).toBe(422);
	await askUpload(p.projectId, p.crew.gaffer, { filename: 'half.jpg', type: 'image/jpeg', size: 100, setupId: p.setupId });
	return { ...p, houseReading: house.id, customGel: gel.gelId as string };
}

describe('CSV export', () => {
	it('has the documented header and one row per light per setup, with the last reading, distance and fix', async () => {
		const p = await richProject();
		const r = await get(csvRoute.GET as never, '/e/log.csv', { params: { projectId: String(p.projectId) }, user: p.crew.colorist });
		expect(r.status).toBe(200);
		expect(r.response!.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(r.response!.headers.get('content-disposition')).toMatch(/^attachment; filename="rich-.*-lighting-log-\d{4}-\d{2}-\d{2}\.csv"$/);
		const text = await r.response!.text();
		expect(text.split('\r\n')[0]).toBe(LOG_CSV_COLUMNS.map((c) => c.name).join(','));
		const rows = Papa.parse<Record<string, string>>(text.trim(), { header: true }).data;
		// Wide: key panel, tungsten back, the "=SUM" practical; Close: none left (its one light was removed).
		expect(rows.map((x) => x.light)).toEqual(['Key panel', 'Tungsten back', "'=SUM(A1)"]);
		const key = rows[0];
		expect(key).toMatchObject({ day_date: '2026-12-01', mains: '230 V 50 Hz', setup: 'Wide', setup_status: 'planning', target: 'reading “House tubes”', role: 'key', kind: 'led-rgbw', led_settings: '5600 K, G/M -10, R 40, G 20, B 10, W 80', power_w: '200', circuit: 'Wall', reading: 'House tubes', reading_taken_at: '2026-12-01T21:00:00.000Z', distance_duv_prime: '0', on_target: 'yes', changed_by: 'Test gaffer' });
		expect(Number(key.target_cct_k)).toBeCloseTo(6504, -1); // CIE 15:2004 Table T.3: D65 ≈ 6504 K
		expect(key.target_x).toBe('0.3127');
		expect(key.reading_ra).toBe('');
		const back = rows[1];
		// A Planckian at 2856 K is CIE illuminant A's definition (CIE 15:2004 §6.1): CCT 2856 K, Ra 100.
		expect(Number(back.reading_cct_k)).toBeCloseTo(2856, -1);
		expect(Number(back.reading_ra)).toBeCloseTo(100, 0);
		expect(Number(back.distance_duv_prime)).toBeCloseTo(0.0808, 2); // derived from the published xy of A and D65
		expect(back).toMatchObject({ on_target: 'no', gel_stack: '½ CTO + ⅛ minus green', dimmer_percent: '70', fix_kind: 'gel', fix_accepted_by: 'Test gaffer' });
		expect(back.fix_setting).toMatch(/CTO/);
		expect(back.fix_accepted_at).toMatch(/^\d{4}-\d{2}-\d{2}T/);
		expect(rows[2].reading).toBe('');
	});

	it('follows the review filters (?kind=) and is refused to a viewer', async () => {
		const p = await richProject();
		const r = await get(csvRoute.GET as never, '/e/log.csv?kind=tungsten', { params: { projectId: String(p.projectId) }, user: p.crew.gaffer });
		const rows = Papa.parse<Record<string, string>>((await r.response!.text()).trim(), { header: true }).data;
		expect(rows.map((x) => x.light)).toEqual(['Tungsten back']);
		expect((await get(csvRoute.GET as never, '/e/log.csv', { params: { projectId: String(p.projectId) }, user: p.crew.viewer })).status).toBe(403);
	});

	it('the report holds every setup on one page', async () => {
		const p = await richProject();
		for (let i = 0; i < 10; i++) await db('setups').insert({ project_id: p.projectId, shoot_day_id: p.dayId, name: `Extra ${i}` });
		const r = await load(reportPage.load as never, '/e/report', { params: { projectId: String(p.projectId) }, user: p.crew.colorist });
		expect(r.data.review.setups).toHaveLength(12);
		expect(r.data.review.pageCount).toBe(1);
	});
});

/** A backup with ids replaced by positions, so two backups of equal projects compare equal. */
function normalise(b: ProjectBackup) {
	const index = new Map<string, Map<number, number>>();
	for (const t of BACKUP_TABLES) index.set(t.name, new Map((b.tables[t.name] ?? []).map((r, i) => [r.id as number, i])));
	const pos = (table: string, id: unknown) => (id == null ? id : `${table}#${index.get(table)!.get(id as number)}`);
	// Custom filters of the project are named by row id in gel stacks and fixes.
	const gels = (v: unknown): unknown => {
		if (typeof v === 'string' && /^custom-\d+$/.test(v) && index.get('library_custom_gels')!.has(Number(v.slice(7)))) return pos('library_custom_gels', Number(v.slice(7)));
		if (Array.isArray(v)) return v.map(gels);
		if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, gels(x)]));
		return v;
	};
	const tables: Record<string, unknown[]> = {};
	for (const t of BACKUP_TABLES) {
		tables[t.name] = (b.tables[t.name] ?? [])
			.filter((r) => !(t.name === 'activity' && r.action === 'project.restore'))
			.map((r) => {
				const out = gels({ ...r }) as Record<string, unknown>;
				delete out.id;
				for (const [col, ref] of Object.entries(t.refs)) if (out[col] != null) out[col] = pos(ref, out[col]);
				if (t.subject && out.subject_id != null) {
					const ref = t.subject[out.subject_type as string];
					out.subject_id = ref ? pos(ref, out.subject_id) : 'project';
				}
				const target = out.target as { kind?: string; readingId?: number } | null;
				if (target?.kind === 'reading') out.target = { ...target, readingId: pos('readings', target.readingId) };
				const d = out.details as Record<string, unknown> | null;
				if (t.name === 'activity' && d) {
					for (const [key, ref] of Object.entries({ setupId: 'setups', lightId: 'lights', fixId: 'accepted_fixes', readingId: 'readings' })) if (typeof d[key] === 'number') d[key] = pos(ref, d[key]);
					const subject = ({ setup: 'setups', light: 'lights', reading: 'readings' } as Record<string, string>)[d.subjectType as string];
					if (subject && typeof d.subjectId === 'number') d.subjectId = pos(subject, d.subjectId);
				}
				return out;
			});
	}
	return { project: b.project, computationVersion: b.computationVersion, tables };
}

describe('backup and restore', () => {
	it('restores into a new project owned by the restorer that backs up the same, library and photos included, ids aside', async () => {
		const p = await richProject({ whole: true });
		const access = await loadProjectFor(p.crew.owner, p.projectId);
		const before = await backupProject(access);
		expect(before.tables.readings.length).toBe(5);
		expect(before.tables.readings.find((r) => r.label === 'Back spectrum')!.raw).toMatchObject({ kind: 'spectral', spectrum: { start: 380, interval: 5 } });
		expect(before.tables.uploads[0].content).toEqual({ base64: Buffer.from('label,x,y\nWindow,0.3127,0.329\n').toString('base64') });
		expect(before.tables.comments[0].author_id).toBe(p.crew.colorist.email);
		expect(before.members).toHaveLength(5);

		// Through the page: the file as uploaded, restored by the colorist.
		const file = new File([JSON.stringify(before)], 'backup.json', { type: 'application/json' });
		const res = await act(exportPage.actions as never, 'restore', '/e', { params: { projectId: String(p.projectId) }, user: p.crew.colorist, form: { backup: file, name: '' } });
		expect(res.status).toBe(303);
		const newId = Number(new URL(res.location!, 'http://x').pathname.split('/').pop());
		expect(newId).not.toBe(p.projectId);
		expect(await db('project_members').where({ project_id: newId }).select('user_id', 'role')).toEqual([{ user_id: p.crew.colorist.id, role: 'owner' }]);

		expect(res.location).toBe(`/projects/${newId}?restored=1`);

		const after = await backupProject(await loadProjectFor(p.crew.colorist, newId));
		expect(normalise(after)).toEqual(normalise(before));
		// The library came along, custom filter ids rewritten where a stack or a fix names them.
		expect(before.tables.library_filter_overrides).toHaveLength(1);
		expect(before.tables.library_custom_gels.map((g) => g.name)).toEqual(['House CTO sheet']);
		expect(before.tables.library_fixture_profiles.map((f) => f.profile_key)).toEqual(['our-rgbw-panel']);
		expect((before.tables.library_custom_gels[0].source_csv as { base64: string }).base64.length).toBeGreaterThan(100);
		const newGel = `custom-${after.tables.library_custom_gels[0].id}`;
		expect(newGel).not.toBe(p.customGel);
		// Accepting the fix set the light's stack to it.
		expect(after.tables.lights.find((l) => l.label === 'Sheeted window')!.gel_stack).toEqual([newGel]);
		expect(after.tables.accepted_fixes.at(-1)!.fix).toEqual({ stack: [newGel] });
		expect(await db('library_custom_gels').where({ project_id: newId }).first('scope_id')).toEqual({ scope_id: newId });
		// Photos: the ready ones with their bytes, the refused one as a row, the unfinished one not at all;
		// the objects are in storage again under the new project.
		expect(before.tables.photos.map((ph) => [ph.original_name, ph.status])).toEqual([['wide.jpg', 'ready'], ['back.png', 'ready'], ['notes.jpg', 'rejected']]);
		expect(before.tables.photos[0].objects).toMatchObject({ original: { base64: expect.any(String) }, thumbnail: { base64: expect.any(String) } });
		const restoredPhotos = await db('photos').where({ project_id: newId }).orderBy('id');
		for (const ph of restoredPhotos.filter((x) => x.status === 'ready')) {
			expect(ph.original_key).toMatch(new RegExp(`^projects/${newId}/photos/${ph.id}/original\\.(jpg|png)$`));
			const bytes = Buffer.from((await storage.read(ph.original_key, MAX_PHOTO_BYTES))!);
			const was = before.tables.photos.find((x) => x.original_name === ph.original_name)!.objects as { original: { base64: string } };
			expect(bytes.toString('base64')).toBe(was.original.base64);
		}
		// The activity links a restored photo to its restored setup and light.
		const photoEntry = after.tables.activity.find((a) => a.summary === 'Added photo “back.png” of light “Tungsten back” in setup “Wide”')!;
		expect((photoEntry.details as { lightId: number }).lightId).toBe(after.tables.lights.find((l) => l.label === 'Tungsten back')!.id);
		// The restored target still points at the (new) house tubes reading.
		const setup = after.tables.setups.find((s) => s.name === 'Wide')!;
		expect((setup.target as { readingId: number }).readingId).not.toBe(p.houseReading);
		const resolved = await log.resolveTarget(newId, setup.target as never, 0.002);
		expect(resolved?.label).toBe('reading “House tubes”');
		expect(after.tables.activity.at(-1)).toMatchObject({ action: 'project.restore', user_id: p.crew.colorist.email });
	});

	it('brings the crew along when asked: people already working with the restorer join with their roles, others are invited', async () => {
		const p = await richProject();
		const before = await backupProject(await loadProjectFor(p.crew.owner, p.projectId));
		// Two more people in the file: one with an account here who shares no project with the restorer,
		// one with no account here at all. Both are invited; neither is added.
		const loner = await makeUser(db, 'Loner');
		const newcomer = `newcomer-${Date.now().toString(36)}@example.test`;
		const file = { ...before, members: [...before.members, { email: loner.email, name: 'Loner', role: 'gaffer' }, { email: newcomer, name: 'Newcomer', role: 'viewer' }, { email: 'not an address', name: 'x', role: 'viewer' }, { email: 'someone@example.test', name: 'y', role: 'producer' }] };
		const since = new Date();
		const res = await act(exportPage.actions as never, 'restore', '/e', {
			params: { projectId: String(p.projectId) },
			user: p.crew.colorist,
			form: { backup: new File([JSON.stringify(file)], 'backup.json', { type: 'application/json' }), name: 'With the crew', keepMembers: 'on' }
		});
		expect(res.status).toBe(303);
		const newId = Number(new URL(res.location!, 'http://x').pathname.split('/').pop());
		expect(res.location).toBe(`/projects/${newId}?restored=1&added=4&invited=2&mailFailed=0`);
		const roles = Object.fromEntries((await db('project_members').where({ project_id: newId }).select('user_id', 'role')).map((m) => [m.user_id, m.role]));
		expect(roles).toEqual({ [p.crew.colorist.id]: 'owner', [p.crew.owner.id]: 'owner', [p.crew.dp.id]: 'dp', [p.crew.gaffer.id]: 'gaffer', [p.crew.viewer.id]: 'viewer' });
		const invited = await db('invitations').where({ project_id: newId }).orderBy('email').select('email', 'role', 'invited_by', 'used_at');
		expect(invited).toEqual([loner.email, newcomer].sort().map((email) => ({ email, role: email === newcomer ? 'viewer' : 'gaffer', invited_by: p.crew.colorist.id, used_at: null })));
		const mail = await waitForMail(newcomer, { subject: /invited you/, since });
		expect(mail.mail.subject).toContain('With the crew');
		expect((await db('activity').where({ project_id: newId, action: 'project.restore' }).first()).summary).toMatch(/; 4 of the crew added, 2 invited by e-mail$/);
		// The project page says so.
		const page = await load(overviewPage.load as never, res.location!, { params: { projectId: String(newId) }, user: p.crew.colorist });
		expect(page.data.restored).toEqual({ added: 4, invited: 2, mailFailed: 0 });
	});

	it('a photo in the file that is not an image refuses the whole restore and leaves nothing in storage', async () => {
		const p = await makeProject(db, 'Bad photo');
		const good = await photoWithoutGps();
		await uploadPhoto(p.projectId, p.crew.gaffer, good, { setupId: p.setupId });
		const b = await backupProject(await loadProjectFor(p.crew.owner, p.projectId));
		const projectsBefore = Number((await db('projects').count({ n: '*' }))[0].n);
		const bad = structuredClone(b);
		bad.tables.photos.push({ ...bad.tables.photos[0], id: 999_999, objects: { original: { base64: Buffer.from('<html>not a photo</html>').toString('base64') }, thumbnail: null } });
		await expect(restoreProject(p.crew.owner, parseBackup(JSON.stringify(bad)))).rejects.toMatchObject({ logCode: 'invalid', message: expect.stringMatching(/photo 999999 could not be restored/) });
		expect(Number((await db('projects').count({ n: '*' }))[0].n)).toBe(projectsBefore);
		const next = Number((await db.raw('SELECT AUTO_INCREMENT AS n FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ?', ['projects']))[0][0].n);
		// Whatever id the failed restore used (after this test's own project), nothing is stored under it.
		expect(next).toBeGreaterThan(p.projectId + 1);
		for (let id = p.projectId + 1; id < next; id++) expect(await storage.list(`projects/${id}/`)).toEqual([]);
		expect(await storage.list(`projects/${p.projectId}/`)).toHaveLength(2);
	});

	it('a photo in a file that still carries a location is cleaned on the way in; a missing thumbnail is made again', async () => {
		const p = await makeProject(db, 'GPS photo');
		await uploadPhoto(p.projectId, p.crew.gaffer, await photoWithoutGps(), { setupId: p.setupId });
		const b = structuredClone(await backupProject(await loadProjectFor(p.crew.owner, p.projectId)));
		const withGps = await photoWithGps('jpeg', 640, 480);
		expect(await exifr.gps(withGps)).toEqual(TEST_GPS_DECIMAL);
		b.tables.photos[0].objects = { original: { base64: withGps.toString('base64') }, thumbnail: null };
		const { projectId } = await restoreProject(p.crew.owner, parseBackup(JSON.stringify(b)));
		const row = await db('photos').where({ project_id: projectId }).first();
		const stored = Buffer.from((await storage.read(row.original_key, MAX_PHOTO_BYTES))!);
		expect(await exifr.gps(stored)).toBeUndefined();
		expect(row).toMatchObject({ status: 'ready', content_type: 'image/jpeg', width: 640, height: 480, thumbnail_width: 480, thumbnail_height: 360, bytes: stored.byteLength });
		expect((await sharp((await storage.read(row.thumbnail_key, MAX_PHOTO_BYTES))!).metadata()).format).toBe('webp');
	});

	it('the backup route answers a download; bad files are refused in a sentence and change nothing', async () => {
		const p = await makeProject(db, 'Backup route');
		const r = await get(backupRoute.GET as never, '/e/backup.json', { params: { projectId: String(p.projectId) }, user: p.crew.colorist });
		expect(r.response!.headers.get('content-disposition')).toMatch(/backup-\d{4}-\d{2}-\d{2}\.json"$/);
		const body = (await r.response!.json()) as ProjectBackup;
		expect(body).toMatchObject({ format: 'chromaslate-project-backup', formatVersion: 1, project: { name: expect.stringMatching(/^Backup route/) } });
		expect(() => parseBackup('{nope')).toThrow(/not JSON/);
		expect(() => parseBackup(JSON.stringify({ format: 'something-else' }))).toThrow(/not a Chromaslate project backup/);
		expect(() => parseBackup(JSON.stringify({ ...body, formatVersion: 2 }))).toThrow(/another version/);
		const projectsBefore = (await db('projects').count({ n: '*' }))[0].n;
		const broken = { ...body, tables: { ...body.tables, setups: [{ id: 1, shoot_day_id: 12345, name: 'Orphan' }] } };
		await expect(restoreProject(p.crew.owner, parseBackup(JSON.stringify(broken)))).rejects.toMatchObject({ logCode: 'invalid' });
		expect((await db('projects').count({ n: '*' }))[0].n).toBe(projectsBefore);
		const page = await act(exportPage.actions as never, 'restore', '/e', { params: { projectId: String(p.projectId) }, user: p.crew.viewer, form: { backup: new File(['[]'], 'x.json'), name: 'Copy' } });
		expect(page.status).toBe(400);
		expect(page.data).toMatchObject({ action: 'restore', values: { name: 'Copy' } });
	});

	it('a restored copy takes a new name when given one', async () => {
		const p = await makeProject(db, 'Named');
		const b = await backupProject(await loadProjectFor(p.crew.owner, p.projectId));
		const { projectId: id } = await restoreProject(p.crew.dp, parseBackup(JSON.stringify(b)), { name: 'Named (copy)' });
		expect((await db('projects').where({ id }).first()).name).toBe('Named (copy)');
	});
});
