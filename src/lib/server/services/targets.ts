/**
 * A setup's stored target white (`setups.target`) resolved against the project's readings, for
 * everything that needs it: the lighting log's pages and API, the review and exports, and the fix
 * solvers. One resolver, so the pages and the solvers never disagree about what a setup aims for.
 *
 * A target that names a reading uses that reading's spectrum when it has one (the solvers predict
 * spectrally from it), else its computed chromaticity. A reading that was removed (soft-deleted)
 * no longer counts: the target is reported missing until someone chooses another.
 */
import { makeSpectrum, type Spectrum } from '$lib/colour';
import { resolveTargetWhite, type TargetSpec, type TargetWhite } from '$lib/matching/target';
import type { StoredTarget } from '$lib/schemas/log';
import { ApiError } from '$lib/server/api';
import * as readings from '$lib/server/db/readings';
import type { Reading } from '$lib/server/db/readings';

export type { StoredTarget } from '$lib/schemas/log';

/** Why a stored target could not be resolved: its reading is gone, or the target itself is unusable. */
export class TargetError extends ApiError {
	constructor(
		readonly reason: 'target_missing' | 'target_invalid',
		message: string
	) {
		super(409, reason, message);
	}
}

/** The reading's spectrum, when it was measured as one. */
export function readingSpectrum(r: Reading): Spectrum | null {
	if (r.raw.kind !== 'spectral') return null;
	const s = r.raw.spectrum;
	return makeSpectrum(s.start, s.interval, s.values, s.scale);
}

/**
 * Resolves a stored target to one chromaticity with CCT, Duv, mired and tolerance (Δu'v').
 * `readingLookup` may hold readings already loaded (a page listing many setups); the others are read
 * from the project. Throws `TargetError` (409) when the target's reading is gone or the target
 * cannot be computed.
 */
export async function resolveStoredTarget(
	projectId: number,
	stored: StoredTarget,
	tolerance: number,
	readingLookup?: ReadonlyMap<number, Reading>
): Promise<TargetWhite> {
	let spec: TargetSpec;
	switch (stored?.kind) {
		case 'reading': {
			const r = readingLookup?.get(stored.readingId) ?? (await readings.read(projectId, stored.readingId));
			if (!r || r.deletedAt) throw new TargetError('target_missing', 'The reading this setup targets no longer exists. Choose the target white again.');
			const label = `reading “${r.label}”`;
			const spectrum = readingSpectrum(r);
			spec = spectrum ? { kind: 'reading', label, spectrum } : { kind: 'reading', label, x: r.computed.x, y: r.computed.y };
			break;
		}
		case 'cct_duv':
			spec = { kind: 'cct', CCT: stored.cct_k, Duv: stored.duv };
			break;
		case 'xy':
			spec = { kind: 'xy', x: stored.x, y: stored.y };
			break;
		case 'illuminant':
			spec = { kind: 'illuminant', name: stored.name };
			break;
		default:
			throw new TargetError('target_invalid', 'This setup’s target white could not be read. Choose it again.');
	}
	try {
		return resolveTargetWhite(spec, { tolerance });
	} catch (e) {
		throw new TargetError('target_invalid', `This setup’s target white could not be used: ${(e as Error).message}`);
	}
}
