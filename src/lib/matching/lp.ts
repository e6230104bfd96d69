/**
 * A small wrapper around `javascript-lp-solver` for the dense linear programmes the LED solver
 * builds: maximise (or minimise) c·x subject to equality rows A_eq·x = b_eq, inequality rows
 * A_le·x ≤ b_le, and 0 ≤ x_i ≤ u_i.
 *
 * References:
 *   G. B. Dantzig, "Linear Programming and Extensions", Princeton University Press, 1963 (the
 *   simplex method the library implements).
 *   javascript-lp-solver 1.0.3, JSON model format (README, "Constraint Types").
 *
 * The library reports values rounded to about nine decimals; callers that need more (the LED
 * solver, whose chromaticity must be exact) polish the returned vertex themselves.
 */
import solver from 'javascript-lp-solver';

export interface LinearProgramme {
	/** Objective coefficients c, one per variable. */
	objective: ArrayLike<number>;
	sense: 'max' | 'min';
	/** Rows of A_eq·x = b_eq. */
	equalities?: Array<{ coefficients: ArrayLike<number>; rhs: number }>;
	/** Rows of A_le·x ≤ b_le. */
	lessOrEqual?: Array<{ coefficients: ArrayLike<number>; rhs: number }>;
	/** Rows of A_ge·x ≥ b_ge. */
	greaterOrEqual?: Array<{ coefficients: ArrayLike<number>; rhs: number }>;
	/** Upper bound per variable (lower bounds are always 0). Infinity = none. */
	upperBounds?: ArrayLike<number>;
}

export interface LinearProgrammeResult {
	feasible: boolean;
	bounded: boolean;
	/** Variable values (zeros when infeasible). */
	x: Float64Array;
	/** Objective value c·x recomputed from x. */
	value: number;
}

export class LinearProgrammeError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'LinearProgrammeError';
	}
}

interface Bound {
	min?: number;
	max?: number;
	equal?: number;
}

/** Solve a dense LP (see module header). Variables are x0…x(n−1); all are ≥ 0. */
export function solveLinearProgramme(lp: LinearProgramme): LinearProgrammeResult {
	const n = lp.objective.length;
	if (n === 0) throw new LinearProgrammeError('A linear programme needs at least one variable.');
	const constraints: Record<string, Bound> = {};
	const variables: Record<string, Record<string, number>> = {};
	for (let j = 0; j < n; j++) {
		const c = lp.objective[j];
		if (!Number.isFinite(c)) throw new LinearProgrammeError(`Objective coefficient ${j} is not a finite number.`);
		variables[`x${j}`] = { __objective: c };
	}
	const addRows = (rows: LinearProgramme['equalities'], prefix: string, bound: (rhs: number) => Bound) => {
		(rows ?? []).forEach((row, r) => {
			if (row.coefficients.length !== n) {
				throw new LinearProgrammeError(`Constraint ${prefix}${r} has ${row.coefficients.length} coefficients for ${n} variables.`);
			}
			if (!Number.isFinite(row.rhs)) throw new LinearProgrammeError(`Constraint ${prefix}${r} has a non-finite right-hand side.`);
			const name = `${prefix}${r}`;
			constraints[name] = bound(row.rhs);
			for (let j = 0; j < n; j++) {
				const a = row.coefficients[j];
				if (!Number.isFinite(a)) throw new LinearProgrammeError(`Constraint ${name} has a non-finite coefficient.`);
				if (a !== 0) variables[`x${j}`][name] = a;
			}
		});
	};
	addRows(lp.equalities, 'eq', (rhs) => ({ equal: rhs }));
	addRows(lp.lessOrEqual, 'le', (rhs) => ({ max: rhs }));
	addRows(lp.greaterOrEqual, 'ge', (rhs) => ({ min: rhs }));
	if (lp.upperBounds) {
		for (let j = 0; j < n; j++) {
			const u = lp.upperBounds[j];
			if (Number.isNaN(u) || u < 0) throw new LinearProgrammeError(`Upper bound ${j} must be ≥ 0.`);
			if (u === Infinity) continue;
			constraints[`ub${j}`] = { max: u };
			variables[`x${j}`][`ub${j}`] = 1;
		}
	}
	const raw = solver.Solve({ optimize: '__objective', opType: lp.sense, constraints, variables }) as {
		feasible: boolean;
		bounded?: boolean;
		[k: string]: unknown;
	};
	const x = new Float64Array(n);
	if (raw.feasible) {
		for (let j = 0; j < n; j++) {
			const v = raw[`x${j}`];
			x[j] = typeof v === 'number' && Number.isFinite(v) ? Math.max(0, v) : 0;
		}
	}
	let value = 0;
	for (let j = 0; j < n; j++) value += lp.objective[j] * x[j];
	return { feasible: Boolean(raw.feasible), bounded: raw.bounded !== false, x, value };
}
