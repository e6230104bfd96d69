import { error, redirect } from '@sveltejs/kit';
import { projectAccess } from '$lib/server/authz';
import { commentActions } from '$lib/server/comment-actions';
import * as log from '$lib/server/services/log';
import { circuitFormSchema, idFormSchema, lightFormSchema, setupFormSchema, setupPageQuerySchema, targetFormSchema, versionFormSchema } from '$lib/schemas/log';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

const setupId = (e: { params: { setupId: string } }) => log.parseId(e.params.setupId) ?? error(404, 'There is no such setup in this project.');
const ids = (form: FormData) => ({ circuitId: log.formId(form, 'circuitId'), commentId: log.formId(form, 'commentId') });

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const q = setupPageQuerySchema.parse(Object.fromEntries(event.url.searchParams));
	const view = await log.setupPage(access, setupId(event), { sort: q.sort, order: q.order, kind: q.kind || undefined, role: q.role || undefined });
	if (!view) error(404, 'There is no such setup in this project.');
	return {
		project: { id: access.project.id, name: access.project.name },
		permissions: access.permissions,
		query: q,
		members: await log.mentionable(access),
		...view,
		// The setup bench (chart of the lights against the target, fix proposals) adds its data here.
		bench: null as Record<string, unknown> | null
	};
};

/** Lock and target actions: one permission each, the setup's version from the form. */
const state = (permission: Parameters<typeof projectAccess>[1], name: string, run: (a: Awaited<ReturnType<typeof projectAccess>>, id: number, version: number) => Promise<unknown>) => async (event: RequestEvent) => {
	const access = await projectAccess(event, permission);
	return log.formAction(event.request, name, versionFormSchema, async ({ version }) => void (await run(access, setupId(event), version)));
};

export const actions: Actions = {
	update: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		return log.formAction(event.request, 'update', setupFormSchema.extend(versionFormSchema.shape), async ({ version, ...d }) => {
			await log.updateSetup(access, setupId(event), d, version);
			return { message: 'Saved.' };
		});
	},
	delete: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		const s = await log.readSetup(access, setupId(event));
		return log.formAction(event.request, 'delete', versionFormSchema.partial(), async () => {
			await log.deleteSetup(access, setupId(event));
			redirect(303, `/projects/${access.project.id}/days/${s?.shootDayId ?? ''}`);
		});
	},
	setTarget: async (event) => {
		const access = await projectAccess(event, 'target.set');
		return log.formAction(event.request, 'setTarget', targetFormSchema, async (d) => void (await log.setTarget(access, setupId(event), d.target, d.tolerance, d.version)));
	},
	clearTarget: state('target.set', 'clearTarget', (a, id, v) => log.setTarget(a, id, null, undefined, v)),
	lockTarget: state('target.lock', 'lockTarget', (a, id, v) => log.lockTarget(a, id, true, v)),
	unlockTarget: state('target.lock', 'unlockTarget', (a, id, v) => log.lockTarget(a, id, false, v)),
	lock: state('setup.lock', 'lock', (a, id, v) => log.lockSetup(a, id, true, v)),
	unlock: state('setup.lock', 'unlock', (a, id, v) => log.lockSetup(a, id, false, v)),
	addLight: async (event) => {
		const access = await projectAccess(event, 'light.edit');
		return log.formAction(event.request, 'addLight', lightFormSchema, async (d) => ({ lightId: (await log.createLight(access, setupId(event), d)).id }));
	},
	addCircuit: async (event) => {
		const access = await projectAccess(event, 'power.edit');
		return log.formAction(event.request, 'addCircuit', circuitFormSchema, async (d) => ({ circuitId: (await log.createCircuit(access, setupId(event), d)).id }));
	},
	updateCircuit: async (event) => {
		const access = await projectAccess(event, 'power.edit');
		return log.formAction(event.request, 'updateCircuit', circuitFormSchema.and(versionFormSchema), async ({ version, ...d }, f) => void (await log.updateCircuit(access, log.formId(f, 'circuitId'), d, version)), ids);
	},
	deleteCircuit: async (event) => {
		const access = await projectAccess(event, 'power.edit');
		return log.formAction(event.request, 'deleteCircuit', idFormSchema('circuitId'), async (_d, f) => void (await log.deleteCircuit(access, log.formId(f, 'circuitId'))), ids);
	},
	...commentActions
};
