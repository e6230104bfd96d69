/**
 * Who may do what: every page load, form action and API route of the lighting log, called by each
 * role of a project, by someone not on it, and by nobody signed in. The expected sets follow the
 * product's role table (owner / DP / gaffer / colorist / viewer), written out here by hand rather
 * than read from the permission code, so a change to either shows up.
 */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import type { SessionUser } from '../../../src/lib/server/auth/types';
import { testKnex } from '../helpers/db';
import { makeProject, type Crew } from '../helpers/fixtures';
import { call } from '../helpers/route';
import { act, get, load, type Outcome } from './helpers';

import * as daysPage from '../../../src/routes/projects/[projectId]/days/+page.server';
import * as dayPage from '../../../src/routes/projects/[projectId]/days/[dayId]/+page.server';
import * as setupPage from '../../../src/routes/projects/[projectId]/setups/[setupId]/+page.server';
import * as lightPage from '../../../src/routes/projects/[projectId]/setups/[setupId]/lights/[lightId]/+page.server';
import * as reviewPage from '../../../src/routes/projects/[projectId]/review/+page.server';
import * as activityPage from '../../../src/routes/projects/[projectId]/activity/+page.server';
import * as exportPage from '../../../src/routes/projects/[projectId]/export/+page.server';
import * as reportPage from '../../../src/routes/projects/[projectId]/export/report/+page.server';
import * as csvRoute from '../../../src/routes/projects/[projectId]/export/log.csv/+server';
import * as backupRoute from '../../../src/routes/projects/[projectId]/export/backup.json/+server';
import * as apiProject from '../../../src/routes/api/v1/projects/[projectId]/+server';
import * as apiDays from '../../../src/routes/api/v1/projects/[projectId]/days/+server';
import * as apiDay from '../../../src/routes/api/v1/projects/[projectId]/days/[dayId]/+server';
import * as apiSetups from '../../../src/routes/api/v1/projects/[projectId]/setups/+server';
import * as apiSetup from '../../../src/routes/api/v1/projects/[projectId]/setups/[setupId]/+server';
import * as apiTarget from '../../../src/routes/api/v1/projects/[projectId]/setups/[setupId]/target/+server';
import * as apiTargetLock from '../../../src/routes/api/v1/projects/[projectId]/setups/[setupId]/target-lock/+server';
import * as apiLock from '../../../src/routes/api/v1/projects/[projectId]/setups/[setupId]/lock/+server';
import * as apiLights from '../../../src/routes/api/v1/projects/[projectId]/lights/+server';
import * as apiLight from '../../../src/routes/api/v1/projects/[projectId]/lights/[lightId]/+server';
import * as apiFixes from '../../../src/routes/api/v1/projects/[projectId]/lights/[lightId]/fixes/+server';
import * as apiComments from '../../../src/routes/api/v1/projects/[projectId]/comments/+server';
import * as apiComment from '../../../src/routes/api/v1/projects/[projectId]/comments/[commentId]/+server';

const MEMBERS = ['owner', 'dp', 'gaffer', 'colorist', 'viewer'] as const;
type Who = (typeof MEMBERS)[number] | 'stranger' | 'nobody';
const EVERYONE: Who[] = ['owner', 'dp', 'gaffer', 'colorist', 'viewer', 'stranger', 'nobody'];

/** The product's role table. */
const ALL = ['owner', 'dp', 'gaffer', 'colorist', 'viewer'];
const REVIEW = ['owner', 'dp', 'gaffer', 'colorist'];
const CREW = ['owner', 'dp', 'gaffer'];
const LEAD = ['owner', 'dp'];

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
let crew: Crew;
let pid: string;

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Matrix');
	crew = p.crew;
	pid = String(p.projectId);
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

// ——— Fresh rows, so every allowed call can really succeed ———
const ins = async (table: string, row: Record<string, unknown>) => Number((await db(table).insert({ project_id: p.projectId, ...row }))[0]);
const freshDay = () => ins('shoot_days', { shoot_date: '2026-12-03', label: 'Spare', mains_voltage: 230, mains_frequency: 50 });
const freshSetup = (extra: Record<string, unknown> = {}) => ins('setups', { shoot_day_id: p.dayId, name: 'Spare setup', ...extra });
const freshLight = async (setupId?: number) => ins('lights', { setup_id: setupId ?? (await freshSetup()), label: 'Spare light', kind: 'tungsten' });
const freshCircuit = async (setupId: number) => ins('circuits', { setup_id: setupId, label: 'Spare circuit', volts: 230, amps: 16, derating: 0.8 });
const freshComment = (authorId: number, subjectType = 'setup', subjectId = p.setupId) => ins('comments', { subject_type: subjectType, subject_id: subjectId, author_id: authorId, body: 'Spare comment' });
const target = JSON.stringify({ kind: 'cct_duv', cct_k: 3200, duv: 0 });
const lightForm = { label: 'Matrix light', role: 'fill', kind: 'tungsten', powerW: '650' };
const dayForm = { date: '2026-12-04', label: 'Matrix day', locationName: 'Here', mainsVoltage: '230', mainsFrequency: '50', notes: '' };
const backupFile = () => new File([JSON.stringify({ format: 'chromaslate-project-backup', formatVersion: 1, project: { name: 'Matrix restore' }, tables: {} })], 'backup.json', { type: 'application/json' });

type Run = (u: SessionUser | null) => Promise<Outcome>;
interface Case {
	name: string;
	allowed: string[];
	kind: 'page' | 'api';
	run: Run;
}

const setupP = (setupId: number) => ({ projectId: pid, setupId: String(setupId) });
const lightP = async (lightId: number) => ({ projectId: pid, setupId: String((await db('lights').where({ id: lightId }).first()).setup_id), lightId: String(lightId) });
const api = async (handler: Parameters<typeof call>[0], path: string, o: Parameters<typeof call>[2]): Promise<Outcome> => {
	const r = await call(handler, path, o);
	return { status: r.status, data: r.status === 204 ? null : await r.json().catch(() => null) };
};

const cases: Case[] = [
	// Page loads
	{ name: 'load /days', allowed: ALL, kind: 'page', run: (u) => load(daysPage.load as never, '/days', { params: { projectId: pid }, user: u }) },
	{ name: 'load /days/:id', allowed: ALL, kind: 'page', run: (u) => load(dayPage.load as never, '/d', { params: { projectId: pid, dayId: String(p.dayId) }, user: u }) },
	{ name: 'load /setups/:id', allowed: ALL, kind: 'page', run: (u) => load(setupPage.load as never, '/s', { params: setupP(p.setupId), user: u }) },
	{ name: 'load /setups/:id/lights/:id', allowed: ALL, kind: 'page', run: async (u) => load(lightPage.load as never, '/l', { params: await lightP(p.lightId), user: u }) },
	{ name: 'load /review', allowed: ALL, kind: 'page', run: (u) => load(reviewPage.load as never, '/r', { params: { projectId: pid }, user: u }) },
	{ name: 'load /activity', allowed: ALL, kind: 'page', run: (u) => load(activityPage.load as never, '/a', { params: { projectId: pid }, user: u }) },
	{ name: 'load /export', allowed: ALL, kind: 'page', run: (u) => load(exportPage.load as never, '/e', { params: { projectId: pid }, user: u }) },
	{ name: 'load /export/report', allowed: REVIEW, kind: 'page', run: (u) => load(reportPage.load as never, '/e/report', { params: { projectId: pid }, user: u }) },
	{ name: 'GET /export/log.csv', allowed: REVIEW, kind: 'page', run: (u) => get(csvRoute.GET as never, '/e/log.csv', { params: { projectId: pid }, user: u }) },
	{ name: 'GET /export/backup.json', allowed: REVIEW, kind: 'page', run: (u) => get(backupRoute.GET as never, '/e/backup.json', { params: { projectId: pid }, user: u }) },

	// Form actions
	{ name: 'days ?/create', allowed: CREW, kind: 'page', run: (u) => act(daysPage.actions as never, 'create', '/days', { params: { projectId: pid }, user: u, form: dayForm }) },
	{ name: 'day ?/update', allowed: CREW, kind: 'page', run: async (u) => act(dayPage.actions as never, 'update', '/d', { params: { projectId: pid, dayId: String(await freshDay()) }, user: u, form: { ...dayForm, version: 1 } }) },
	{ name: 'day ?/delete', allowed: CREW, kind: 'page', run: async (u) => act(dayPage.actions as never, 'delete', '/d', { params: { projectId: pid, dayId: String(await freshDay()) }, user: u }) },
	{ name: 'day ?/createSetup', allowed: CREW, kind: 'page', run: (u) => act(dayPage.actions as never, 'createSetup', '/d', { params: { projectId: pid, dayId: String(p.dayId) }, user: u, form: { name: 'From matrix', status: 'planning' } }) },
	{ name: 'setup ?/update', allowed: CREW, kind: 'page', run: async (u) => act(setupPage.actions as never, 'update', '/s', { params: setupP(await freshSetup()), user: u, form: { name: 'Renamed', status: 'lit', notes: '', version: 1 } }) },
	{ name: 'setup ?/delete', allowed: CREW, kind: 'page', run: async (u) => act(setupPage.actions as never, 'delete', '/s', { params: setupP(await freshSetup()), user: u }) },
	{ name: 'setup ?/setTarget', allowed: LEAD, kind: 'page', run: async (u) => act(setupPage.actions as never, 'setTarget', '/s', { params: setupP(await freshSetup()), user: u, form: { kind: 'illuminant', name: 'D65', version: 1 } }) },
	{ name: 'setup ?/clearTarget', allowed: LEAD, kind: 'page', run: async (u) => act(setupPage.actions as never, 'clearTarget', '/s', { params: setupP(await freshSetup({ target })), user: u, form: { version: 1 } }) },
	{ name: 'setup ?/lockTarget', allowed: LEAD, kind: 'page', run: async (u) => act(setupPage.actions as never, 'lockTarget', '/s', { params: setupP(await freshSetup({ target })), user: u, form: { version: 1 } }) },
	{ name: 'setup ?/unlockTarget', allowed: LEAD, kind: 'page', run: async (u) => act(setupPage.actions as never, 'unlockTarget', '/s', { params: setupP(await freshSetup({ target, target_locked_at: new Date() })), user: u, form: { version: 1 } }) },
	{ name: 'setup ?/lock', allowed: LEAD, kind: 'page', run: async (u) => act(setupPage.actions as never, 'lock', '/s', { params: setupP(await freshSetup()), user: u, form: { version: 1 } }) },
	{ name: 'setup ?/unlock', allowed: LEAD, kind: 'page', run: async (u) => act(setupPage.actions as never, 'unlock', '/s', { params: setupP(await freshSetup({ locked_at: new Date() })), user: u, form: { version: 1 } }) },
	{ name: 'setup ?/addLight', allowed: CREW, kind: 'page', run: async (u) => act(setupPage.actions as never, 'addLight', '/s', { params: setupP(await freshSetup()), user: u, form: lightForm }) },
	{ name: 'setup ?/addCircuit', allowed: CREW, kind: 'page', run: async (u) => act(setupPage.actions as never, 'addCircuit', '/s', { params: setupP(await freshSetup()), user: u, form: { label: 'Wall', preset: 'eu-16' } }) },
	{
		name: 'setup ?/updateCircuit',
		allowed: CREW,
		kind: 'page',
		run: async (u) => {
			const s = await freshSetup();
			return act(setupPage.actions as never, 'updateCircuit', '/s', { params: setupP(s), user: u, form: { circuitId: await freshCircuit(s), label: 'Wall', volts: '230', amps: '13', derating: '80', version: 1 } });
		}
	},
	{
		name: 'setup ?/deleteCircuit',
		allowed: CREW,
		kind: 'page',
		run: async (u) => {
			const s = await freshSetup();
			return act(setupPage.actions as never, 'deleteCircuit', '/s', { params: setupP(s), user: u, form: { circuitId: await freshCircuit(s) } });
		}
	},
	{ name: 'setup ?/comment', allowed: REVIEW, kind: 'page', run: (u) => act(setupPage.actions as never, 'comment', '/s', { params: setupP(p.setupId), user: u, form: { subjectType: 'setup', subjectId: p.setupId, body: 'Looks warm.' } }) },
	{ name: 'setup ?/deleteComment', allowed: REVIEW, kind: 'page', run: async (u) => act(setupPage.actions as never, 'deleteComment', '/s', { params: setupP(p.setupId), user: u, form: { commentId: await freshComment(u?.id ?? crew.owner.id) } }) },
	{ name: 'light ?/update', allowed: CREW, kind: 'page', run: async (u) => act(lightPage.actions as never, 'update', '/l', { params: await lightP(await freshLight()), user: u, form: { ...lightForm, version: 1 } }) },
	{ name: 'light ?/delete', allowed: CREW, kind: 'page', run: async (u) => act(lightPage.actions as never, 'delete', '/l', { params: await lightP(await freshLight()), user: u }) },
	{ name: 'light ?/addReading', allowed: CREW, kind: 'page', run: async (u) => act(lightPage.actions as never, 'addReading', '/l', { params: await lightP(await freshLight()), user: u, form: { entry: 'cct_duv', cct_k: '3200', duv: '0' } }) },
	{ name: 'light ?/comment', allowed: REVIEW, kind: 'page', run: async (u) => act(lightPage.actions as never, 'comment', '/l', { params: await lightP(p.lightId), user: u, form: { subjectType: 'light', subjectId: p.lightId, body: 'Green?' } }) },
	{ name: 'light ?/deleteComment', allowed: REVIEW, kind: 'page', run: async (u) => act(lightPage.actions as never, 'deleteComment', '/l', { params: await lightP(p.lightId), user: u, form: { commentId: await freshComment(u?.id ?? crew.owner.id, 'light', p.lightId) } }) },
	{ name: 'review ?/comment', allowed: REVIEW, kind: 'page', run: (u) => act(reviewPage.actions as never, 'comment', '/r', { params: { projectId: pid }, user: u, form: { subjectType: 'setup', subjectId: p.setupId, body: 'Note' } }) },
	{ name: 'review ?/deleteComment', allowed: REVIEW, kind: 'page', run: async (u) => act(reviewPage.actions as never, 'deleteComment', '/r', { params: { projectId: pid }, user: u, form: { commentId: await freshComment(u?.id ?? crew.owner.id) } }) },
	{ name: 'export ?/share', allowed: REVIEW, kind: 'page', run: (u) => act(exportPage.actions as never, 'share', '/e', { params: { projectId: pid }, user: u, form: { userId: u?.id === crew.viewer.id ? crew.owner.id : crew.viewer.id, note: 'Matrix' } }) },
	{ name: 'export ?/restore', allowed: ALL, kind: 'page', run: (u) => act(exportPage.actions as never, 'restore', '/e', { params: { projectId: pid }, user: u, form: { backup: backupFile(), name: '' } }) },

	// JSON API
	{ name: 'GET /api/…/project', allowed: ALL, kind: 'api', run: (u) => api(apiProject.GET as never, '/api', { params: { projectId: pid }, user: u }) },
	{
		name: 'PATCH /api/…/project',
		allowed: LEAD,
		kind: 'api',
		run: async (u) => {
			const { version } = await db('projects').where({ id: p.projectId }).first('version');
			return api(apiProject.PATCH as never, '/api', { params: { projectId: pid }, user: u, method: 'PATCH', json: { version, notes: `Invented; edited by ${u?.name ?? 'nobody'}` } });
		}
	},
	{ name: 'GET /api/…/days', allowed: ALL, kind: 'api', run: (u) => api(apiDays.GET as never, '/api', { params: { projectId: pid }, user: u }) },
	{ name: 'POST /api/…/days', allowed: CREW, kind: 'api', run: (u) => api(apiDays.POST as never, '/api', { params: { projectId: pid }, user: u, json: { date: '2026-12-06', mainsVoltage: 230, mainsFrequency: 50 } }) },
	{ name: 'GET /api/…/days/:id', allowed: ALL, kind: 'api', run: (u) => api(apiDay.GET as never, '/api', { params: { projectId: pid, dayId: String(p.dayId) }, user: u }) },
	{ name: 'PATCH /api/…/days/:id', allowed: CREW, kind: 'api', run: async (u) => api(apiDay.PATCH as never, '/api', { params: { projectId: pid, dayId: String(await freshDay()) }, user: u, method: 'PATCH', json: { version: 1, label: 'Patched' } }) },
	{ name: 'DELETE /api/…/days/:id', allowed: CREW, kind: 'api', run: async (u) => api(apiDay.DELETE as never, '/api', { params: { projectId: pid, dayId: String(await freshDay()) }, user: u, method: 'DELETE' }) },
	{ name: 'GET /api/…/setups', allowed: ALL, kind: 'api', run: (u) => api(apiSetups.GET as never, '/api', { params: { projectId: pid }, user: u }) },
	{ name: 'POST /api/…/setups', allowed: CREW, kind: 'api', run: (u) => api(apiSetups.POST as never, '/api', { params: { projectId: pid }, user: u, json: { shootDayId: p.dayId, name: 'API setup' } }) },
	{ name: 'GET /api/…/setups/:id', allowed: ALL, kind: 'api', run: (u) => api(apiSetup.GET as never, '/api', { params: setupP(p.setupId), user: u }) },
	{ name: 'PATCH /api/…/setups/:id', allowed: CREW, kind: 'api', run: async (u) => api(apiSetup.PATCH as never, '/api', { params: setupP(await freshSetup()), user: u, method: 'PATCH', json: { version: 1, status: 'lit' } }) },
	{ name: 'DELETE /api/…/setups/:id', allowed: CREW, kind: 'api', run: async (u) => api(apiSetup.DELETE as never, '/api', { params: setupP(await freshSetup()), user: u, method: 'DELETE' }) },
	{ name: 'PUT /api/…/setups/:id/target', allowed: LEAD, kind: 'api', run: async (u) => api(apiTarget.PUT as never, '/api', { params: setupP(await freshSetup()), user: u, method: 'PUT', json: { version: 1, target: { kind: 'illuminant', name: 'A' } } }) },
	{ name: 'PUT /api/…/setups/:id/target-lock', allowed: LEAD, kind: 'api', run: async (u) => api(apiTargetLock.PUT as never, '/api', { params: setupP(await freshSetup({ target })), user: u, method: 'PUT', json: { version: 1, locked: true } }) },
	{ name: 'PUT /api/…/setups/:id/lock', allowed: LEAD, kind: 'api', run: async (u) => api(apiLock.PUT as never, '/api', { params: setupP(await freshSetup()), user: u, method: 'PUT', json: { version: 1, locked: true } }) },
	{ name: 'GET /api/…/lights', allowed: ALL, kind: 'api', run: (u) => api(apiLights.GET as never, '/api', { params: { projectId: pid }, user: u, query: { setup: p.setupId } }) },
	{ name: 'POST /api/…/lights', allowed: CREW, kind: 'api', run: async (u) => api(apiLights.POST as never, '/api', { params: { projectId: pid }, user: u, json: { setupId: await freshSetup(), label: 'API light', kind: 'hmi', powerW: 1200 } }) },
	{ name: 'GET /api/…/lights/:id', allowed: ALL, kind: 'api', run: (u) => api(apiLight.GET as never, '/api', { params: { projectId: pid, lightId: String(p.lightId) }, user: u }) },
	{ name: 'PATCH /api/…/lights/:id', allowed: CREW, kind: 'api', run: async (u) => api(apiLight.PATCH as never, '/api', { params: { projectId: pid, lightId: String(await freshLight()) }, user: u, method: 'PATCH', json: { version: 1, dimmerPercent: 50 } }) },
	{ name: 'DELETE /api/…/lights/:id', allowed: CREW, kind: 'api', run: async (u) => api(apiLight.DELETE as never, '/api', { params: { projectId: pid, lightId: String(await freshLight()) }, user: u, method: 'DELETE' }) },
	{ name: 'GET /api/…/lights/:id/fixes', allowed: ALL, kind: 'api', run: (u) => api(apiFixes.GET as never, '/api', { params: { projectId: pid, lightId: String(p.lightId) }, user: u }) },
	{ name: 'POST /api/…/lights/:id/fixes', allowed: CREW, kind: 'api', run: async (u) => api(apiFixes.POST as never, '/api', { params: { projectId: pid, lightId: String(await freshLight()) }, user: u, json: { kind: 'gel', fix: { stack: ['cto-quarter'] } } }) },
	{ name: 'GET /api/…/comments', allowed: ALL, kind: 'api', run: (u) => api(apiComments.GET as never, '/api', { params: { projectId: pid }, user: u }) },
	{ name: 'POST /api/…/comments', allowed: REVIEW, kind: 'api', run: (u) => api(apiComments.POST as never, '/api', { params: { projectId: pid }, user: u, json: { subjectType: 'light', subjectId: p.lightId, body: 'From the API' } }) },
	{ name: 'GET /api/…/comments/:id', allowed: ALL, kind: 'api', run: async (u) => api(apiComment.GET as never, '/api', { params: { projectId: pid, commentId: String(await freshComment(crew.owner.id)) }, user: u }) },
	{ name: 'PATCH /api/…/comments/:id', allowed: REVIEW, kind: 'api', run: async (u) => api(apiComment.PATCH as never, '/api', { params: { projectId: pid, commentId: String(await freshComment(u?.id ?? crew.owner.id)) }, user: u, method: 'PATCH', json: { version: 1, body: 'Edited' } }) },
	{ name: 'DELETE /api/…/comments/:id', allowed: REVIEW, kind: 'api', run: async (u) => api(apiComment.DELETE as never, '/api', { params: { projectId: pid, commentId: String(await freshComment(u?.id ?? crew.owner.id)) }, user: u, method: 'DELETE' }) }
];

function expected(c: Case, who: Who): string {
	if (who === 'nobody') return c.kind === 'page' ? 'sign-in' : '401';
	if (who === 'stranger') return '404';
	return c.allowed.includes(who) ? 'ok' : '403';
}

function actual(c: Case, o: Outcome): string {
	if (o.status === 303 && o.location?.startsWith('/sign-in')) return 'sign-in';
	if (o.status < 400) return 'ok';
	return String(o.status);
}

describe('role × route', () => {
	it('lists every route of the log once', () => {
		expect(new Set(cases.map((c) => c.name)).size).toBe(cases.length);
		// Every exported action and handler of the log's route modules has its case.
		const pages: [string, { actions?: object }][] = [['days', daysPage], ['day', dayPage], ['setup', setupPage], ['light', lightPage], ['review', reviewPage], ['export', exportPage]];
		const apis: [string, object][] = [
			['/api/…/project', apiProject], ['/api/…/days', apiDays], ['/api/…/days/:id', apiDay], ['/api/…/setups', apiSetups], ['/api/…/setups/:id', apiSetup],
			['/api/…/setups/:id/target', apiTarget], ['/api/…/setups/:id/target-lock', apiTargetLock], ['/api/…/setups/:id/lock', apiLock],
			['/api/…/lights', apiLights], ['/api/…/lights/:id', apiLight], ['/api/…/lights/:id/fixes', apiFixes], ['/api/…/comments', apiComments], ['/api/…/comments/:id', apiComment]
		];
		const wanted = [
			...pages.flatMap(([prefix, m]) => Object.keys(m.actions ?? {}).map((a) => `${prefix} ?/${a}`)),
			...apis.flatMap(([path, m]) => Object.keys(m).filter((k) => /^(GET|POST|PUT|PATCH|DELETE)$/.test(k)).map((k) => `${k} ${path}`))
		];
		const names = new Set(cases.map((c) => c.name));
		expect(wanted.filter((w) => !names.has(w))).toEqual([]);
	});

	for (const c of cases) {
		it(`${c.name}: ${c.allowed.join(', ')}; stranger 404`, async () => {
			const got: Record<string, string> = {};
			const want: Record<string, string> = {};
			const detail: Record<string, unknown> = {};
			for (const who of EVERYONE) {
				const user = who === 'nobody' ? null : crew[who];
				const o = await c.run(user);
				got[who] = actual(c, o);
				want[who] = expected(c, who);
				if (got[who] !== want[who]) detail[who] = o.data;
			}
			expect({ got, detail }).toEqual({ got: want, detail: {} });
		});
	}

	it('a member without the permission is told so in a sentence (403), a stranger that the project does not exist (404)', async () => {
		const no = await act(setupPage.actions as never, 'lock', '/s', { params: setupP(p.setupId), user: crew.gaffer, form: { version: 1 } });
		expect(no.data.message).toMatch(/gaffer on this project cannot do that/);
		const hidden = await api(apiSetup.GET as never, '/api', { params: setupP(p.setupId), user: crew.stranger });
		expect(hidden.data.error).toMatchObject({ code: 'project_not_found', message: 'There is no such project, or you are not on it.' });
	});
});
