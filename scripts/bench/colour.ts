/**
 * Colour core throughput on one core: full reading analysis of generated spectra (XYZ, xy, u'v',
 * CCT, Duv, CIE 13.3 CRI R1–R15) at 5 nm and at 1 nm, the same with the SSI added, and CCT + Duv
 * from CIE 1960 uv alone (Ohno 2013, cascaded table). The spectra are invented models
 * (Planckian, phosphor-LED-like and line-on-phosphor mixtures), not measurements.
 */
import { analyzeSpectrum } from '../../src/lib/colour/analysis';
import { makeSpectrum, type Spectrum } from '../../src/lib/colour/spectrum';
import { CCTToUv, uvToCCTOhno2013 } from '../../src/lib/colour/temperature/ohno2013';

export const title = 'Colour core: spectra analysed and CCT/Duv solved per second (one core)';

function rng(seed: number): () => number {
	let s = seed >>> 0;
	return () => {
		s = (s * 1664525 + 1013904223) >>> 0;
		return s / 2 ** 32;
	};
}

const g = (c: number, fwhm: number, nm: number) => Math.exp(-0.5 * ((nm - c) / (fwhm / 2.3548)) ** 2);

function generate(count: number, step: number, seed: number): Spectrum[] {
	const r = rng(seed);
	const out: Spectrum[] = [];
	const n = Math.round(400 / step) + 1;
	for (let k = 0; k < count; k++) {
		const kind = k % 3;
		const T = 2000 + r() * 8000;
		const pump = 440 + r() * 20;
		const yellow = 540 + r() * 40;
		const red = 610 + r() * 40;
		const lines = [436 + r() * 2, 546 + r() * 2, 611 + r() * 2];
		const v = new Float64Array(n);
		for (let i = 0; i < n; i++) {
			const nm = 380 + i * step;
			if (kind === 0) v[i] = Math.pow(560 / nm, 5) * Math.expm1(1.4388e7 / (560 * T)) / Math.expm1(1.4388e7 / (nm * T));
			else if (kind === 1) v[i] = 0.5 * g(pump, 20, nm) + g(yellow, 130, nm) + 0.8 * g(red, 110, nm);
			else v[i] = 0.4 * g(yellow, 150, nm) + lines.reduce((s, c) => s + 3 * g(c, 2 * step, nm), 0);
		}
		out.push(makeSpectrum(380, step, v));
	}
	return out;
}

const cpuMs = () => {
	const u = process.cpuUsage();
	return (u.user + u.system) / 1000;
};

/**
 * Items per second of this process's CPU time (one core: the work is single-threaded), best of
 * five rounds. CPU time rather than wall time because the machine is shared: other processes
 * stretch wall time but not the CPU time this work needs.
 */
function perSecond(fn: () => void, items: number, roundMs = 400): number {
	fn(); // warm-up (tables, JIT)
	let best = 0;
	for (let round = 0; round < 5; round++) {
		let runs = 0;
		const t0 = cpuMs();
		let t = t0;
		while (t - t0 < roundMs) {
			fn();
			runs++;
			t = cpuMs();
		}
		best = Math.max(best, (runs * items * 1000) / (t - t0));
	}
	return best;
}

export async function run() {
	const s5 = generate(10_000, 5, 1);
	const s1 = generate(2_000, 1, 2);
	let sink = 0;
	const full5 = perSecond(() => {
		for (const s of s5) sink += analyzeSpectrum(s, { include: { ssi: false } }).cri!.ra;
	}, s5.length);
	const full1 = perSecond(() => {
		for (const s of s1) sink += analyzeSpectrum(s, { include: { ssi: false } }).cri!.ra;
	}, s1.length);
	const withSsi5 = perSecond(() => {
		for (const s of s5) sink += analyzeSpectrum(s).ssi!;
	}, s5.length);
	const r = rng(3);
	const uvs = Array.from({ length: 100_000 }, () => CCTToUv(1000 + r() * 19000, (r() - 0.5) * 0.06));
	const cct = perSecond(() => {
		for (const uv of uvs) sink += uvToCCTOhno2013(uv).CCT;
	}, uvs.length);
	if (!Number.isFinite(sink)) throw new Error('benchmark produced a non-finite result');
	return {
		full_analysis_5nm_per_s: { value: full5, unit: '1/s', label: 'full analysis (xy, u′v′, CCT, Duv, CRI R1–R15), 5 nm' },
		full_analysis_1nm_per_s: { value: full1, unit: '1/s', label: 'full analysis (xy, u′v′, CCT, Duv, CRI R1–R15), 1 nm' },
		full_analysis_with_ssi_5nm_per_s: { value: withSsi5, unit: '1/s', label: 'full analysis plus SSI, 5 nm' },
		cct_duv_from_uv_per_s: { value: cct, unit: '1/s', label: 'CCT + Duv from uv (Ohno 2013)' }
	};
}
