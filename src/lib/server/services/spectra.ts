/**
 * Spectra for the views: one reading with what it is judged against (the reference illuminant its
 * CRI uses, the setup's target white), and for the setup bench a light's reading against the target
 * with a gel stack's transmission and the spectrum predicted through it. Plain numbers out, so pages
 * and the JSON API send them as they are; the drawing is the spectrum plot's.
 *
 * The reference at a CCT is the one CIE 13.3 compares a light with: a Planckian radiator below
 * 5000 K, CIE daylight at and above (up to 25 000 K, where the daylight series ends).
 * A gel stack's transmission is the product of its filters' transmissions (filters multiply), each
 * held flat beyond its own range as the solvers do; the prediction is the reading times it.
 *
 * References:
 *   CIE 13.3-1995 §5.3 (reference illuminant: Planckian below 5000 K, CIE daylight from 5000 K).
 *   CIE 15:2004 Colorimetry, 3rd ed., §3.1 (Planck's law; CIE daylight from S0, S1, S2).
 */
import { criReferenceSpectrum, multiplySpectra, type ReadingAnalysis, type Spectrum } from '$lib/colour';
import { gelLibrary, stackTransmission, type Gel } from '$lib/matching';
import { ApiError } from '$lib/server/api';
import type { ProjectAccess } from '$lib/server/authz';
import * as lights from '$lib/server/db/lights';
import * as readings from '$lib/server/db/readings';
import * as setups from '$lib/server/db/setups';
import type { Reading } from '$lib/server/db/readings';
import { readingSpectrum, resolveStoredTarget } from '$lib/server/services/targets';
import { solverLibrary } from '$lib/server/services/library';
import type { TargetWhite } from '$lib/matching';

/** A spectrum as JSON: plain numbers (rounded to 6 significant figures) on a uniform grid. */
export interface SpectrumJson {
	start: number;
	interval: number;
	values: number[];
	scale: 'relative' | 'absolute';
}

export type LineRole = 'reading' | 'target' | 'reference' | 'predicted';

export interface SpectrumLine {
	id: string;
	label: string;
	role: LineRole;
	spectrum: SpectrumJson;
}

export interface TransmissionLine {
	id: string;
	label: string;
	transmission: { start: number; interval: number; values: number[] };
}

/** The grid references are drawn on: 380–780 nm at 5 nm (the daylight components' own step). */
const REFERENCE_GRID = { start: 380, end: 780, interval: 5 } as const;

const sig = (v: number) => (Number.isFinite(v) ? Number(v.toPrecision(6)) : 0);

export function toJson(s: Spectrum): SpectrumJson {
	return { start: s.start, interval: s.interval, values: Array.from(s.values, sig), scale: s.scale };
}

/**
 * The reference illuminant at a CCT (K), as CIE 13.3 §5.3 chooses it, on 380–780 nm at 5 nm;
 * null where there is none (not a positive CCT, or above 25 000 K).
 */
export function referenceAt(CCT: number | null | undefined): { spectrum: Spectrum; label: string } | null {
	if (CCT == null) return null;
	const { start, end, interval } = REFERENCE_GRID;
	const ref = criReferenceSpectrum(CCT, start, end, interval);
	if (!ref) return null;
	return { spectrum: ref.spectrum, label: `${ref.kind === 'Planckian' ? 'Planckian radiator' : 'CIE daylight'} at ${Math.round(CCT)} K` };
}

/** The line for a setup's target white: its own spectrum where it has one, else the reference at its CCT. */
export function targetLine(target: TargetWhite): SpectrumLine | null {
	if (target.spectrum) return { id: 'target', label: `Target white (${target.label})`, role: 'target', spectrum: toJson(target.spectrum) };
	const ref = referenceAt(target.CCT);
	return ref ? { id: 'target', label: `Target white as ${ref.label}`, role: 'target', spectrum: toJson(ref.spectrum) } : null;
}

async function setupTarget(projectId: number, setupId: number | null): Promise<TargetWhite | null> {
	if (setupId === null) return null;
	const s = await setups.read(projectId, setupId);
	if (!s?.target) return null;
	try {
		return await resolveStoredTarget(projectId, s.target, s.targetTolerance);
	} catch {
		return null;
	}
}

export interface ReadingDetail {
	reading: {
		id: number;
		label: string;
		kind: Reading['kind'];
		takenAt: string | null;
		createdAt: string;
		meter: string | null;
		notes: string | null;
		spectral: boolean;
		analysis: ReadingAnalysis;
	};
	setup: { id: number; name: string } | null;
	light: { id: number; label: string } | null;
	target: { label: string; x: number; y: number; tolerance: number; CCT: number | null; Duv: number | null } | null;
	/** The reading, the reference its CRI is computed against, and the target white (empty without a spectrum). */
	lines: SpectrumLine[];
}

/** Everything the reading page shows; null when the project has no such reading. */
export async function readingDetail(access: ProjectAccess, readingId: number): Promise<ReadingDetail | null> {
	const r = await readings.read(access.project.id, readingId);
	if (!r) return null;
	const [setup, light, target] = await Promise.all([
		r.setupId === null ? null : setups.read(access.project.id, r.setupId),
		r.lightId === null ? null : lights.read(access.project.id, r.lightId),
		setupTarget(access.project.id, r.setupId)
	]);
	const spectrum = readingSpectrum(r);
	const lines: SpectrumLine[] = [];
	if (spectrum) {
		lines.push({ id: `reading-${r.id}`, label: r.label, role: 'reading', spectrum: toJson(spectrum) });
		const ref = referenceAt(r.computed.cct_k);
		if (ref) lines.push({ id: 'reference', label: `CRI reference: ${ref.label}`, role: 'reference', spectrum: toJson(ref.spectrum) });
		const t = target ? targetLine(target) : null;
		if (t) lines.push(t);
	}
	return {
		reading: { id: r.id, label: r.label, kind: r.kind, takenAt: r.takenAt, createdAt: r.createdAt, meter: r.meter, notes: r.notes, spectral: spectrum !== null, analysis: r.computed },
		setup: setup ? { id: setup.id, name: setup.name } : null,
		light: light ? { id: light.id, label: light.label } : null,
		target: target ? { label: target.label, x: target.x, y: target.y, tolerance: target.tolerance, CCT: target.CCT, Duv: target.Duv } : null,
		lines
	};
}

export interface LightSpectra {
	light: { id: number; label: string };
	reading: { id: number; label: string; spectral: boolean } | null;
	/** The reading, the target white, and with a stack the predicted spectrum through it. */
	lines: SpectrumLine[];
	transmissions: TransmissionLine[];
	stack: { ids: string[]; label: string } | null;
}

/**
 * A light's reading (its latest, or `readingId` if it is one of the light's) against the setup's
 * target, and through the gel stack `stackIds` (built-in, overridden or custom filters of the
 * project). Throws ApiError 404 for a light or reading not in the project, 400 for an unknown filter.
 */
export async function lightSpectra(access: ProjectAccess, lightId: number, o: { readingId?: number; stackIds?: string[] } = {}): Promise<LightSpectra> {
	const light = await lights.read(access.project.id, lightId);
	if (!light) throw new ApiError(404, 'not_found', 'There is no such light in this project.');
	let r: Reading | null = null;
	if (o.readingId !== undefined) {
		r = await readings.read(access.project.id, o.readingId);
		if (!r || r.lightId !== light.id) throw new ApiError(404, 'not_found', 'There is no such reading of this light.');
	} else {
		r = (await readings.latestByLight(light.setupId)).get(light.id) ?? null;
	}
	const ids = o.stackIds ?? [];
	let stack: Gel[] = [];
	if (ids.length) {
		const library = await solverLibrary(access.project.id);
		const all = [...gelLibrary(library.overrides), ...library.extraGels];
		stack = ids.map((id) => {
			const g = all.find((x) => x.id === id);
			if (!g) throw new ApiError(400, 'unknown_filter', `There is no filter “${id}” in this project’s library.`);
			return g;
		});
	}
	const out: LightSpectra = { light: { id: light.id, label: light.label }, reading: null, lines: [], transmissions: [], stack: stack.length ? { ids: [...ids], label: stack.map((g) => g.label).join(' + ') } : null };
	if (!r) return out;
	const spectrum = readingSpectrum(r);
	out.reading = { id: r.id, label: r.label, spectral: spectrum !== null };
	if (!spectrum) return out;
	out.lines.push({ id: `reading-${r.id}`, label: r.label, role: 'reading', spectrum: toJson(spectrum) });
	const target = await setupTarget(access.project.id, light.setupId);
	const t = target ? targetLine(target) : null;
	if (t) out.lines.push(t);
	if (stack.length) {
		const tau = stackTransmission(stack);
		out.transmissions.push({ id: 'stack', label: out.stack!.label, transmission: { start: tau.start, interval: tau.interval, values: Array.from(tau.values, sig) } });
		out.lines.push({ id: 'predicted', label: `Predicted through ${out.stack!.label}`, role: 'predicted', spectrum: toJson(multiplySpectra(spectrum, tau)) });
	}
	return out;
}
