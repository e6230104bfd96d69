/**
 * LED fixes for spectral quality: among the channel mixes that meet the target chromaticity
 * exactly and give at least a chosen share of the fixture's maximum output there, the one with
 * the highest CRI Ra or SSI.
 *
 * Method. The exact mixes form a convex polytope Q = {l : 0 ≤ lᵢ ≤ 1, A·l = 0, Σ lᵢYᵢ ≥ Y_min}
 * (A: the two chromaticity equations of solve.ts); with n channels it has n − 2 dimensions. Ra and
 * SSI depend on the shape of the spectrum, not its level, so every candidate is finally scaled up
 * until one channel reaches full (which only adds light). The search:
 *   1. an interior start: the mean of the LP vertices that maximise and minimise each level in Q;
 *   2. hit-and-run sampling (R. L. Smith, "Efficient Monte Carlo procedures for generating points
 *      uniformly distributed over bounded regions", Operations Research 32(6), 1243–1250, 1984):
 *      from the current point, a random direction in the null space of A, a uniform point on the
 *      chord of Q along it; every sample is scored;
 *   3. a compass (pattern) search from the best sample along ± each null-space basis direction,
 *      halving the step when nothing improves (T. G. Kolda, R. M. Lewis, V. Torczon,
 *      "Optimization by direct search", SIAM Review 45(3), 385–482, 2003).
 * Deterministic for a given seed. The metric is not smooth (Ra averages eight samples' colour
 * shifts), so this finds a good mix, not a proven optimum; the result reports the metric at the
 * brightest mix for comparison.
 *
 * References:
 *   CIE 13.3-1995 (Ra) and the Academy Spectral Similarity Index (2020), via the colour core.
 */
import { colourRenderingIndex, spectralSimilarityIndex, type Spectrum } from '../../colour';
import { solveLinearProgramme } from '../lp';
import { aimFixture, describeFix, mixSpectrum, toTargetWhite, type LedFix, type LedSolveOptions, type LedTarget } from './solve';
import { resolveFixture, type FixtureProfile, type ResolvedFixture } from './profiles';

export interface LedQualityOptions extends LedSolveOptions {
	metric: 'Ra' | 'SSI';
	/** Least output accepted, as a share of the most this fixture gives at the target (default 0.8). */
	minOutput?: number;
	/** Hit-and-run samples (default 150). */
	samples?: number;
	seed?: number;
}

export interface LedQualityFix extends LedFix {
	quality: {
		metric: 'Ra' | 'SSI';
		value: number;
		/** The metric at the brightest mix. */
		atMaximumOutput: number;
		/** Output of this mix / output of the brightest mix. */
		outputShare: number;
		minOutput: number;
		evaluations: number;
		method: string;
	};
}

/** Small deterministic generator (mulberry32). */
function rng(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

function gaussian(r: () => number): number {
	return Math.sqrt(-2 * Math.log(1 - r())) * Math.cos(2 * Math.PI * r());
}

/** Orthonormal basis of the null space of the rows (Gram–Schmidt). */
export function nullSpace(rows: number[][], n: number): number[][] {
	const basis: number[][] = [];
	const dot = (a: number[], b: number[]) => a.reduce((s, x, i) => s + x * b[i], 0);
	const ortho = (v: number[], against: number[][]) => {
		for (const b of against) {
			const d = dot(v, b);
			for (let i = 0; i < n; i++) v[i] -= d * b[i];
		}
		return v;
	};
	const rowBasis: number[][] = [];
	for (const r of rows) {
		const v = ortho([...r], rowBasis);
		const len = Math.hypot(...v);
		if (len > 1e-12) rowBasis.push(v.map((x) => x / len));
	}
	for (let k = 0; k < n && basis.length < n - rowBasis.length; k++) {
		const e = new Array(n).fill(0);
		e[k] = 1;
		const v = ortho(ortho(e, rowBasis), basis);
		const len = Math.hypot(...v);
		if (len > 1e-9) basis.push(v.map((x) => x / len));
	}
	return basis;
}

/** The chord {t : l + t·d ∈ Q}. */
function chord(l: number[], d: number[], Y: number[], Ymin: number): [number, number] {
	let lo = -Infinity;
	let hi = Infinity;
	for (let i = 0; i < l.length; i++) {
		if (Math.abs(d[i]) < 1e-15) continue;
		const a = (0 - l[i]) / d[i];
		const b = (1 - l[i]) / d[i];
		lo = Math.max(lo, Math.min(a, b));
		hi = Math.min(hi, Math.max(a, b));
	}
	const yd = Y.reduce((s, y, i) => s + y * d[i], 0);
	const yl = Y.reduce((s, y, i) => s + y * l[i], 0);
	if (Math.abs(yd) > 1e-15) {
		const t = (Ymin - yl) / yd;
		if (yd > 0) lo = Math.max(lo, t);
		else hi = Math.min(hi, t);
	}
	return [lo, hi];
}

/** The mix with the best Ra or SSI at the target, at no less than minOutput of the brightest mix (see header). */
export function solveLedQualityFix(fixture: FixtureProfile | ResolvedFixture, target: LedTarget, options: LedQualityOptions): LedQualityFix {
	const f = 'totalY' in fixture ? (fixture as ResolvedFixture) : resolveFixture(fixture as FixtureProfile);
	const T = toTargetWhite(target, options.tolerance);
	const minOutput = options.minOutput ?? 0.8;
	if (!(minOutput > 0 && minOutput <= 1)) throw new RangeError('minOutput is a share of the maximum output, above 0 and at most 1.');
	if (options.metric !== 'Ra' && options.metric !== 'SSI') throw new RangeError("metric must be 'Ra' or 'SSI'.");
	const samples = options.samples ?? 150;
	const score = (s: Spectrum): number => {
		try {
			return options.metric === 'Ra' ? colourRenderingIndex(s).Ra : spectralSimilarityIndex(s, options.ssiReference, { round: false });
		} catch {
			return -Infinity;
		}
	};
	const best = aimFixture(f, { u: T.u_prime, v: T.v_prime });
	const brightY = f.channels.reduce((s, c, i) => s + c.XYZ.Y * best.levels[i], 0);
	const atMax = score(mixSpectrum(f, best.levels));
	let evaluations = 1;
	const n = f.channels.length;
	const Y = f.channels.map((c) => c.XYZ.Y);
	const Ymin = minOutput * brightY;
	const aimedRows = (() => {
		const D = f.channels.map((c) => c.XYZ.X + 15 * c.XYZ.Y + 3 * c.XYZ.Z);
		const ru = f.channels.map((c, i) => 4 * c.XYZ.X - best.aimed.u * D[i]);
		const rv = f.channels.map((c, i) => 9 * c.XYZ.Y - best.aimed.v * D[i]);
		const nm = (r: number[]) => {
			const m = Math.max(...r.map(Math.abs)) || 1;
			return r.map((a) => a / m);
		};
		return [nm(ru), nm(rv)];
	})();
	// Channels off the aimed point's face must stay at 0 when the target is outside the gamut.
	const active = best.inGamut ? f.channels.map(() => true) : Array.from(best.levels, (l) => l > 0);
	const N = nullSpace(
		[...aimedRows, ...active.flatMap((on, i) => (on ? [] : [Array.from({ length: n }, (_, k) => (k === i ? 1 : 0))]))],
		n
	);
	let bestLevels = Array.from(best.levels);
	let bestScore = atMax;
	const method =
		'Hit-and-run sampling of the exact mixes at or above the output floor, then a compass search; each candidate scaled to full.';
	if (N.length > 0) {
		// 1. Interior start from LP vertices.
		const vertices: number[][] = [];
		for (let k = 0; k < n; k++) {
			if (!active[k]) continue;
			for (const sense of ['max', 'min'] as const) {
				const obj = new Array(n).fill(0);
				obj[k] = 1;
				const lp = solveLinearProgramme({
					objective: obj,
					sense,
					equalities: aimedRows.map((r) => ({ coefficients: r, rhs: 0 })),
					greaterOrEqual: [{ coefficients: Y, rhs: Ymin }],
					lessOrEqual: active.flatMap((on, i) => (on ? [] : [{ coefficients: obj.map((_, j) => (j === i ? 1 : 0)), rhs: 0 }])),
					upperBounds: new Array(n).fill(1)
				});
				if (lp.feasible) vertices.push(Array.from(lp.x));
			}
		}
		if (vertices.length > 0) {
			let cur = vertices[0].map((_, i) => vertices.reduce((s, v) => s + v[i], 0) / vertices.length);
			const r = rng(options.seed ?? 1);
			const consider = (l: number[]) => {
				const s = score(mixSpectrum(f, scaleUp(l)));
				evaluations++;
				if (s > bestScore) {
					bestScore = s;
					bestLevels = scaleUp(l);
				}
				return s;
			};
			consider(cur);
			// 2. Hit-and-run.
			for (let k = 0; k < samples; k++) {
				const z = N.map(() => gaussian(r));
				const d = new Array(n).fill(0);
				N.forEach((b, j) => b.forEach((x, i) => (d[i] += z[j] * x)));
				const [lo, hi] = chord(cur, d, Y, Ymin);
				if (!(hi > lo)) continue;
				const t = lo + (hi - lo) * r();
				cur = cur.map((x, i) => Math.min(1, Math.max(0, x + t * d[i])));
				consider(cur);
			}
			// 3. Compass search from the best point (in unscaled form: the best is already at full scale).
			let centre = [...bestLevels];
			let step = 0.1;
			while (step > 0.004) {
				let improved = false;
				for (const b of N) {
					for (const sign of [1, -1]) {
						const cand = centre.map((x, i) => x + sign * step * b[i]);
						if (cand.some((x) => x < -1e-12 || x > 1 + 1e-12)) continue;
						if (cand.reduce((s, x, i) => s + x * Y[i], 0) < Ymin) continue;
						const before = bestScore;
						consider(cand);
						if (bestScore > before) {
							centre = [...bestLevels];
							improved = true;
						}
					}
				}
				if (!improved) step /= 2;
			}
		}
	}
	const levels = Float64Array.from(bestLevels, (x) => Math.min(1, Math.max(0, x)));
	const fix = describeFix(f, T, { ...best, levels }, options, ` Mixed for the best ${options.metric} at no less than ${Math.round(minOutput * 100)} % of the maximum output.`);
	const value = options.metric === 'Ra' ? fix.predicted.Ra : fix.predicted.SSI;
	return {
		...fix,
		quality: {
			metric: options.metric,
			value: value ?? bestScore,
			atMaximumOutput: atMax,
			outputShare: fix.output / brightY,
			minOutput,
			evaluations,
			method
		}
	};
}

function scaleUp(l: number[]): number[] {
	const m = Math.max(...l);
	return m > 0 ? l.map((x) => Math.max(0, x / m)) : l;
}
