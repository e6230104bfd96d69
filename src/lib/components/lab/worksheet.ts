/**
 * The mired lab's printable worksheet: exercises drawn from a seeded generator (the same set number
 * always gives the same numbers, so a class can share one sheet and its key), answered by the same
 * library the product uses (the colour core's mired conversions and the gel solver's mired explainer).
 *
 * Rounding on the sheet: mired to one decimal, kelvin to the nearest kelvin.
 */
import { kelvinToMired, miredToKelvin } from '$lib/colour';
import { explainMiredArithmetic, miredLibrary, type MiredGel } from '$lib/matching/mired';
import { stackLine } from './words';

export type ExerciseKind = 'to-mired' | 'to-kelvin' | 'shift' | 'gel' | 'stack';

export interface Exercise {
	n: number;
	kind: ExerciseKind;
	question: string;
	/** The answer as printed in the key. */
	answer: string;
	/** The working, one line per step. */
	working: string[];
}

export interface Worksheet {
	seed: number;
	exercises: Exercise[];
}

/** Seeds run 1 … 99999 so a set number is short enough to read out in class. */
export const SEED_MAX = 99999;

/** mulberry32: a small, fast 32-bit PRNG; the same seed gives the same sequence on every platform. */
export function seededRandom(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** A set number from a query value: an integer 1 … SEED_MAX, else the fallback. */
export function parseSeed(value: string | null | undefined, fallback = 1): number {
	if (!value || !/^\d{1,5}$/.test(value)) return fallback;
	const n = Number(value);
	return n >= 1 && n <= SEED_MAX ? n : fallback;
}

/** A new set number, different from `current`. */
export function nextSeed(current: number, random: () => number = Math.random): number {
	let n = current;
	while (n === current) n = 1 + Math.floor(random() * SEED_MAX);
	return n;
}

const m1 = (v: number) => (Math.abs(v) < 0.05 ? 0 : v).toFixed(1);
const signed = (v: number) => (v > 0.05 ? '+' : v < -0.05 ? '−' : '') + m1(Math.abs(v));
const k0 = (K: number) => `${Math.round(K)} K`;

/** Colour temperatures that occur on set (common practice: tungsten, practicals, daylight, tubes). */
const SET_KELVIN = [2700, 2800, 2900, 3000, 3200, 3400, 3800, 4300, 5000, 5500, 5600, 6000, 6500, 7500];

function pick<T>(list: readonly T[], rnd: () => number): T {
	return list[Math.floor(rnd() * list.length)];
}

function pair(rnd: () => number, warmToCool: boolean): [number, number] {
	for (;;) {
		const a = pick(SET_KELVIN, rnd);
		const b = pick(SET_KELVIN, rnd);
		if (Math.abs(kelvinToMired(a) - kelvinToMired(b)) < 20) continue;
		if (warmToCool ? a < b : a > b) return [a, b];
	}
}

function toMired(n: number, rnd: () => number): Exercise {
	const K = 2000 + 100 * Math.floor(rnd() * 81); // 2000–10000 K in 100 K steps
	const M = kelvinToMired(K);
	return { n, kind: 'to-mired', question: `Convert ${K} K to mired.`, answer: `${m1(M)} mired`, working: [`10⁶ ÷ ${K} = ${m1(M)} mired`] };
}

function toKelvin(n: number, rnd: () => number): Exercise {
	const M = 100 + 5 * Math.floor(rnd() * 81); // 100–500 mired in 5 mired steps
	const K = miredToKelvin(M);
	return { n, kind: 'to-kelvin', question: `Convert ${M} mired to kelvin.`, answer: k0(K), working: [`10⁶ ÷ ${M} = ${k0(K)}`] };
}

function shift(n: number, rnd: () => number, warmToCool: boolean): Exercise {
	const [from, to] = pair(rnd, warmToCool);
	const e = explainMiredArithmetic(from, to);
	const family = e.family === 'CTB' ? 'toward blue (CTB)' : e.family === 'CTO' ? 'toward orange (CTO)' : 'none needed';
	return {
		n,
		kind: 'shift',
		question: `A ${from} K source must match ${to} K. What mired shift is needed, and which way?`,
		answer: `${signed(e.shiftNeeded)} mired, ${family}`,
		working: e.steps.filter((s) => s.kind === 'source' || s.kind === 'target' || s.kind === 'shift').map((s) => s.text)
	};
}

function gel(n: number, rnd: () => number, gels: readonly MiredGel[]): Exercise {
	const from = pick([2800, 3000, 3200, 3400, 5600, 6000, 6500], rnd);
	// CTB on warm sources, CTO on cool ones, so the answer is a sensible colour temperature.
	const family = from < 4500 ? 'CTB' : 'CTO';
	const g = pick(
		gels.filter((x) => x.family === family),
		rnd
	);
	// The sheet prints the library's nominal shift to 0.1 mired; the key uses the printed figure.
	const printed = Math.round(g.miredShift * 10) / 10;
	const M = kelvinToMired(from);
	const out = M + printed;
	const K = miredToKelvin(out);
	return {
		n,
		kind: 'gel',
		question: `A ${from} K source gets ${g.label} (nominal ${signed(printed)} mired). What colour temperature comes out?`,
		answer: k0(K),
		working: [`10⁶ ÷ ${from} = ${m1(M)} mired`, `${m1(M)} ${printed < 0 ? '−' : '+'} ${m1(Math.abs(printed))} = ${m1(out)} mired`, `10⁶ ÷ ${m1(out)} = ${k0(K)}`]
	};
}

function stack(n: number, rnd: () => number, warmToCool: boolean): Exercise {
	const [from, to] = pair(rnd, warmToCool);
	const e = explainMiredArithmetic(from, to, { maxGels: 2, count: 1 });
	const best = e.candidates[0];
	return {
		n,
		kind: 'stack',
		question: `Which stack of at most two CTO or CTB filters takes ${from} K closest to ${to} K, and where does it land?`,
		answer: `${best.label} (${signed(best.nominalShift)} mired) → ${k0(best.resultK)}`,
		working: [...e.steps.filter((s) => s.kind === 'source' || s.kind === 'target' || s.kind === 'shift').map((s) => s.text), stackLine(best, e.sourceMired)]
	};
}

/** Eight exercises for set `seed`: a conversion each way, two shifts, two gels, two stacks. */
export function makeWorksheet(seed: number): Worksheet {
	if (!Number.isInteger(seed) || seed < 1 || seed > SEED_MAX) throw new RangeError(`A set number is a whole number from 1 to ${SEED_MAX}, got ${seed}.`);
	const rnd = seededRandom(seed);
	const gels = miredLibrary();
	const makers: Array<(n: number) => Exercise> = [
		(n) => toMired(n, rnd),
		(n) => toKelvin(n, rnd),
		(n) => shift(n, rnd, true),
		(n) => shift(n, rnd, false),
		(n) => gel(n, rnd, gels),
		(n) => gel(n, rnd, gels),
		(n) => stack(n, rnd, true),
		(n) => stack(n, rnd, false)
	];
	return { seed, exercises: makers.map((make, i) => make(i + 1)) };
}
