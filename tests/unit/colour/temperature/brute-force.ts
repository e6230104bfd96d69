/**
 * Independent CCT/Duv for tests: minimise the uv distance to the Planckian locus by direct
 * summation (no table, no interpolation), by a coarse scan in ln T then golden-section search.
 */
import { planckianUvExact } from '../../../../src/lib/colour/temperature/planckian-locus';

export function bruteForceCCT(u: number, v: number): { CCT: number; Duv: number } {
	const dist = (lnT: number) => {
		const p = planckianUvExact(Math.exp(lnT));
		return Math.hypot(u - p.u, v - p.v);
	};
	let best = Math.log(1000);
	let bestD = Infinity;
	for (let l = Math.log(800); l <= Math.log(30000); l += 0.02) {
		const d = dist(l);
		if (d < bestD) {
			bestD = d;
			best = l;
		}
	}
	let a = best - 0.02;
	let b = best + 0.02;
	const g = (Math.sqrt(5) - 1) / 2;
	let c = b - g * (b - a);
	let d = a + g * (b - a);
	let fc = dist(c);
	let fd = dist(d);
	while (b - a > 1e-10) {
		if (fc < fd) {
			b = d;
			d = c;
			fd = fc;
			c = b - g * (b - a);
			fc = dist(c);
		} else {
			a = c;
			c = d;
			fc = fd;
			d = a + g * (b - a);
			fd = dist(d);
		}
	}
	const lnT = (a + b) / 2;
	const p = planckianUvExact(Math.exp(lnT));
	return { CCT: Math.exp(lnT), Duv: Math.hypot(u - p.u, v - p.v) * Math.sign(v - p.v) };
}
