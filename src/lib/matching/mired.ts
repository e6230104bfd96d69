/**
 * Mired arithmetic, step by step, for the lighting log and the mired lab: source kelvin → mired,
 * target kelvin → mired, the shift needed, the nearest CTO or CTB stacks by nominal mired, and the
 * colour temperature each stack lands on.
 *
 * References:
 *   Mired (micro reciprocal degree): M = 10⁶ / T, T in kelvin; filter shifts add along a stack,
 *   T_out = 10⁶ / (10⁶ / T_in + Σ ΔM) (common practice). The same reciprocal scale underlies
 *   A. R. Robertson, "Computation of correlated color temperature and distribution temperature",
 *   J. Opt. Soc. Am. 58(11), 1528–1535, 1968.
 *
 * The arithmetic holds for sources with a real colour temperature (tungsten, daylight, roughly
 * HMI), not for fluorescent and LED light, which the gel solver predicts from spectra instead
 * (common practice).
 */
import { kelvinToMired, miredToKelvin } from '../colour';
import { GEL_DEFINITIONS, type GelDefinition, type GelOverrides, validateGelOverrides } from './gels/definitions';

export interface MiredGel {
	id: string;
	label: string;
	family: string;
	miredShift: number;
	strength?: number;
}

export interface MiredStackCandidate {
	gels: MiredGel[];
	label: string;
	nominalShift: number;
	resultMired: number;
	resultK: number;
	/** Result mired − target mired: > 0 the stack falls short on the warm side, < 0 on the cool side. */
	residualMired: number;
}

export interface MiredStep {
	kind: 'source' | 'target' | 'shift' | 'stacks' | 'result' | 'comparison' | 'caveat';
	text: string;
	values: Record<string, number | string>;
}

export interface MiredExplanation {
	sourceK: number;
	targetK: number;
	sourceMired: number;
	targetMired: number;
	/** Target mired − source mired (negative: bluer, the CTB family; positive: warmer, CTO). */
	shiftNeeded: number;
	family: 'CTO' | 'CTB' | 'none';
	/** Nearest stacks by nominal mired, best first. */
	candidates: MiredStackCandidate[];
	/** Stacks the caller asked to compare, in the order given. */
	comparisons: MiredStackCandidate[];
	steps: MiredStep[];
}

export interface MiredExplainOptions {
	/** Largest stack considered (1–3, default 2). */
	maxGels?: number;
	/** How many nearest stacks to list (default 3). */
	count?: number;
	overrides?: GelOverrides;
	/** Filters to use (default: the built-in CTO and CTB library, with overrides applied). */
	gels?: MiredGel[];
	/** Stacks to work through explicitly, as lists of filter ids (e.g. [['ctb-threequarter','ctb-quarter'],['ctb-full']]). */
	compare?: string[][];
}

const f1 = (v: number) => (Math.abs(v) < 0.05 ? 0 : v).toFixed(1);
const signed = (v: number) => (v > 0 ? '+' : v < 0 ? '−' : '') + f1(Math.abs(v));
const kelvin = (k: number) => `${Math.round(k)} K`;

/** The built-in CTO and CTB filters with their nominal mired shifts (overrides applied). */
export function miredLibrary(overrides?: GelOverrides): MiredGel[] {
	validateGelOverrides(overrides);
	return GEL_DEFINITIONS.filter((g: GelDefinition) => g.family === 'CTO' || g.family === 'CTB').map((g) => ({
		id: g.id,
		label: g.label,
		family: g.family,
		strength: g.strength,
		miredShift: overrides?.[g.id]?.miredShift ?? (g.miredShift as number)
	}));
}

function checkKelvin(K: number, what: string): void {
	if (!Number.isFinite(K) || K <= 0) throw new RangeError(`${what} must be a colour temperature in kelvin above 0, got ${K}.`);
}

function candidate(gels: MiredGel[], sourceMired: number, targetMired: number): MiredStackCandidate {
	const nominalShift = gels.reduce((s, g) => s + g.miredShift, 0);
	const resultMired = sourceMired + nominalShift;
	return {
		gels,
		label: gels.length ? gels.map((g) => g.label).join(' + ') : 'no filter',
		nominalShift,
		resultMired,
		resultK: resultMired > 0 ? miredToKelvin(resultMired) : Number.POSITIVE_INFINITY,
		residualMired: resultMired - targetMired
	};
}

/** Stacks of one family (no CTO with CTB), repetition allowed, up to maxGels, as index multisets. */
function* stacksOf(gels: MiredGel[], maxGels: number): Generator<MiredGel[]> {
	const rec = function* (start: number, acc: MiredGel[]): Generator<MiredGel[]> {
		if (acc.length) yield acc;
		if (acc.length === maxGels) return;
		for (let i = start; i < gels.length; i++) {
			if (acc.length && gels[i].family !== acc[0].family) continue;
			yield* rec(i, [...acc, gels[i]]);
		}
	};
	yield* rec(0, []);
}

/** Mired arithmetic from sourceK to targetK, as structured steps (see module header). */
export function explainMiredArithmetic(sourceK: number, targetK: number, options: MiredExplainOptions = {}): MiredExplanation {
	checkKelvin(sourceK, 'Source');
	checkKelvin(targetK, 'Target');
	const maxGels = options.maxGels ?? 2;
	if (!Number.isInteger(maxGels) || maxGels < 1 || maxGels > 3) throw new RangeError('A stack holds 1 to 3 filters.');
	const count = options.count ?? 3;
	const gels = options.gels ?? miredLibrary(options.overrides);
	const sourceMired = kelvinToMired(sourceK);
	const targetMired = kelvinToMired(targetK);
	const shiftNeeded = targetMired - sourceMired;
	const family: MiredExplanation['family'] = Math.abs(shiftNeeded) < 0.5 ? 'none' : shiftNeeded < 0 ? 'CTB' : 'CTO';

	const all: MiredStackCandidate[] = [];
	for (const stack of stacksOf(gels, maxGels)) all.push(candidate(stack, sourceMired, targetMired));
	all.sort(
		(a, b) =>
			Math.abs(a.residualMired) - Math.abs(b.residualMired) ||
			a.gels.length - b.gels.length ||
			a.label.localeCompare(b.label)
	);
	const candidates = family === 'none' ? [candidate([], sourceMired, targetMired)] : all.slice(0, count);

	const byId = new Map(gels.map((g) => [g.id, g]));
	const comparisons = (options.compare ?? []).map((ids) =>
		candidate(
			ids.map((id) => {
				const g = byId.get(id);
				if (!g) throw new RangeError(`Unknown filter id "${id}".`);
				return g;
			}),
			sourceMired,
			targetMired
		)
	);

	const steps: MiredStep[] = [
		{
			kind: 'source',
			text: `Source ${kelvin(sourceK)}: 10⁶ ÷ ${Math.round(sourceK)} = ${f1(sourceMired)} mired.`,
			values: { kelvin: sourceK, mired: sourceMired }
		},
		{
			kind: 'target',
			text: `Target ${kelvin(targetK)}: 10⁶ ÷ ${Math.round(targetK)} = ${f1(targetMired)} mired.`,
			values: { kelvin: targetK, mired: targetMired }
		},
		{
			kind: 'shift',
			text:
				`Shift needed: ${f1(targetMired)} − ${f1(sourceMired)} = ${signed(shiftNeeded)} mired` +
				(family === 'CTB'
					? ' (negative: toward blue, the CTB family).'
					: family === 'CTO'
						? ' (positive: toward orange, the CTO family).'
						: ' (no colour-temperature filter needed).'),
			values: { mired: shiftNeeded, family }
		}
	];
	if (family !== 'none') {
		steps.push({
			kind: 'stacks',
			text:
				'Nearest stacks by nominal mired: ' +
				candidates.map((c) => `${c.label} (${signed(c.nominalShift)}, ${describeResidual(c.residualMired)})`).join('; ') +
				'.',
			values: Object.fromEntries(candidates.map((c, i) => [`stack${i + 1}`, c.label]))
		});
	}
	for (const c of [...candidates.slice(0, 1), ...comparisons]) {
		steps.push(resultStep(c, sourceMired, targetK, comparisons.includes(c) ? 'comparison' : 'result'));
	}
	steps.push({
		kind: 'caveat',
		text: 'Mired arithmetic suits sources with a real colour temperature (tungsten, daylight); fluorescent and LED sources are predicted from their spectra instead. Nominal shifts differ between swatch books by up to about 15 mired.',
		values: {}
	});
	return { sourceK, targetK, sourceMired, targetMired, shiftNeeded, family, candidates, comparisons, steps };
}

function describeResidual(r: number): string {
	if (Math.abs(r) < 0.05) return 'on target';
	return `${f1(Math.abs(r))} mired ${r > 0 ? 'short, still warmer' : 'past, cooler'}`;
}

function resultStep(c: MiredStackCandidate, sourceMired: number, targetK: number, kind: 'result' | 'comparison'): MiredStep {
	const arithmetic = `${f1(sourceMired)} ${c.nominalShift < 0 ? '−' : '+'} ${f1(Math.abs(c.nominalShift))} = ${f1(c.resultMired)} mired`;
	const landing = c.resultMired > 0 ? `10⁶ ÷ ${f1(c.resultMired)} = ${kelvin(c.resultK)}` : 'no colour temperature';
	return {
		kind,
		text: `With ${c.label}: ${arithmetic} → ${landing} (target ${kelvin(targetK)}; ${describeResidual(c.residualMired)}).`,
		values: { stack: c.label, shift: c.nominalShift, mired: c.resultMired, kelvin: c.resultK, residualMired: c.residualMired }
	};
}
