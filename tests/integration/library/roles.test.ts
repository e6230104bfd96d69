/**
 * Who may use each library route: every project role, a site admin who is not on the project, a
 * stranger and nobody, against every API route and every page load and action. The expected sets
 * come from the role table (PRODUCT notes, "Roles"; the library is edited with the permission to
 * edit lights) written out here, and each case checks that the change happened only when allowed.
 */
import { isActionFailure, isHttpError, isRedirect } from '@sveltejs/kit';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '../../../src/lib/server/auth/types';
import { closeDb } from '../../../src/lib/server/db';
import * as customGels from '../../../src/lib/server/db/custom-gels';
import * as filterOverrides from '../../../src/lib/server/db/filter-overrides';
import * as fixtureProfiles from '../../../src/lib/server/db/fixture-profiles';
import { addCustomGel, addFixtureProfile } from '../../../src/lib/server/services/library';
import * as sharedIndex from '../../../src/routes/api/v1/library/+server';
import * as sharedGels from '../../../src/routes/api/v1/library/gels/+server';
import * as sharedGel from '../../../src/routes/api/v1/library/gels/[gelId]/+server';
import * as sharedFixtures from '../../../src/routes/api/v1/library/fixtures/+server';
import * as sharedFixture from '../../../src/routes/api/v1/library/fixtures/[profileId]/+server';
import * as projIndex from '../../../src/routes/api/v1/projects/[projectId]/library/+server';
import * as projOverrides from '../../../src/routes/api/v1/projects/[projectId]/library/overrides/+server';
import * as projOverride from '../../../src/routes/api/v1/projects/[projectId]/library/overrides/[gelId]/+server';
import * as projGels from '../../../src/routes/api/v1/projects/[projectId]/library/gels/+server';
import * as projGel from '../../../src/routes/api/v1/projects/[projectId]/library/gels/[gelId]/+server';
import * as projFixtures from '../../../src/routes/api/v1/projects/[projectId]/library/fixtures/+server';
import * as projFixture from '../../../src/routes/api/v1/projects/[projectId]/library/fixtures/[profileId]/+server';
import * as sharedPage from '../../../src/routes/library/+page.server';
import * as projectPage from '../../../src/routes/projects/[projectId]/library/+page.server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call, multipart } from '../helpers/route';
import { longCsv, rgbwCsv } from '../../unit/server/library/factories';
import { fixtureForm, gelForm, makeAdmin, uniqueName } from './helpers';

type Actor = 'owner' | 'dp' | 'gaffer' | 'colorist' | 'viewer' | 'admin' | 'stranger' | 'nobody';
const ACTORS: Actor[] = ['owner', 'dp', 'gaffer', 'colorist', 'viewer', 'admin', 'stranger', 'nobody'];
const MEMBERS = ['owner', 'dp', 'gaffer', 'colorist', 'viewer'] as const;
const EDITORS = ['owner', 'dp', 'gaffer'] as const; // light.edit

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
let admin: SessionUser;
const userOf = (a: Actor): SessionUser | null => (a === 'nobody' ? null : a === 'admin' ? admin : p.crew[a]);
const CSV = longCsv({ Sheet: () => 0.6 });

/** What a route would send: an HTTP status (200 for a load or a successful action, 303 for a redirect). */
async function statusOf(run: () => unknown): Promise<number> {
	try {
		const r = await run();
		if (r instanceof Response) return r.status;
		if (isActionFailure(r)) return r.status;
		return 200;
	} catch (e) {
		if (isRedirect(e)) return e.status;
		if (isHttpError(e)) return e.status;
		throw e;
	}
}

function pageEvent(user: SessionUser | null, path: string, params: Record<string, string>, form?: FormData) {
	const url = new URL(path, 'http://127.0.0.1');
	return {
		locals: { user, theme: 'dark' },
		params,
		url,
		request: new Request(url, form ? { method: 'POST', body: form } : {}),
		route: { id: null },
		cookies: { get: () => undefined, getAll: () => [], set() {}, delete() {}, serialize: () => '' },
		setHeaders() {},
		getClientAddress: () => '127.0.0.1',
		fetch,
		isDataRequest: false,
		isSubRequest: false,
		platform: undefined
	} as never;
}

interface Case {
	name: string;
	/** Who succeeds; everyone else gets the refusal for their kind of route. */
	allowed: readonly Actor[];
	scope: 'project' | 'shared';
	kind: 'api' | 'page';
	/** Makes what the call acts on (e.g. an item to delete). */
	prepare?: () => Promise<number>;
	run: (user: SessionUser | null, ctx: number) => unknown;
	/** Did the change happen? (Reads: always true.) */
	changed?: (ctx: number) => Promise<boolean>;
}

const pp = () => ({ projectId: String(p.projectId) });
const api = (handler: (e: never) => unknown, opts: { params?: Record<string, string>; json?: unknown; body?: BodyInit; method?: string } = {}) => (user: SessionUser | null) =>
	call(handler as never, '/api/x', { user, ...opts });

// Refused deletes leave their item behind; start each from an empty scope so the cap on custom filters is never reached.
const newProjectGel = async () => {
	await db('library_custom_gels').where({ scope_id: p.projectId }).delete();
	return (await addCustomGel(p.projectId, p.crew.owner.id, gelForm(CSV))).id;
};
const newSharedGel = async () => {
	await db('library_custom_gels').where({ scope_id: 0 }).delete();
	return (await addCustomGel(null, admin.id, gelForm(CSV))).id;
};
const newProjectFixture = async () => (await addFixtureProfile(p.projectId, p.crew.owner.id, fixtureForm(rgbwCsv(), { key: uniqueName('k').toLowerCase().replace(/\s+/g, '-'), asMeasured: 'true' }))).id as number;
const newSharedFixture = async () => (await addFixtureProfile(null, admin.id, fixtureForm(rgbwCsv(), { key: uniqueName('s').toLowerCase().replace(/\s+/g, '-'), asMeasured: 'true' }))).id as number;
const overrideCount = async () => (await filterOverrides.list(p.projectId)).length;
let countBefore = 0;
const counted = (count: () => Promise<number>) => ({
	prepare: async () => {
		await db('library_custom_gels').where({ scope_id: p.projectId }).orWhere({ scope_id: 0 }).delete();
		countBefore = await count();
		return 0;
	},
	changed: async () => (await count()) > countBefore
});
const gone = (read: (id: number) => Promise<unknown>) => async (id: number) => (await read(id)) === null;

const CASES: Case[] = [
	// Shared API
	{ name: 'GET /library', allowed: ACTORS, scope: 'shared', kind: 'api', run: api(sharedIndex.GET) },
	{ name: 'GET /library/gels', allowed: ACTORS, scope: 'shared', kind: 'api', run: api(sharedGels.GET) },
	{ name: 'GET /library/gels/:id', allowed: ACTORS, scope: 'shared', kind: 'api', prepare: newSharedGel, run: (u, id) => api(sharedGel.GET, { params: { gelId: String(id) } })(u) },
	{ name: 'GET /library/fixtures', allowed: ACTORS, scope: 'shared', kind: 'api', run: api(sharedFixtures.GET) },
	{ name: 'GET /library/fixtures/:id', allowed: ACTORS, scope: 'shared', kind: 'api', prepare: newSharedFixture, run: (u, id) => api(sharedFixture.GET, { params: { profileId: String(id) } })(u) },
	{ name: 'POST /library/gels', allowed: ['admin'], scope: 'shared', kind: 'api', ...counted(() => customGels.count(null)), run: (u) => api(sharedGels.POST, { body: gelForm(CSV), method: 'POST' })(u) },
	{ name: 'DELETE /library/gels/:id', allowed: ['admin'], scope: 'shared', kind: 'api', prepare: newSharedGel, run: (u, id) => api(sharedGel.DELETE, { params: { gelId: String(id) }, method: 'DELETE' })(u), changed: gone((id) => customGels.read(null, id)) },
	{ name: 'POST /library/fixtures', allowed: ['admin'], scope: 'shared', kind: 'api', ...counted(() => fixtureProfiles.count(null)), run: (u) => api(sharedFixtures.POST, { body: fixtureForm(rgbwCsv(), { asMeasured: 'true' }), method: 'POST' })(u) },
	{ name: 'DELETE /library/fixtures/:id', allowed: ['admin'], scope: 'shared', kind: 'api', prepare: newSharedFixture, run: (u, id) => api(sharedFixture.DELETE, { params: { profileId: String(id) }, method: 'DELETE' })(u), changed: gone((id) => fixtureProfiles.read(null, id)) },
	// Project API
	{ name: 'GET /projects/:id/library', allowed: MEMBERS, scope: 'project', kind: 'api', run: (u) => api(projIndex.GET, { params: pp() })(u) },
	{ name: 'GET /projects/:id/library/overrides', allowed: MEMBERS, scope: 'project', kind: 'api', run: (u) => api(projOverrides.GET, { params: pp() })(u) },
	{ name: 'GET /projects/:id/library/gels', allowed: MEMBERS, scope: 'project', kind: 'api', run: (u) => api(projGels.GET, { params: pp() })(u) },
	{ name: 'GET /projects/:id/library/gels/:gelId', allowed: MEMBERS, scope: 'project', kind: 'api', prepare: newProjectGel, run: (u, id) => api(projGel.GET, { params: { ...pp(), gelId: String(id) } })(u) },
	{ name: 'GET /projects/:id/library/fixtures', allowed: MEMBERS, scope: 'project', kind: 'api', run: (u) => api(projFixtures.GET, { params: pp() })(u) },
	{ name: 'GET /projects/:id/library/fixtures/:profileId', allowed: MEMBERS, scope: 'project', kind: 'api', prepare: newProjectFixture, run: (u, id) => api(projFixture.GET, { params: { ...pp(), profileId: String(id) } })(u) },
	{
		name: 'PUT /projects/:id/library/overrides/:gelId',
		allowed: EDITORS,
		scope: 'project',
		kind: 'api',
		prepare: async () => {
			await filterOverrides.destroy(p.projectId, 'ctb-quarter');
			return 0;
		},
		run: (u) => api(projOverride.PUT, { params: { ...pp(), gelId: 'ctb-quarter' }, json: { miredShift: -35 }, method: 'PUT' })(u),
		changed: async () => (await filterOverrides.read(p.projectId, 'ctb-quarter')) !== null
	},
	{
		name: 'DELETE /projects/:id/library/overrides/:gelId',
		allowed: EDITORS,
		scope: 'project',
		kind: 'api',
		prepare: async () => {
			await filterOverrides.upsert(p.projectId, 'cto-eighth', { miredShift: 20, lossStops: null, note: '' }, null);
			return 0;
		},
		run: (u) => api(projOverride.DELETE, { params: { ...pp(), gelId: 'cto-eighth' }, method: 'DELETE' })(u),
		changed: async () => (await filterOverrides.read(p.projectId, 'cto-eighth')) === null
	},
	{ name: 'POST /projects/:id/library/gels', allowed: EDITORS, scope: 'project', kind: 'api', ...counted(() => customGels.count(p.projectId)), run: (u) => api(projGels.POST, { params: pp(), body: gelForm(CSV), method: 'POST' })(u) },
	{ name: 'DELETE /projects/:id/library/gels/:gelId', allowed: EDITORS, scope: 'project', kind: 'api', prepare: newProjectGel, run: (u, id) => api(projGel.DELETE, { params: { ...pp(), gelId: String(id) }, method: 'DELETE' })(u), changed: gone((id) => customGels.read(p.projectId, id)) },
	{ name: 'POST /projects/:id/library/fixtures', allowed: EDITORS, scope: 'project', kind: 'api', ...counted(() => fixtureProfiles.count(p.projectId)), run: (u) => api(projFixtures.POST, { params: pp(), body: fixtureForm(rgbwCsv(), { asMeasured: 'true' }), method: 'POST' })(u) },
	{ name: 'DELETE /projects/:id/library/fixtures/:profileId', allowed: EDITORS, scope: 'project', kind: 'api', prepare: newProjectFixture, run: (u, id) => api(projFixture.DELETE, { params: { ...pp(), profileId: String(id) }, method: 'DELETE' })(u), changed: gone((id) => fixtureProfiles.read(p.projectId, id)) },
	// Shared page
	{ name: '/library (load)', allowed: ACTORS, scope: 'shared', kind: 'page', run: (u) => sharedPage.load(pageEvent(u, '/library', {})) },
	{ name: '/library ?/addGel', allowed: ['admin'], scope: 'shared', kind: 'page', ...counted(() => customGels.count(null)), run: (u) => sharedPage.actions.addGel(pageEvent(u, '/library?/addGel', {}, gelForm(CSV))) },
	{ name: '/library ?/removeGel', allowed: ['admin'], scope: 'shared', kind: 'page', prepare: newSharedGel, run: (u, id) => sharedPage.actions.removeGel(pageEvent(u, '/library?/removeGel', {}, multipart({ id: String(id) }))), changed: gone((id) => customGels.read(null, id)) },
	{ name: '/library ?/addFixture', allowed: ['admin'], scope: 'shared', kind: 'page', ...counted(() => fixtureProfiles.count(null)), run: (u) => sharedPage.actions.addFixture(pageEvent(u, '/library?/addFixture', {}, fixtureForm(rgbwCsv(), { asMeasured: 'on' }))) },
	{ name: '/library ?/removeFixture', allowed: ['admin'], scope: 'shared', kind: 'page', prepare: newSharedFixture, run: (u, id) => sharedPage.actions.removeFixture(pageEvent(u, '/library?/removeFixture', {}, multipart({ id: String(id) }))), changed: gone((id) => fixtureProfiles.read(null, id)) },
	// Project page
	{ name: '/projects/:id/library (load)', allowed: MEMBERS, scope: 'project', kind: 'page', run: (u) => projectPage.load(pageEvent(u, `/projects/${p.projectId}/library`, pp())) },
	{
		name: '/projects/:id/library ?/setOverride',
		allowed: EDITORS,
		scope: 'project',
		kind: 'page',
		prepare: async () => {
			await filterOverrides.destroy(p.projectId, 'ctb-half');
			return 0;
		},
		run: (u) => projectPage.actions.setOverride(pageEvent(u, `/projects/${p.projectId}/library?/setOverride`, pp(), multipart({ gelId: 'ctb-half', miredShift: '−68', lossStops: '', note: 'swatch book' }))),
		changed: async () => (await filterOverrides.read(p.projectId, 'ctb-half'))?.miredShift === -68
	},
	{
		name: '/projects/:id/library ?/clearOverride',
		allowed: EDITORS,
		scope: 'project',
		kind: 'page',
		prepare: async () => {
			await filterOverrides.upsert(p.projectId, 'ctb-half', { miredShift: -68, lossStops: null, note: '' }, null);
			return 0;
		},
		run: (u) => projectPage.actions.clearOverride(pageEvent(u, `/projects/${p.projectId}/library?/clearOverride`, pp(), multipart({ gelId: 'ctb-half' }))),
		changed: async () => (await filterOverrides.read(p.projectId, 'ctb-half')) === null
	},
	{ name: '/projects/:id/library ?/addGel', allowed: EDITORS, scope: 'project', kind: 'page', ...counted(() => customGels.count(p.projectId)), run: (u) => projectPage.actions.addGel(pageEvent(u, `/projects/${p.projectId}/library?/addGel`, pp(), gelForm(CSV))) },
	{ name: '/projects/:id/library ?/removeGel', allowed: EDITORS, scope: 'project', kind: 'page', prepare: newProjectGel, run: (u, id) => projectPage.actions.removeGel(pageEvent(u, `/projects/${p.projectId}/library?/removeGel`, pp(), multipart({ id: String(id) }))), changed: gone((id) => customGels.read(p.projectId, id)) },
	{ name: '/projects/:id/library ?/addFixture', allowed: EDITORS, scope: 'project', kind: 'page', ...counted(() => fixtureProfiles.count(p.projectId)), run: (u) => projectPage.actions.addFixture(pageEvent(u, `/projects/${p.projectId}/library?/addFixture`, pp(), fixtureForm(rgbwCsv(), { asMeasured: 'on' }))) },
	{ name: '/projects/:id/library ?/removeFixture', allowed: EDITORS, scope: 'project', kind: 'page', prepare: newProjectFixture, run: (u, id) => projectPage.actions.removeFixture(pageEvent(u, `/projects/${p.projectId}/library?/removeFixture`, pp(), multipart({ id: String(id) }))), changed: gone((id) => fixtureProfiles.read(p.projectId, id)) }
];

/** The refusal an actor outside `allowed` gets. */
function refusal(c: Case, a: Actor): number {
	if (a === 'nobody') return c.kind === 'api' ? 401 : 303;
	if (c.scope === 'shared') return 403; // signed in, not a site admin
	if (a === 'admin' || a === 'stranger') return 404; // not on the project: it does not exist for them
	return 403; // a member whose role cannot edit the library
}

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Library roles');
	admin = await makeAdmin(db);
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

describe('library routes × roles', () => {
	it.each(CASES.map((c) => [c.name, c] as const))('%s', async (_name, c) => {
		const seen: string[] = [];
		const want: string[] = [];
		for (const a of ACTORS) {
			const ctx = c.prepare ? await c.prepare() : 0;
			const status = await statusOf(() => c.run(userOf(a), ctx));
			const ok = c.allowed.includes(a);
			const changed = c.changed ? await c.changed(ctx) : ok;
			seen.push(`${a}: ${ok ? (status < 300 ? 'ok' : status) : status}${changed ? ' changed' : ''}`);
			want.push(`${a}: ${ok ? 'ok' : refusal(c, a)}${ok ? ' changed' : ''}`);
		}
		expect(seen).toEqual(want);
	});
});
