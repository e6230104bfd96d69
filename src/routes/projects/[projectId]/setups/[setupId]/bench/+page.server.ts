import { error } from '@sveltejs/kit';
import { GENERIC_FIXTURES } from '$lib/matching';
import { projectAccess } from '$lib/server/authz';
import * as log from '$lib/server/services/log';
import type { PageServerLoad } from './$types';
import { benchOf } from './snapshot.server';

/** The setup bench: the snapshot (polled afterwards), readings that can be the target, the generic fixture profiles. */
export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const id = log.parseId(event.params.setupId);
	const bench = id === null ? null : await benchOf(access, id);
	if (!bench) error(404, 'There is no such setup in this project.');
	const { view, snapshot } = bench;
	return {
		project: { id: access.project.id, name: access.project.name },
		permissions: access.permissions as string[],
		day: { id: view.day.id, date: view.day.date, label: view.day.label, locationName: view.day.locationName },
		snapshot,
		targetReadings: view.targetReadings,
		stored: view.setup.target?.stored ?? null,
		fixtures: GENERIC_FIXTURES.map((f) => ({ id: f.id, label: f.label, channels: f.channels.length }))
	};
};
