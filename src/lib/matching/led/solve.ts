/**
 * LED fixes: channel levels (0–1) that put a fixture on a target chromaticity with the most light.
 *
 * Inside the gamut the target is met exactly: maximise Y = Σ lᵢ Yᵢ subject to the two linear
 * chromaticity equations Σ lᵢ (4Xᵢ − u'·Dᵢ) = 0 and Σ lᵢ (9Yᵢ − v'·Dᵢ) = 0 (Dᵢ = Xᵢ + 15Yᵢ + 3Zᵢ;
 * equivalent to Σ lᵢ (Xᵢ − x/y·Yᵢ) = 0 and Σ lᵢ (Zᵢ − z/y·Yᵢ) = 0) and 0 ≤ lᵢ ≤ 1: a linear
 * programme. With three channels the solution is unique up to scale; with more, the LP picks the
 * brightest of the exact mixes. The LP's vertex is then polished: the levels strictly between 0
 * and 1 are corrected by the least-norm step that zeroes the equation residual, so the chromaticity
 * is exact to rounding.
 *
 * Outside the gamut the nearest reachable chromaticity in u'v' (see gamut.ts) is aimed for
 * instead, using only the channels on that gamut edge, and the result says so in a sentence.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §7.3, §8.1 (xy, u'v').
 *   G. B. Dantzig, "Linear Programming and Extensions", Princeton University Press, 1963.
 *
 * Units: levels 0–1; output Y on the fixture's relative flux scale (see profiles.ts).
 */
import { colourRenderingIndex, spectralSimilarityIndex, type Spectrum } from '../../colour';
import { summariseXYZ, type ChromaticityInput, type ChromaticitySummary } from '../chromaticity';
import { LED_CAUTION } from '../cautions';
import { levelToDmx16, levelToDmx8 } from '../dmx';
import { solveLinearProgramme } from '../lp';
import { distance, isTargetWhite, resolveTargetWhite, type Distance, type TargetSpec, type TargetWhite } from '../target';
import { locateInGamut, nearestOnBoundary, type Point } from './gamut';
import { resolveFixture, type FixtureProfile, type ResolvedFixture } from './profiles';

export interface ChannelSetting {
	id: string;
	label: string;
	/** 0–1. */
	level: number;
	percent: number;
	dmx8: number;
	dmx16: { value: number; coarse: number; fine: number };
}

export interface LedFix {
	fixture: { id: string; label: string; kind: string; generic: boolean };
	target: TargetWhite;
	/** The target lies inside the fixture's gamut and is met exactly. */
	inGamut: boolean;
	/** What the solver did, in plain words. */
	note: string;
	channels: ChannelSetting[];
	predicted: ChromaticitySummary & { Ra: number | null; SSI: number | null };
	/** Y of the mix on the fixture's flux scale. */
	output: number;
	/** Output / (all channels at full). */
	relativeOutput: number;
	/** Distance of the predicted mix from the target. */
	distance: Distance;
	/** For two-channel (bi-colour) fixtures: the CCT the mix sits at and the Duv still missing. */
	bicolour: { cctSettingK: number | null; mixDuv: number | null; greenMagentaDuv: number | null; note: string } | null;
	cautions: string[];
	warnings: string[];
}

export interface LedSolveOptions {
	/** Compute Ra and SSI of the mix (default true). */
	quality?: boolean;
	/** SSI reference (e.g. a hero fixture's spectrum); default: the colour core's choice. */
	ssiReference?: Spectrum;
	tolerance?: number;
}

export type LedTarget = TargetWhite | TargetSpec | ChromaticityInput;

export function toTargetWhite(target: LedTarget, tolerance?: number): TargetWhite {
	if (isTargetWhite(target)) return target;
	if ('kind' in (target as object)) return resolveTargetWhite(target as TargetSpec, { tolerance });
	const t = target as ChromaticityInput;
	if ('spectrum' in t) return resolveTargetWhite({ kind: 'reading', spectrum: t.spectrum }, { tolerance });
	if ('u_prime' in t) return resolveTargetWhite({ kind: 'uvPrime', u_prime: t.u_prime, v_prime: t.v_prime }, { tolerance });
	if ('CCT' in t) return resolveTargetWhite({ kind: 'cct', CCT: t.CCT, Duv: t.Duv }, { tolerance });
	if ('X' in t) {
		const s = t.X + t.Y + t.Z;
		return resolveTargetWhite({ kind: 'xy', x: t.X / s, y: t.Y / s }, { tolerance });
	}
	return resolveTargetWhite({ kind: 'xy', x: t.x, y: t.y }, { tolerance });
}

function channelD(f: ResolvedFixture): number[] {
	return f.channels.map((c) => c.XYZ.X + 15 * c.XYZ.Y + 3 * c.XYZ.Z);
}

/** Equation rows (u' and v') for aiming at p, scaled to unit size. */
function chromaticityRows(f: ResolvedFixture, p: Point): number[][] {
	const D = channelD(f);
	const ru = f.channels.map((c, i) => 4 * c.XYZ.X - p.u * D[i]);
	const rv = f.channels.map((c, i) => 9 * c.XYZ.Y - p.v * D[i]);
	const norm = (r: number[]) => {
		const m = Math.max(...r.map(Math.abs)) || 1;
		return r.map((a) => a / m);
	};
	return [norm(ru), norm(rv)];
}

/** Least-norm correction of the free levels so that rows·l = 0 (two passes). */
export function polishLevels(levels: Float64Array, rows: number[][]): void {
	for (let pass = 0; pass < 3; pass++) {
		const free: number[] = [];
		for (let i = 0; i < levels.length; i++) if (levels[i] > 1e-9 && levels[i] < 1 - 1e-9) free.push(i);
		if (free.length === 0) return;
		const r = rows.map((row) => row.reduce((s, a, i) => s + a * levels[i], 0));
		// G = A_F A_Fᵀ (m × m), solve G y = r, Δ = −A_Fᵀ y.
		const m = rows.length;
		const G = rows.map((ri) => rows.map((rj) => free.reduce((s, i) => s + ri[i] * rj[i], 0)));
		let y: number[];
		if (m === 1) {
			y = G[0][0] > 1e-300 ? [r[0] / G[0][0]] : [0];
		} else {
			const det = G[0][0] * G[1][1] - G[0][1] * G[1][0];
			const scale = Math.max(Math.abs(G[0][0] * G[1][1]), 1e-300);
			if (Math.abs(det) > 1e-12 * scale) {
				y = [(G[1][1] * r[0] - G[0][1] * r[1]) / det, (G[0][0] * r[1] - G[1][0] * r[0]) / det];
			} else {
				// Rank one (a single free level): least squares along the stronger row.
				const k = G[0][0] >= G[1][1] ? 0 : 1;
				y = [0, 0];
				y[k] = G[k][k] > 1e-300 ? r[k] / G[k][k] : 0;
			}
		}
		for (const i of free) {
			let d = 0;
			for (let k = 0; k < m; k++) d += rows[k][i] * y[k];
			levels[i] = Math.min(1, Math.max(0, levels[i] - d));
		}
	}
}

/** Brightest levels meeting `rows` exactly, among the channels in `use` (others 0). */
export function maximiseOutput(f: ResolvedFixture, rows: number[][], use: number[], extra: { minY?: number } = {}): Float64Array {
	const n = use.length;
	const lp = solveLinearProgramme({
		objective: use.map((i) => f.channels[i].XYZ.Y),
		sense: 'max',
		equalities: rows.map((row) => ({ coefficients: use.map((i) => row[i]), rhs: 0 })),
		greaterOrEqual: extra.minY !== undefined ? [{ coefficients: use.map((i) => f.channels[i].XYZ.Y), rhs: extra.minY }] : undefined,
		upperBounds: new Array(n).fill(1)
	});
	const levels = new Float64Array(f.channels.length);
	if (!lp.feasible) return levels;
	use.forEach((i, k) => (levels[i] = lp.x[k]));
	polishLevels(levels, rows);
	return levels;
}

export function mixXYZ(f: ResolvedFixture, levels: ArrayLike<number>): { X: number; Y: number; Z: number } {
	let X = 0;
	let Y = 0;
	let Z = 0;
	f.channels.forEach((c, i) => {
		X += levels[i] * c.XYZ.X;
		Y += levels[i] * c.XYZ.Y;
		Z += levels[i] * c.XYZ.Z;
	});
	return { X, Y, Z };
}

export function mixSpectrum(f: ResolvedFixture, levels: ArrayLike<number>): Spectrum {
	const s0 = f.channels[0].spectrum;
	const v = new Float64Array(s0.values.length);
	f.channels.forEach((c, k) => {
		const l = levels[k];
		if (l === 0) return;
		for (let i = 0; i < v.length; i++) v[i] += l * c.spectrum.values[i];
	});
	return { ...s0, values: v };
}

/** Scale so the largest level is exactly 1 (the brightest version of this mix). */
function scaleToFull(levels: Float64Array): void {
	const m = Math.max(...levels);
	if (m > 0) for (let i = 0; i < levels.length; i++) levels[i] = Math.min(1, levels[i] / m);
}

export interface AimResult {
	levels: Float64Array;
	inGamut: boolean;
	aimed: Point;
	gamutDistance: number;
}

/** The brightest mix at the target, or at the nearest gamut point when the target is outside. */
export function aimFixture(f: ResolvedFixture, target: Point): AimResult {
	const points = f.channels.map((c) => ({ u: c.u_prime, v: c.v_prime }));
	const loc = locateInGamut(target, points);
	const all = f.channels.map((_, i) => i);
	if (loc.inside) {
		const rows = chromaticityRows(f, target);
		const levels = maximiseOutput(f, rows, all);
		if (mixXYZ(f, levels).Y > 1e-9 * f.totalY) return { levels, inGamut: true, aimed: target, gamutDistance: 0 };
	}
	// On the boundary (or inside by a hair, where the LP found no light): only channels on the
	// supporting line of the nearest edge can take part.
	const boundary = loc.edge ? { edge: loc.edge, point: loc.nearest } : nearestOnBoundary(target, points);
	const [a, b] = boundary.edge;
	const levels = new Float64Array(f.channels.length);
	if (a === b) {
		levels[a] = 1;
	} else {
		const pa = points[a];
		const pb = points[b];
		const len = Math.hypot(pb.u - pa.u, pb.v - pa.v);
		const on = all.filter((i) => Math.abs(((pb.u - pa.u) * (points[i].v - pa.v) - (pb.v - pa.v) * (points[i].u - pa.u)) / len) < 1e-9);
		// One equation along the edge: Σ lᵢ Dᵢ (sᵢ − s*) = 0 with s the position along the edge.
		const D = channelD(f);
		const dir = { u: (pb.u - pa.u) / len, v: (pb.v - pa.v) / len };
		const s = (p: Point) => (p.u - pa.u) * dir.u + (p.v - pa.v) * dir.v;
		const sStar = s(boundary.point);
		const row = f.channels.map((_, i) => (on.includes(i) ? D[i] * (s(points[i]) - sStar) : 0));
		const m = Math.max(...row.map(Math.abs)) || 1;
		const lv = maximiseOutput(f, [row.map((x) => x / m)], on);
		if (mixXYZ(f, lv).Y > 0) {
			levels.set(lv);
		} else {
			// Closed form for two channels: weights wᵢ = lᵢ Dᵢ in proportion (1 − t) : t.
			const t = Math.min(1, Math.max(0, sStar / len));
			levels[a] = (1 - t) / D[a];
			levels[b] = t / D[b];
		}
		scaleToFull(levels);
	}
	const gap = Math.hypot(target.u - boundary.point.u, target.v - boundary.point.v);
	return { levels, inGamut: gap <= 1e-9, aimed: boundary.point, gamutDistance: gap };
}

export function channelSettings(f: ResolvedFixture, levels: ArrayLike<number>): ChannelSetting[] {
	return f.channels.map((c, i) => {
		const level = Math.min(1, Math.max(0, levels[i]));
		return { id: c.id, label: c.label, level, percent: level * 100, dmx8: levelToDmx8(level), dmx16: levelToDmx16(level) };
	});
}

const fmt4 = (v: number) => v.toFixed(4);

/** Assemble the fix: settings, prediction, distance, notes. */
export function describeFix(
	f: ResolvedFixture,
	target: TargetWhite,
	aim: AimResult,
	options: LedSolveOptions,
	extraNote = ''
): LedFix {
	const XYZ = mixXYZ(f, aim.levels);
	const warnings: string[] = [];
	if (!(XYZ.Y > 0)) throw new RangeError('The fixture produced no light for this target.');
	const summary = summariseXYZ(XYZ);
	warnings.push(...summary.warnings);
	let Ra: number | null = null;
	let SSI: number | null = null;
	if (options.quality ?? true) {
		const s = mixSpectrum(f, aim.levels);
		try {
			Ra = colourRenderingIndex(s).Ra;
		} catch (e) {
			warnings.push(`No CRI: ${(e as Error).message}`);
		}
		try {
			SSI = spectralSimilarityIndex(s, options.ssiReference);
		} catch (e) {
			warnings.push(`No SSI: ${(e as Error).message}`);
		}
	}
	const dist = distance(summary, target);
	const note = aim.inGamut
		? `The target is inside this fixture's gamut and is met exactly at the most light these channels give.${extraNote}`
		: `The target is outside this fixture's gamut: the nearest colour it can make is ${fmt4(aim.gamutDistance)} Δu′v′ away (u′ ${fmt4(aim.aimed.u)}, v′ ${fmt4(aim.aimed.v)})` +
			(dist.within ? ', within the tolerance.' : ', outside the tolerance: add a gel or choose another fixture.') +
			extraNote;
	const bicolour =
		f.channels.length === 2
			? {
					cctSettingK: summary.CCT,
					mixDuv: summary.Duv,
					greenMagentaDuv: summary.Duv !== null && target.Duv !== null ? target.Duv - summary.Duv : null,
					note:
						summary.CCT !== null
							? `Set the fixture to about ${Math.round(summary.CCT)} K. ` +
								(summary.Duv !== null && target.Duv !== null && Math.abs(target.Duv - summary.Duv) > 0.0005
									? `The target needs a further ${target.Duv - summary.Duv > 0 ? '+' : '−'}${Math.abs(target.Duv - summary.Duv).toFixed(4)} Duv (${target.Duv - summary.Duv > 0 ? 'toward green' : 'toward magenta'}): a green/magenta control or a plus/minus green gel.`
									: 'No green/magenta offset is needed.')
							: 'This mix has no meaningful colour temperature.'
				}
			: null;
	return {
		fixture: { id: f.profile.id, label: f.profile.label, kind: f.profile.kind, generic: f.profile.generic },
		target,
		inGamut: aim.inGamut,
		note,
		channels: channelSettings(f, aim.levels),
		predicted: { ...summary, Ra, SSI },
		output: XYZ.Y,
		relativeOutput: XYZ.Y / f.totalY,
		distance: dist,
		bicolour,
		cautions: [LED_CAUTION],
		warnings
	};
}

/** Brightest channel levels for the target (see module header). */
export function solveLedFix(fixture: FixtureProfile | ResolvedFixture, target: LedTarget, options: LedSolveOptions = {}): LedFix {
	const f = 'channels' in fixture && 'totalY' in fixture ? (fixture as ResolvedFixture) : resolveFixture(fixture as FixtureProfile);
	const T = toTargetWhite(target, options.tolerance);
	const aim = aimFixture(f, { u: T.u_prime, v: T.v_prime });
	return describeFix(f, T, aim, options);
}
