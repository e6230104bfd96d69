/**
 * The Planckian locus in the CIE 1960 UCS diagram, computed from the CIE 1931 2° colour-matching
 * functions at 1 nm over 360–830 nm (see observers.ts for how the 1 nm functions are obtained) and
 * Planck's law with c2 = 1.4388e-2 m·K, as Ohno (2014) prescribes for CCT and Duv.
 *
 * A table of u, v and their derivatives against ln T is built once (lazily) from 500 K to 10⁶ K at
 * 1 % steps in T; between nodes the locus is evaluated by cubic Hermite interpolation, whose error
 * (< 1e-10 in uv, checked in the tests against direct summation) is far below any published digit.
 * Both CCT methods (Ohno 2013, Robertson 1968) and the inverse use this one locus.
 *
 * References:
 *   Planck's law: CIE 15:2004 Colorimetry, 3rd ed., §3.1 (c2 = 1.4388e-2 m·K for the Planckian
 *     radiator, ITS-90).
 *   Ohno, Y. (2014) Practical use and calculation of CCT and Duv. LEUKOS 10(1), 47–55.
 *     doi:10.1080/15502724.2013.839020
 */
import { cmfs1nm } from '../observers';

/** Second radiation constant, nm·K (c2 = 1.4388e-2 m·K). */
export const C2_NM_K = 1.4388e7;

export const LOCUS_T_MIN = 500;
export const LOCUS_T_MAX = 1e6;
/** Table step in ln T (1 % in T, as in Ohno's table). */
export const LOCUS_STEP_LN_T = 0.01;

interface Weights {
	nm: Float64Array;
	x: Float64Array;
	y: Float64Array;
	z: Float64Array;
}
let weights: Weights | null = null;

function locusWeights(): Weights {
	if (!weights) {
		const c = cmfs1nm('CIE1931_2');
		const n = c.x.length;
		const nm = new Float64Array(n);
		const x = new Float64Array(n);
		const y = new Float64Array(n);
		const z = new Float64Array(n);
		for (let i = 0; i < n; i++) {
			const l = c.start + i;
			nm[i] = l;
			// λ⁻⁵ with λ in µm keeps the numbers near 1.
			const k = 1 / Math.pow(l / 1000, 5);
			x[i] = c.x[i] * k;
			y[i] = c.y[i] * k;
			z[i] = c.z[i] * k;
		}
		weights = { nm, x, y, z };
	}
	return weights;
}

export interface LocusPoint {
	u: number;
	v: number;
	/** du/d(ln T) */
	du: number;
	/** dv/d(ln T) */
	dv: number;
}

/**
 * CIE 1960 uv of a Planckian radiator at T kelvin and its derivative against ln T, by direct
 * summation at 1 nm over 360–830 nm (Planck's law; Ohno 2014 §2). T > 0.
 */
export function planckianUvExact(T: number): LocusPoint {
	if (!(T > 0) || !Number.isFinite(T)) throw new RangeError(`temperature must be a positive number of kelvin, got ${T}`);
	const w = locusWeights();
	let X = 0;
	let Y = 0;
	let Z = 0;
	let dX = 0;
	let dY = 0;
	let dZ = 0;
	for (let i = 0; i < w.nm.length; i++) {
		const a = C2_NM_K / (w.nm[i] * T);
		const em1 = Math.expm1(a);
		if (!Number.isFinite(em1)) continue; // e^a overflows: the radiator emits nothing there
		const m = 1 / em1;
		// dM/d(ln T) = M · a · eᵃ/(eᵃ − 1)
		const dm = m * a * (1 + m);
		X += m * w.x[i];
		Y += m * w.y[i];
		Z += m * w.z[i];
		dX += dm * w.x[i];
		dY += dm * w.y[i];
		dZ += dm * w.z[i];
	}
	const D = X + 15 * Y + 3 * Z;
	const dD = dX + 15 * dY + 3 * dZ;
	return {
		u: (4 * X) / D,
		v: (6 * Y) / D,
		du: (4 * (dX * D - X * dD)) / (D * D),
		dv: (6 * (dY * D - Y * dD)) / (D * D)
	};
}

export interface LocusTable {
	lnT0: number;
	h: number;
	n: number;
	T: Float64Array;
	u: Float64Array;
	v: Float64Array;
	du: Float64Array;
	dv: Float64Array;
}

let table: LocusTable | null = null;

/** The tabulated locus (built on first use, about 760 nodes). */
export function locusTable(): LocusTable {
	if (!table) {
		const lnT0 = Math.log(LOCUS_T_MIN);
		const h = LOCUS_STEP_LN_T;
		const n = Math.ceil((Math.log(LOCUS_T_MAX) - lnT0) / h - 1e-9) + 1;
		const t: LocusTable = {
			lnT0,
			h,
			n,
			T: new Float64Array(n),
			u: new Float64Array(n),
			v: new Float64Array(n),
			du: new Float64Array(n),
			dv: new Float64Array(n)
		};
		for (let i = 0; i < n; i++) {
			const T = Math.exp(lnT0 + i * h);
			const p = planckianUvExact(T);
			t.T[i] = T;
			t.u[i] = p.u;
			t.v[i] = p.v;
			t.du[i] = p.du;
			t.dv[i] = p.dv;
		}
		table = t;
	}
	return table;
}

/**
 * Planckian uv at ln T by cubic Hermite interpolation of the table (values and ln-T derivatives).
 * Outside the table range it extrapolates along the end node's tangent; callers warn about that.
 * Writes into `out` to avoid allocation on hot paths.
 */
export function planckianUvAtLnT(lnT: number, out: LocusPoint = { u: 0, v: 0, du: 0, dv: 0 }): LocusPoint {
	const t = table ?? locusTable();
	const f = (lnT - t.lnT0) / t.h;
	let i = Math.floor(f);
	if (i < 0) i = 0;
	else if (i > t.n - 2) i = t.n - 2;
	const s = f - i;
	if (s < 0 || s > 1) {
		const k = s < 0 ? i : i + 1;
		const d = lnT - (t.lnT0 + k * t.h);
		out.u = t.u[k] + t.du[k] * d;
		out.v = t.v[k] + t.dv[k] * d;
		out.du = t.du[k];
		out.dv = t.dv[k];
		return out;
	}
	const h = t.h;
	const s2 = s * s;
	const s3 = s2 * s;
	const h00 = 2 * s3 - 3 * s2 + 1;
	const h10 = s3 - 2 * s2 + s;
	const h01 = -2 * s3 + 3 * s2;
	const h11 = s3 - s2;
	// derivatives of the basis with respect to s
	const g00 = 6 * s2 - 6 * s;
	const g10 = 3 * s2 - 4 * s + 1;
	const g01 = -6 * s2 + 6 * s;
	const g11 = 3 * s2 - 2 * s;
	const u0 = t.u[i];
	const u1 = t.u[i + 1];
	const v0 = t.v[i];
	const v1 = t.v[i + 1];
	const du0 = t.du[i] * h;
	const du1 = t.du[i + 1] * h;
	const dv0 = t.dv[i] * h;
	const dv1 = t.dv[i + 1] * h;
	out.u = h00 * u0 + h10 * du0 + h01 * u1 + h11 * du1;
	out.v = h00 * v0 + h10 * dv0 + h01 * v1 + h11 * dv1;
	out.du = (g00 * u0 + g10 * du0 + g01 * u1 + g11 * du1) / h;
	out.dv = (g00 * v0 + g10 * dv0 + g01 * v1 + g11 * dv1) / h;
	return out;
}

/** Planckian uv at T kelvin from the table (see planckianUvAtLnT). */
export function planckianUv(T: number): { u: number; v: number } {
	if (!(T > 0) || !Number.isFinite(T)) throw new RangeError(`temperature must be a positive number of kelvin, got ${T}`);
	const p = planckianUvAtLnT(Math.log(T));
	return { u: p.u, v: p.v };
}
