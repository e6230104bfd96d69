/**
 * The equal-steps lesson: a run of colour temperatures in equal kelvin steps beside a run in equal
 * mired steps, each point on the Planckian locus (the colour core's CCTToXy), with the size of each
 * step in mired and as a distance on the chart (Δu′v′, CIE 1976 UCS).
 */
import { CCTToXy, deltaUvPrime, kelvinToMired, miredToKelvin, xyToUvPrime } from '$lib/colour';

export interface StepPoint {
	K: number;
	mired: number;
	x: number;
	y: number;
	/** Size of the step to the next point, if any. */
	next: { mired: number; deltaUvPrime: number } | null;
}

function withSteps(temps: number[]): StepPoint[] {
	const pts = temps.map((K) => ({ K, mired: kelvinToMired(K), ...CCTToXy(K, 0) }));
	return pts.map((p, i) => {
		const q = pts[i + 1];
		return {
			...p,
			next: q ? { mired: Math.abs(q.mired - p.mired), deltaUvPrime: deltaUvPrime(xyToUvPrime(p), xyToUvPrime(q)) } : null
		};
	});
}

/** fromK, fromK + stepK, … toK. */
export function equalKelvinSteps(fromK = 2000, toK = 10000, stepK = 1000): StepPoint[] {
	if (!(fromK > 0) || !(toK > fromK) || !(stepK > 0)) throw new RangeError(`bad kelvin run ${fromK}–${toK} K every ${stepK} K`);
	const temps: number[] = [];
	for (let K = fromK; K <= toK + 1e-9; K += stepK) temps.push(K);
	return withSteps(temps);
}

/** fromMired, fromMired − stepMired, … toMired (warm to cool, as the kelvin run). */
export function equalMiredSteps(fromMired = 500, toMired = 100, stepMired = 50): StepPoint[] {
	if (!(toMired > 0) || !(fromMired > toMired) || !(stepMired > 0)) throw new RangeError(`bad mired run ${fromMired}–${toMired} every ${stepMired}`);
	const temps: number[] = [];
	for (let M = fromMired; M >= toMired - 1e-9; M -= stepMired) temps.push(miredToKelvin(M));
	return withSteps(temps);
}

/** Mired between two colour temperatures (absolute): the size of a change. */
export function miredBetween(aK: number, bK: number): number {
	return Math.abs(kelvinToMired(aK) - kelvinToMired(bK));
}
