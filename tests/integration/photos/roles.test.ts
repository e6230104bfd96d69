/**
 * Who may use each photo route: every project role, a stranger (404: the project does not exist
 * for them) and nobody signed in (401). Owner, DP and gaffer hold `photo.edit`; colorist and viewer
 * only `project.view` (src/lib/server/authz.ts).
 */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import { testKnex } from '../helpers/db';
import { makeProject, type Crew } from '../helpers/fixtures';
import { call } from '../helpers/route';
import { photoWithoutGps } from '../../unit/server/photos/images';
import { base, routes, uploadPhoto, type Grant } from './helpers';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
let readyId: number;

type Who = keyof Crew | 'nobody';
const WHO: Who[] = ['owner', 'dp', 'gaffer', 'colorist', 'viewer', 'stranger', 'nobody'];
const EDITORS = new Set<Who>(['owner', 'dp', 'gaffer']);
const MEMBERS = new Set<Who>(['owner', 'dp', 'gaffer', 'colorist', 'viewer']);

beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Photo roles');
	readyId = (await uploadPhoto(p.projectId, p.crew.gaffer, await photoWithoutGps(), { setupId: p.setupId })).id;
});
afterAll(async () => {
	await db.destroy();
	await closeDb();
});

const user = (who: Who) => (who === 'nobody' ? null : p.crew[who]);
const prm = (photoId?: number) => ({ projectId: String(p.projectId), ...(photoId ? { photoId: String(photoId) } : {}) });

/** A fresh pending photo (granted to the gaffer), for the routes that change or remove one. */
async function pendingPhoto(): Promise<number> {
	const res = await call(routes.list.POST, base(p.projectId), { params: prm(), user: p.crew.gaffer, json: { filename: 'r.jpg', type: 'image/jpeg', size: 100, setupId: p.setupId } });
	return ((await res.json()) as Grant).photo.id;
}

function expected(who: Who, needs: 'view' | 'edit', allowed: number): number {
	if (who === 'nobody') return 401;
	if (!MEMBERS.has(who)) return 404;
	if (needs === 'edit' && !EDITORS.has(who)) return 403;
	return allowed;
}

const CASES: { route: string; needs: 'view' | 'edit'; allowed: number; run: (who: Who) => Promise<Response> }[] = [
	{ route: 'GET photos', needs: 'view', allowed: 200, run: (who) => call(routes.list.GET, base(p.projectId), { params: prm(), user: user(who) }) },
	{
		route: 'POST photos',
		needs: 'edit',
		allowed: 201,
		run: (who) => call(routes.list.POST, base(p.projectId), { params: prm(), user: user(who), json: { filename: 'r.jpg', type: 'image/jpeg', size: 100, setupId: p.setupId } })
	},
	{ route: 'GET photos/:id', needs: 'view', allowed: 200, run: (who) => call(routes.one.GET, '/x', { params: prm(readyId), user: user(who) }) },
	{ route: 'PATCH photos/:id', needs: 'edit', allowed: 200, run: (who) => call(routes.one.PATCH, '/x', { params: prm(readyId), user: user(who), method: 'PATCH', json: { caption: `by ${who}` } }) },
	{ route: 'DELETE photos/:id', needs: 'edit', allowed: 204, run: async (who) => call(routes.one.DELETE, '/x', { params: prm(await pendingPhoto()), user: user(who), method: 'DELETE' }) },
	{ route: 'POST photos/:id/complete', needs: 'edit', allowed: 200, run: (who) => call(routes.complete.POST, '/x', { params: prm(readyId), user: user(who), method: 'POST' }) },
	{ route: 'GET photos/:id/original', needs: 'view', allowed: 303, run: (who) => call(routes.original.GET, '/x', { params: prm(readyId), user: user(who) }) },
	{ route: 'GET photos/:id/thumbnail', needs: 'view', allowed: 303, run: (who) => call(routes.thumbnail.GET, '/x', { params: prm(readyId), user: user(who) }) }
];

describe('photo routes × roles', () => {
	for (const c of CASES) {
		it(`${c.route}: ${WHO.map((w) => `${w} ${expected(w, c.needs, c.allowed)}`).join(', ')}`, async () => {
			const got: Record<string, number> = {};
			const want: Record<string, number> = {};
			for (const who of WHO) {
				const res = await c.run(who);
				got[who] = res.status;
				want[who] = expected(who, c.needs, c.allowed);
				if (res.status === 303) expect(res.headers.get('location')).toMatch(/X-Amz-Signature=/);
				else expect(res.headers.get('location')).toBeNull();
				if (res.status >= 400) expect((await res.json()).error.code).toBeTruthy();
			}
			expect(got).toEqual(want);
		});
	}

	it('a 403 says which role cannot, a 404 reveals nothing about the project', async () => {
		const forbidden = await call(routes.list.POST, base(p.projectId), { params: prm(), user: p.crew.colorist, json: { filename: 'r.jpg', type: 'image/jpeg', size: 100, setupId: p.setupId } });
		expect((await forbidden.json()).error.message).toBe('A colorist on this project cannot do that.');
		const hidden = await call(routes.thumbnail.GET, '/x', { params: prm(readyId), user: p.crew.stranger });
		expect((await hidden.json()).error).toEqual({ code: 'project_not_found', message: 'There is no such project, or you are not on it.' });
	});
});
