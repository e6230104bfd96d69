/**
 * Fixes for one light: the gel stacks or LED levels that bring its latest reading to the setup's
 * target white, predicted spectrally when the reading is a spectrum. Server side because the inputs
 * (target, reading, fixture, project overrides) live in the database; the solving is all in
 * $lib/matching.
 */
import {
	GENERIC_FIXTURES,
	proposeGelsForSourceToTarget,
	solveLedFix,
	solveLedQualityFix,
	type FixtureProfile,
	type GelSource
} from '$lib/matching';
import { ApiError } from '$lib/server/api';
import { db } from '$lib/server/db';
import * as readings from '$lib/server/db/readings';
import type { Reading } from '$lib/server/db/readings';
import { parseJson } from '$lib/server/db/json';
import { solverLibrary } from '$lib/server/services/library';
import { readingSpectrum, resolveStoredTarget, type StoredTarget } from '$lib/server/services/targets';

/** The reading as a source for the solvers: its spectrum when it has one, else its chromaticity. */
export function readingAsSource(r: Reading): GelSource {
	const spectrum = readingSpectrum(r);
	return spectrum ? { spectrum, label: r.label } : { x: r.computed.x, y: r.computed.y, label: r.label };
}

/** A JSON-safe copy: typed arrays (spectra) are dropped, with a flag that there was one. */
export function jsonSafe<T>(value: T): T {
	return JSON.parse(
		JSON.stringify(value, (key, v) => {
			if (v instanceof Float64Array || v instanceof Float32Array) return undefined;
			if (key === 'spectrum' && v && typeof v === 'object' && 'values' in v) return { start: v.start, interval: v.interval, bands: (v.values as ArrayLike<number>).length };
			return v;
		})
	);
}

/** Which generic fixture profile suits a light's kind, when the light names none. */
export function fixtureFor(light: { kind: string; fixture_profile: string | null }, requested?: string): string | null {
	if (requested) return requested;
	if (light.fixture_profile && GENERIC_FIXTURES.some((f) => f.id === light.fixture_profile)) return light.fixture_profile;
	const byKind: Record<string, string> = {
		'led-bicolour': 'generic-bicolour',
		'led-rgb': 'generic-rgb',
		'led-rgbw': 'generic-rgbw',
		'led-seven': 'generic-seven',
		'led-rgbacl': 'generic-seven'
	};
	return byKind[light.kind] ?? null;
}

export interface FixRequest {
	lightId: number;
	kind: 'gel' | 'led';
	/** LED: a generic profile id; default from the light. */
	fixtureId?: string;
	/** LED: the brightest exact mix (default) or the best Ra/SSI at a minimum output. */
	optimise?: 'output' | 'Ra' | 'SSI';
	minOutput?: number;
	/** Gels: the stack size (1–3, default 3) and how many to return. */
	maxGels?: number;
	top?: number;
	includeNeutralDensity?: boolean;
}

async function lightContext(projectId: number, lightId: number) {
	const light = await db('lights').where({ project_id: projectId, id: lightId }).whereNull('deleted_at').first();
	if (!light) throw new ApiError(404, 'not_found', 'There is no such light in this project.');
	const setup = await db('setups').where({ project_id: projectId, id: light.setup_id }).first();
	const stored = parseJson<StoredTarget>(setup?.target);
	if (!setup || !stored) throw new ApiError(409, 'no_target', 'Choose a target white for this setup first.');
	const latest = (await readings.list(projectId, { lightId, sort: 'taken_at', order: 'desc', limit: 1 })).items[0];
	if (!latest) throw new ApiError(409, 'no_reading', 'Take or type a reading of this light first.');
	const target = await resolveStoredTarget(projectId, stored, Number(setup.target_tolerance ?? 0.002));
	return { light, setup, target, latest };
}

export async function proposeFixes(projectId: number, req: FixRequest) {
	const { light, setup, target, latest } = await lightContext(projectId, req.lightId);
	// The project's library: its overrides of the built-in filters' figures, custom filters (its own
	// and the shared ones) and uploaded fixture profiles.
	const library = await solverLibrary(projectId);
	const base = { lightId: light.id as number, setupId: setup.id as number, readingId: latest.id, readingLabel: latest.label };
	try {
		if (req.kind === 'gel') {
			const result = proposeGelsForSourceToTarget(readingAsSource(latest), target, {
				maxGels: req.maxGels ?? 3,
				top: req.top ?? 5,
				overrides: library.overrides,
				extraGels: library.extraGels,
				includeNeutralDensity: req.includeNeutralDensity ?? false
			});
			return { ...base, kind: 'gel' as const, result: jsonSafe(result) };
		}
		// A fixture id resolves to a generic profile, then the project's, then a shared one. Asked
		// for by id, it must exist; named by the light, an unknown name falls back to its kind.
		let profile: FixtureProfile | null = null;
		if (req.fixtureId) {
			profile = await library.findFixture(req.fixtureId);
			if (!profile) throw new ApiError(400, 'no_fixture', `There is no fixture profile “${req.fixtureId}”.`);
		} else {
			if (light.fixture_profile) profile = await library.findFixture(light.fixture_profile);
			const byKind = profile ? null : fixtureFor({ kind: light.kind, fixture_profile: null });
			if (byKind) profile = await library.findFixture(byKind);
		}
		if (!profile) throw new ApiError(400, 'no_fixture', 'Say which LED fixture profile this light uses (it has none).');
		const fix =
			req.optimise && req.optimise !== 'output'
				? solveLedQualityFix(profile, target, { metric: req.optimise, minOutput: req.minOutput ?? 0.8 })
				: solveLedFix(profile, target);
		return { ...base, kind: 'led' as const, result: jsonSafe(fix) };
	} catch (e) {
		if (e instanceof ApiError) throw e;
		if (e instanceof RangeError) throw new ApiError(400, 'unsolvable', e.message);
		throw e;
	}
}
