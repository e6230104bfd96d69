/**
 * Matching solvers on one core: an LED fix for the generic seven-colour fixture (LP for the
 * brightest exact mix, polished; levels, DMX, xy/CCT/Duv), with and without Ra/SSI of the mix; and
 * a gel search over the whole filter library with stacks of up to three, predicted spectrally from
 * a 1 nm source spectrum, with and without Ra for the five proposals. Median of repeated runs after
 * a one-second warm-up; sources and targets vary between runs. Spectra are invented models, not measurements.
 */
import { planckianSpectrum, type Spectrum } from '../../src/lib/colour';
import { proposeGelsForSourceToTarget } from '../../src/lib/matching/gels/propose';
import { gelLibrary } from '../../src/lib/matching/gels/library';
import { genericFixture, resolveFixture } from '../../src/lib/matching/led/profiles';
import { solveLedFix } from '../../src/lib/matching/led/solve';
import { resolveTargetWhite } from '../../src/lib/matching/target';

export const title = 'Matching: LED fix (7 channels) and gel search (library, stacks ≤ 3, spectral), one core';

/** Median and fastest run (the fastest is less disturbed by other work on a shared machine). */
function timed(fn: (k: number) => void, runs: number): { median: number; min: number } {
	// Warm-up for a second (tables, JIT tiers, per-grid caches), so the median is steady-state.
	const w0 = performance.now();
	for (let k = 0; performance.now() - w0 < 1000 || k < 10; k++) fn(k);
	const t: number[] = [];
	for (let k = 0; k < runs; k++) {
		const t0 = performance.now();
		fn(k);
		t.push(performance.now() - t0);
	}
	t.sort((a, b) => a - b);
	return { median: t[Math.floor(t.length / 2)], min: t[0] };
}

/** A fluorescent-like source: lines on a broad phosphor base, 360–830 nm at 1 nm (invented). */
function tubeLike(T: number): Spectrum {
	const base = planckianSpectrum(T, 360, 830, 1);
	const v = new Float64Array(base.values.length);
	const peak = Math.max(...base.values);
	for (let i = 0; i < v.length; i++) {
		const nm = 360 + i;
		const line = (c: number, h: number) => h * Math.exp(-0.5 * ((nm - c) / 1.5) ** 2);
		v[i] = (0.6 * base.values[i]) / peak + line(436, 0.8) + line(546, 1.2) + line(611, 0.9);
	}
	return { ...base, values: v };
}

export async function run() {
	const seven = resolveFixture(genericFixture('generic-seven'));
	const ledTargets = [2800, 3200, 4000, 4300, 5000, 5600, 6500].map((CCT, k) => resolveTargetWhite({ kind: 'cct', CCT, Duv: (k % 3 - 1) * 0.002 }));
	const led = timed((k) => solveLedFix(seven, ledTargets[k % ledTargets.length], { quality: false }), 200);
	const ledQ = timed((k) => solveLedFix(seven, ledTargets[k % ledTargets.length]), 40);

	gelLibrary(); // built once per process
	const sources = [planckianSpectrum(3200), tubeLike(4000), planckianSpectrum(2700), tubeLike(3500)];
	const gelTargets = [5600, 3200, 4300, 3000].map((CCT) => resolveTargetWhite({ kind: 'cct', CCT }));
	const opts = { maxGels: 3, includeNeutralDensity: true };
	const search = timed((k) => proposeGelsForSourceToTarget({ spectrum: sources[k % 4] }, gelTargets[k % 4], { ...opts, computeRa: false }), 40);
	const searchRa = timed((k) => proposeGelsForSourceToTarget({ spectrum: sources[k % 4] }, gelTargets[k % 4], opts), 20);
	const considered = proposeGelsForSourceToTarget({ spectrum: sources[0] }, gelTargets[0], { ...opts, computeRa: false }).considered;

	return {
		led_solve_7ch_ms: { value: led.median, unit: 'ms', label: 'LED fix, 7 channels (levels, DMX, xy/CCT/Duv), median' },
		led_solve_7ch_min_ms: { value: led.min, unit: 'ms', label: 'LED fix, 7 channels, fastest run' },
		led_solve_7ch_quality_ms: { value: ledQ.median, unit: 'ms', label: 'LED fix, 7 channels, with Ra and SSI of the mix, median' },
		gel_search_3stack_ms: { value: search.median, unit: 'ms', label: `Gel search, ${considered} stacks ≤ 3, 1 nm spectral, median` },
		gel_search_3stack_min_ms: { value: search.min, unit: 'ms', label: 'Gel search as above, fastest run' },
		gel_search_3stack_ra_ms: { value: searchRa.median, unit: 'ms', label: 'Gel search as above, with Ra for the 5 proposals, median' }
	};
}
