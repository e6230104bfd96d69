/**
 * Wording for the mired lab's results, from the mired explainer's numbers. Direction is stated as
 * warmer or cooler than the target (true for CTO and CTB stacks alike): more mired is warmer.
 */
import type { MiredStackCandidate } from '$lib/matching/mired';

export const m1 = (v: number): string => (Math.abs(v) < 0.05 ? 0 : v).toFixed(1).replace('-', '−');
export const signedMired = (v: number): string => (v > 0.05 ? '+' : v < -0.05 ? '−' : '') + (Math.abs(v) < 0.05 ? 0 : Math.abs(v)).toFixed(1);
export const kelvin = (K: number): string => (Number.isFinite(K) ? `${Math.round(K)} K` : '—');

/** Result mired − target mired, in words: "2.9 mired warmer than the target". */
export function residualWords(residualMired: number): string {
	if (Math.abs(residualMired) < 0.05) return 'on target';
	return `${Math.abs(residualMired).toFixed(1)} mired ${residualMired > 0 ? 'warmer' : 'cooler'} than the target`;
}

/** The same, short: "2.9 mired warmer", "on target". */
export function residualShort(residualMired: number): string {
	if (Math.abs(residualMired) < 0.05) return 'on target';
	return `${Math.abs(residualMired).toFixed(1)} mired ${residualMired > 0 ? 'warmer' : 'cooler'}`;
}

/** "With Full CTB: 312.5 − 131.0 = 181.5 mired → 10⁶ ÷ 181.5 = 5510 K (2.9 mired warmer than the target)." */
export function stackLine(c: MiredStackCandidate, sourceMired: number): string {
	const op = c.nominalShift < 0 ? '−' : '+';
	const landing = c.resultMired > 0 ? `10⁶ ÷ ${m1(c.resultMired)} = ${kelvin(c.resultK)}` : 'no colour temperature';
	return `With ${c.label}: ${m1(sourceMired)} ${op} ${m1(Math.abs(c.nominalShift))} = ${m1(c.resultMired)} mired → ${landing} (${residualWords(c.residualMired)}).`;
}
