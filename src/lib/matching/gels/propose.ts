/**
 * Gel fixes: rank stacks of up to three filters that bring a source to a target white.
 *
 * With a measured spectrum the prediction is spectral: source × Π transmissions → XYZ (CIE 1931
 * 2°) → xy, u'v', CCT, Duv, and CRI Ra for the proposals returned. With only a chromaticity it is
 * mired and Duv arithmetic (shifts added), flagged `estimate: true`, because arithmetic suits
 * sources with a real colour temperature and not line or LED spectra (common practice).
 *
 * Stacks: filters multiply (order does not matter), repetition is allowed (a double CTO is a real
 * fix), at most one neutral density, and no CTO with CTB or plus green with minus green unless
 * `allowOpposing` (they partly undo each other and only lose light). ND is left out unless
 * `includeNeutralDensity`, since it never moves colour. The empty stack is always considered: a
 * light already on target needs nothing.
 *
 * Ranking: by residual Δu'v' to the target, counted in steps of half the target's tolerance
 * (0.001 for the default 0.002: [0, 0.001) well within, [0.001, 0.002) within, then outside step by
 * step), then by light loss, then by fewer filters. Residuals closer than half the visible-mismatch
 * tolerance are treated as equally good, so among those the fix that keeps the most light comes
 * first instead of a three-sheet stack that is 0.0003 closer. `residualStep` changes the step.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §7.1–7.3, §8.1 (XYZ, xy, u'v').
 *   CIE 13.3-1995, Method of measuring and specifying colour rendering properties of light
 *   sources (Ra, via the colour core).
 *   Y. Ohno, LEUKOS 10(1), 47–55, 2014, doi:10.1080/15502724.2013.839020 (CCT, Duv).
 */
import { alignSpectrum, colourRenderingIndex, CCTToXy, type Spectrum } from '../../colour';
import { inputToXy, summariseXy, xyzWeights, type ChromaticityInput, type ChromaticitySummary } from '../chromaticity';
import { GEL_HEAT_CAUTION, HOUSE_LIGHT_CAUTION } from '../cautions';
import { distance, isTargetWhite, resolveTargetWhite, type Distance, type TargetSpec, type TargetWhite } from '../target';
import type { GelFamily, GelOverrides } from './definitions';
import { arithmeticShift, gelLibrary, type Gel } from './library';

/** Residuals are compared in steps of this share of the target tolerance before light loss decides (see header). */
export const RESIDUAL_STEP_SHARE = 0.5;
export const MAX_STACK = 3;

export type GelSource = ({ spectrum: Spectrum } | Exclude<ChromaticityInput, { spectrum: Spectrum }>) & { label?: string };

export interface GelSearchOptions {
	/** Largest stack, 0–3 (default 3). */
	maxGels?: number;
	/** How many proposals to return (default 5). */
	top?: number;
	/** Per-project nominal figures. */
	overrides?: GelOverrides;
	/** Custom filters (see custom.ts) to search with the library. */
	extraGels?: Gel[];
	/** Only these filter ids. */
	only?: string[];
	/** Only these families. */
	families?: Array<GelFamily | 'custom'>;
	includeNeutralDensity?: boolean;
	allowOpposing?: boolean;
	/** Compute CRI Ra for the proposals (spectral only; default true). */
	computeRa?: boolean;
	/** Target tolerance when the target is given as a description (default 0.002). */
	tolerance?: number;
	/** Δu'v' step in which residuals count as equal before light loss decides (default: half the tolerance). */
	residualStep?: number;
}

export interface GelProposal {
	rank: number;
	gels: Array<{ id: string; label: string }>;
	/** E.g. "Full CTB + ⅛ CTB", or "no filter". */
	label: string;
	predicted: ChromaticitySummary & { Ra: number | null };
	/** Δu'v' from the target after the fix. */
	residual: number;
	distance: Distance;
	within: boolean;
	/** Light lost, stops. */
	lossStops: number;
	/** Sum of nominal shifts, and the shift actually predicted on this source (spectral only). */
	miredShift: { nominal: number; actual: number | null };
	estimate: boolean;
}

export type GelDirection = 'source-to-target' | 'lamp-to-house-light' | 'house-light-to-lamp';

export interface GelProposalResult {
	direction: GelDirection;
	estimate: boolean;
	/** How the prediction was made, in one or two sentences. */
	note: string;
	cautions: string[];
	source: ChromaticitySummary & { label: string };
	target: TargetWhite;
	/** The source's distance from the target before any filter. */
	before: Distance;
	proposals: GelProposal[];
	/** Stacks evaluated. */
	considered: number;
	warnings: string[];
}

export const ESTIMATE_NOTE =
	'Estimate from chromaticity only: the filters’ mired and Duv shifts were added by arithmetic, which suits tungsten and daylight but not fluorescent or LED light, and no CRI can be predicted. Measure a spectrum for a spectral prediction.';
export const SPECTRAL_NOTE =
	'Predicted from the measured spectrum times each filter’s modelled transmission; light loss is the nominal figure adjusted to this source.';

function stackLabel(gels: Gel[]): string {
	return gels.length ? gels.map((g) => g.label).join(' + ') : 'no filter';
}

function resolveTarget(target: TargetWhite | TargetSpec, tolerance?: number): TargetWhite {
	return isTargetWhite(target) ? target : resolveTargetWhite(target, { tolerance });
}

function selectGels(options: GelSearchOptions): Gel[] {
	let gels = [...gelLibrary(options.overrides), ...(options.extraGels ?? [])];
	const ids = new Set<string>();
	for (const g of gels) {
		if (ids.has(g.id)) throw new RangeError(`Two filters share the id "${g.id}".`);
		ids.add(g.id);
	}
	if (options.only) {
		for (const id of options.only) if (!ids.has(id)) throw new RangeError(`Unknown filter id "${id}".`);
		gels = gels.filter((g) => options.only?.includes(g.id));
	}
	if (options.families) gels = gels.filter((g) => options.families?.includes(g.family));
	if (!options.includeNeutralDensity && !options.only?.some((id) => id.startsWith('nd-'))) gels = gels.filter((g) => g.family !== 'ND');
	return gels;
}

/** Family counters for the stack rules. */
interface Counts {
	CTO: number;
	CTB: number;
	plus: number;
	minus: number;
	nd: number;
}
function allowed(c: Counts, allowOpposing: boolean): boolean {
	if (c.nd > 1) return false;
	if (!allowOpposing && ((c.CTO > 0 && c.CTB > 0) || (c.plus > 0 && c.minus > 0))) return false;
	return true;
}
function add(c: Counts, g: Gel, k: 1 | -1): void {
	if (g.family === 'CTO') c.CTO += k;
	else if (g.family === 'CTB') c.CTB += k;
	else if (g.family === 'plus-green') c.plus += k;
	else if (g.family === 'minus-green') c.minus += k;
	else if (g.family === 'ND') c.nd += k;
}

const stackCache = new Map<string, number[][]>();

/** Every allowed multiset of gel indices up to maxGels (pruned: a forbidden stack has no allowed superset). */
export function enumerateStacks(gels: Gel[], maxGels: number, allowOpposing: boolean): number[][] {
	const key = `${maxGels}|${allowOpposing}|${gels.map((g) => g.family).join(',')}`;
	const hit = stackCache.get(key);
	if (hit) return hit;
	const out = enumerate(gels, maxGels, allowOpposing);
	if (stackCache.size > 64) stackCache.clear();
	stackCache.set(key, out);
	return out;
}

function enumerate(gels: Gel[], maxGels: number, allowOpposing: boolean): number[][] {
	const out: number[][] = [[]];
	const c: Counts = { CTO: 0, CTB: 0, plus: 0, minus: 0, nd: 0 };
	const rec = (start: number, acc: number[]) => {
		if (acc.length === maxGels) return;
		for (let i = start; i < gels.length; i++) {
			add(c, gels[i], 1);
			if (allowed(c, allowOpposing)) {
				const next = [...acc, i];
				out.push(next);
				rec(i, next);
			}
			add(c, gels[i], -1);
		}
	};
	rec(0, []);
	return out;
}

interface Scored {
	idx: number[];
	residual: number;
	lossStops: number;
	X: number;
	Y: number;
	Z: number;
	xy: { x: number; y: number };
	nominal: number;
}

function rankCompare(a: Scored, b: Scored, step: number): number {
	return (
		Math.floor(a.residual / step) - Math.floor(b.residual / step) ||
		a.lossStops - b.lossStops ||
		a.idx.length - b.idx.length ||
		a.residual - b.residual
	);
}

const alignedCache = new WeakMap<Spectrum, Map<string, Float64Array>>();
/** A transmission on the source's grid (linear interpolation, end values held, as multiplySpectra does). */
function transmissionOn(g: Gel, start: number, interval: number, n: number): Float64Array {
	let m = alignedCache.get(g.transmission);
	if (!m) {
		m = new Map();
		alignedCache.set(g.transmission, m);
	}
	const key = `${start}|${interval}|${n}`;
	let v = m.get(key);
	if (!v) {
		v = alignSpectrum(g.transmission, start, start + (n - 1) * interval, interval, { outside: 'hold' }).spectrum.values;
		m.set(key, v);
	}
	return v;
}

function uvpDistance(X: number, Y: number, Z: number, ut: number, vt: number): number {
	const d = X + 15 * Y + 3 * Z;
	const du = (4 * X) / d - ut;
	const dv = (9 * Y) / d - vt;
	return Math.sqrt(du * du + dv * dv);
}

/** Samples whose source-weighted CMF values are below this share of the largest are left out of the search sums (exact sums follow for the proposals kept). */
const TRIM_SHARE = 1e-7;

interface SpectralPrep {
	n: number;
	/** Indices kept in the search sums. */
	keep: Int32Array;
	sx: Float64Array;
	sy: Float64Array;
	sz: Float64Array;
	/** Per gel: τ on the kept samples, and τ·s̄ for the last factor of a stack. */
	taus: Float64Array[];
	qx: Float64Array[];
	qy: Float64Array[];
	qz: Float64Array[];
	fullTaus: Float64Array[];
	fullSx: Float64Array;
	fullSy: Float64Array;
	fullSz: Float64Array;
	Yin: number;
}

function prepareSpectral(S: Spectrum, gels: Gel[]): SpectralPrep {
	const n = S.values.length;
	const w = xyzWeights(S.start, S.interval, n);
	const fullSx = new Float64Array(n);
	const fullSy = new Float64Array(n);
	const fullSz = new Float64Array(n);
	let Yin = 0;
	let peak = 0;
	for (let i = 0; i < n; i++) {
		const v = S.values[i];
		fullSx[i] = v * w.x[i];
		fullSy[i] = v * w.y[i];
		fullSz[i] = v * w.z[i];
		Yin += fullSy[i];
		peak = Math.max(peak, Math.abs(fullSx[i]), Math.abs(fullSy[i]), Math.abs(fullSz[i]));
	}
	if (!(Yin > 0)) throw new RangeError('The source spectrum has no visible power.');
	const kept: number[] = [];
	for (let i = 0; i < n; i++) {
		if (Math.max(Math.abs(fullSx[i]), Math.abs(fullSy[i]), Math.abs(fullSz[i])) >= TRIM_SHARE * peak) kept.push(i);
	}
	const keep = Int32Array.from(kept);
	const m = keep.length;
	const pick = (a: Float64Array) => {
		const out = new Float64Array(m);
		for (let k = 0; k < m; k++) out[k] = a[keep[k]];
		return out;
	};
	const sx = pick(fullSx);
	const sy = pick(fullSy);
	const sz = pick(fullSz);
	const fullTaus = gels.map((g) => transmissionOn(g, S.start, S.interval, n));
	const taus = fullTaus.map(pick);
	const mul = (a: Float64Array, b: Float64Array) => {
		const out = new Float64Array(m);
		for (let k = 0; k < m; k++) out[k] = a[k] * b[k];
		return out;
	};
	return {
		n,
		keep,
		sx,
		sy,
		sz,
		taus,
		qx: taus.map((t) => mul(t, sx)),
		qy: taus.map((t) => mul(t, sy)),
		qz: taus.map((t) => mul(t, sz)),
		fullTaus,
		fullSx,
		fullSy,
		fullSz,
		Yin
	};
}

/** Exact XYZ of the source through a stack (all samples). */
function exactXYZ(p: SpectralPrep, idx: number[]): { X: number; Y: number; Z: number } {
	let X = 0;
	let Y = 0;
	let Z = 0;
	for (let i = 0; i < p.n; i++) {
		let t = 1;
		for (const j of idx) t *= p.fullTaus[j][i];
		X += t * p.fullSx[i];
		Y += t * p.fullSy[i];
		Z += t * p.fullSz[i];
	}
	return { X, Y, Z };
}

function scoreXYZ(idx: number[], X: number, Y: number, Z: number, Yin: number, gels: Gel[], target: TargetWhite): Scored | null {
	if (!(Y > 0)) return null;
	let loss = -Math.log2(Y / Yin);
	for (const j of idx) loss += gels[j].lossOffsetStops;
	const sum = X + Y + Z;
	return {
		idx,
		residual: uvpDistance(X, Y, Z, target.u_prime, target.v_prime),
		lossStops: loss,
		X,
		Y,
		Z,
		xy: { x: X / sum, y: Y / sum },
		nominal: idx.reduce((s, j) => s + gels[j].miredShift, 0)
	};
}

/**
 * Scores every stack on the trimmed samples, then recomputes the best `keepBest` exactly. Stacks
 * are visited by their first two filters, whose product is formed once and dotted with the third
 * filter's τ·s̄ (three multiply-adds per sample and stack).
 */
function spectralSearch(S: Spectrum, gels: Gel[], stacks: number[][], target: TargetWhite, keepBest: number, step: number): Scored[] {
	const p = prepareSpectral(S, gels);
	const m = p.keep.length;
	const pair = new Float64Array(m);
	let pairKey = -1;
	const approx: Scored[] = [];
	for (const idx of stacks) {
		let X = 0;
		let Y = 0;
		let Z = 0;
		const L = idx.length;
		if (L === 0) {
			for (let k = 0; k < m; k++) {
				X += p.sx[k];
				Y += p.sy[k];
				Z += p.sz[k];
			}
		} else {
			const last = idx[L - 1];
			const qx = p.qx[last];
			const qy = p.qy[last];
			const qz = p.qz[last];
			if (L === 1) {
				for (let k = 0; k < m; k++) {
					X += qx[k];
					Y += qy[k];
					Z += qz[k];
				}
			} else {
				let front: Float64Array;
				if (L === 2) {
					front = p.taus[idx[0]];
				} else {
					// Stacks arrive grouped by their first two filters: form that product once per group.
					const key = idx[0] * 4096 + idx[1];
					if (key !== pairKey) {
						const ta = p.taus[idx[0]];
						const tb = p.taus[idx[1]];
						for (let k = 0; k < m; k++) pair[k] = ta[k] * tb[k];
						pairKey = key;
					}
					front = pair;
				}
				for (let k = 0; k < m; k++) {
					const t = front[k];
					X += t * qx[k];
					Y += t * qy[k];
					Z += t * qz[k];
				}
			}
		}
		const sc = scoreXYZ(idx, X, Y, Z, p.Yin, gels, target);
		if (sc) approx.push(sc);
	}
	approx.sort((a, b) => rankCompare(a, b, step));
	const exact: Scored[] = [];
	for (const a of approx.slice(0, keepBest)) {
		const c = exactXYZ(p, a.idx);
		const sc = scoreXYZ(a.idx, c.X, c.Y, c.Z, p.Yin, gels, target);
		if (sc) exact.push(sc);
	}
	return exact;
}

function arithmeticSearch(src: ChromaticitySummary, gels: Gel[], stacks: number[][], target: TargetWhite): Scored[] {
	const M = src.mired as number;
	const shifts = gels.map((g) => arithmeticShift(g, M));
	const scored: Scored[] = [];
	for (const idx of stacks) {
		let dM = 0;
		let dDuv = 0;
		let loss = 0;
		for (const j of idx) {
			dM += shifts[j].mired;
			dDuv += shifts[j].duv;
			loss += gels[j].lossStops;
		}
		const m = M + dM;
		if (!(m > 0)) continue;
		let xy: { x: number; y: number };
		try {
			xy = CCTToXy(1e6 / m, (src.Duv as number) + dDuv);
		} catch {
			continue; // beyond the range the locus is defined for
		}
		const d = xy.x + xy.y + (1 - xy.x - xy.y);
		const X = xy.x / d;
		const Y = xy.y / d;
		const Z = 1 - X - Y;
		scored.push({
			idx,
			residual: uvpDistance(X, Y, Z, target.u_prime, target.v_prime),
			lossStops: loss,
			X,
			Y,
			Z,
			xy,
			nominal: idx.reduce((s, j) => s + shifts[j].mired, 0)
		});
	}
	return scored;
}

function sourceSpectrum(source: GelSource): Spectrum | null {
	return 'spectrum' in source && source.spectrum ? source.spectrum : null;
}

/**
 * Rank gel stacks that bring `source` to `target` (see module header). Works both ways: the source
 * is whatever light gets the filter, a lamp or a house light.
 */
export function proposeGelsForSourceToTarget(
	source: GelSource,
	target: TargetWhite | TargetSpec,
	options: GelSearchOptions = {},
	direction: GelDirection = 'source-to-target'
): GelProposalResult {
	const maxGels = options.maxGels ?? MAX_STACK;
	if (!Number.isInteger(maxGels) || maxGels < 0 || maxGels > MAX_STACK) throw new RangeError(`A stack holds 0 to ${MAX_STACK} filters.`);
	const top = options.top ?? 5;
	if (!Number.isInteger(top) || top < 1) throw new RangeError('Ask for at least one proposal.');
	const T = resolveTarget(target, options.tolerance);
	const step = options.residualStep ?? T.tolerance * RESIDUAL_STEP_SHARE;
	if (!(step > 0)) throw new RangeError('residualStep must be a Δu′v′ above 0.');
	const gels = selectGels(options);
	const stacks = enumerateStacks(gels, maxGels, options.allowOpposing ?? false);
	const S = sourceSpectrum(source);
	const warnings: string[] = [];
	const src = summariseXy(inputToXy(S ? { spectrum: S } : (source as ChromaticityInput)));
	warnings.push(...src.warnings);
	const sourceInfo = { ...src, label: source.label ?? 'source' };
	const before = distance(src, T);
	const cautions = [GEL_HEAT_CAUTION, ...(direction === 'house-light-to-lamp' ? [HOUSE_LIGHT_CAUTION] : [])];

	if (!S && src.mired === null) {
		return {
			direction,
			estimate: true,
			note: 'This light has no meaningful colour temperature, so mired arithmetic cannot estimate a fix. Measure a spectrum for a spectral prediction.',
			cautions,
			source: sourceInfo,
			target: T,
			before,
			proposals: [],
			considered: 0,
			warnings
		};
	}

	// The search sums skip negligible samples; the leaders (with a wide margin) are recomputed exactly.
	const scored = S ? spectralSearch(S, gels, stacks, T, Math.max(3 * top, top + 20), step) : arithmeticSearch(src, gels, stacks, T);
	scored.sort((a, b) => rankCompare(a, b, step));
	const srcMired = src.mired;
	const proposals = scored.slice(0, top).map((s, k): GelProposal => {
		const stack = s.idx.map((j) => gels[j]);
		const summary = summariseXy(s.xy);
		let Ra: number | null = null;
		if (S && (options.computeRa ?? true)) {
			const v = new Float64Array(S.values.length);
			const taus = stack.map((g) => transmissionOn(g, S.start, S.interval, S.values.length));
			for (let i = 0; i < v.length; i++) {
				let t = S.values[i];
				for (const tau of taus) t *= tau[i];
				v[i] = t;
			}
			try {
				Ra = colourRenderingIndex({ ...S, values: v }).Ra;
			} catch (e) {
				warnings.push(`No CRI for ${stackLabel(stack)}: ${(e as Error).message}`);
			}
		}
		const dist = distance(summary, T);
		return {
			rank: k + 1,
			gels: stack.map((g) => ({ id: g.id, label: g.label })),
			label: stackLabel(stack),
			predicted: { ...summary, Ra },
			residual: s.residual,
			distance: dist,
			within: dist.within,
			lossStops: s.lossStops,
			miredShift: {
				nominal: s.nominal,
				actual: S && summary.mired !== null && srcMired !== null ? summary.mired - srcMired : null
			},
			estimate: !S
		};
	});
	return {
		direction,
		estimate: !S,
		note: S ? SPECTRAL_NOTE : ESTIMATE_NOTE,
		cautions,
		source: sourceInfo,
		target: T,
		before,
		proposals,
		considered: stacks.length,
		warnings
	};
}

function asTargetSpec(s: GelSource, fallbackLabel: string): TargetSpec {
	const S = sourceSpectrum(s);
	if (S) return { kind: 'reading', spectrum: S, label: s.label ?? fallbackLabel };
	const xy = inputToXy(s as ChromaticityInput);
	return { kind: 'reading', x: xy.x, y: xy.y, label: s.label ?? fallbackLabel };
}

/**
 * Gel the lamp toward the house light: the lamp gets the filter; the target is the house light's
 * own colour (or an explicit target white, which wins if given).
 */
export function proposeGelsForLamp(
	input: { lamp: GelSource; houseLight?: GelSource; target?: TargetWhite | TargetSpec },
	options: GelSearchOptions = {}
): GelProposalResult {
	const target = input.target ?? (input.houseLight ? asTargetSpec(input.houseLight, 'house light') : null);
	if (!target) throw new RangeError('Give the house light reading or a target white.');
	return proposeGelsForSourceToTarget(input.lamp, target, options, 'lamp-to-house-light');
}

/**
 * Gel the house light toward the lamp or a target white (e.g. minus green sleeves on fluorescent
 * tubes): the house light gets the filter.
 */
export function proposeGelsForHouseLight(
	input: { houseLight: GelSource; lamp?: GelSource; target?: TargetWhite | TargetSpec },
	options: GelSearchOptions = {}
): GelProposalResult {
	const target = input.target ?? (input.lamp ? asTargetSpec(input.lamp, 'lamp') : null);
	if (!target) throw new RangeError('Give the lamp reading or a target white.');
	return proposeGelsForSourceToTarget(input.houseLight, target, options, 'house-light-to-lamp');
}
