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
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
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

/** A project with a bit of everything: targets and locks, circuits, gels and LED settings, files, readings, fixes, comments. */
async function richProject(): Promise<P & { houseReading: number }> {
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
	return { ...p, houseReading: house.id };
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
	const tables: Record<string, unknown[]> = {};
	for (const t of BACKUP_TABLES) {
		tables[t.name] = (b.tables[t.name] ?? [])
			.filter((r) => !(t.name === 'activity' && r.action === 'project.restore'))
			.map((r) => {
				const out: Record<string, unknown> = { ...r };
				delete out.id;
				for (const [col, ref] of Object.entries(t.refs)) if (out[col] != null) out[col] = `${ref}#${index.get(ref)!.get(out[col] as number)}`;
				if (t.subject && out.subject_id != null) {
					const ref = t.subject[out.subject_type as string];
					out.subject_id = ref ? `${ref}#${index.get(ref)!.get(out.subject_id as number)}` : 'project';
				}
				const target = out.target as { kind?: string; readingId?: number } | null;
				if (target?.kind === 'reading') out.target = { ...target, readingId: `readings#${index.get('readings')!.get(target.readingId!)}` };
				return out;
			});
	}
	return { project: b.project, computationVersion: b.computationVersion, tables };
}

describe('backup and restore', () => {
	it('restores into a new project owned by the restorer that backs up the same, ids aside', async () => {
		const p = await richProject();
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
		const newId = Number(res.location!.split('/').pop());
		expect(newId).not.toBe(p.projectId);
		expect(await db('project_members').where({ project_id: newId }).select('user_id', 'role')).toEqual([{ user_id: p.crew.colorist.id, role: 'owner' }]);

		const after = await backupProject(await loadProjectFor(p.crew.colorist, newId));
		expect(normalise(after)).toEqual(normalise(before));
		// The restored target still points at the (new) house tubes reading.
		const setup = after.tables.setups.find((s) => s.name === 'Wide')!;
		expect((setup.target as { readingId: number }).readingId).not.toBe(p.houseReading);
		const resolved = await log.resolveTarget(newId, setup.target as never, 0.002);
		expect(resolved?.label).toBe('reading “House tubes”');
		expect(after.tables.activity.at(-1)).toMatchObject({ action: 'project.restore', user_id: p.crew.colorist.email });
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
		const id = await restoreProject(p.crew.dp, parseBackup(JSON.stringify(b)), { name: 'Named (copy)' });
		expect((await db('projects').where({ id }).first()).name).toBe('Named (copy)');
	});
});
