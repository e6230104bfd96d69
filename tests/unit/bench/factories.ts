/**
 * Small factories for the bench's view data. Chromaticities come from published tables or plain
 * arithmetic, named beside each; labels and ids are invented for the tests.
 */
import type { BenchDistance, BenchLight, BenchReading, GelProposalView, LedChannelView, LedResultView } from '../../../src/lib/components/bench/bench';

/** Mired of a CCT: 10⁶ / K (the definition of the micro reciprocal degree; common practice). */
export const mired = (k: number) => 1e6 / k;

export function distance(o: Partial<BenchDistance> = {}): BenchDistance {
	return { duv_prime: 0.001, mired: 0, dDuv: 0, within: true, ...o };
}

export function reading(o: Partial<BenchReading> = {}): BenchReading {
	// CIE 15:2004 Table T.3: D65 x 0.31272, y 0.32903 (u′ 0.1978, v′ 0.4683).
	return { id: 1, label: 'As found', x: 0.31272, y: 0.32903, u_prime: 0.1978, v_prime: 0.4683, cct_k: 6504, duv: 0.0032, ra: null, takenAt: null, createdAt: '2026-12-01T21:00:00.000Z', swatch: '#ffffff', distance: distance(), ...o };
}

let nextId = 1;
export function light(o: Partial<BenchLight> = {}): BenchLight {
	const id = o.id ?? nextId++;
	return { id, label: `Light ${id}`, role: 'key', kind: 'tungsten', kindLabel: 'Tungsten', fixtureProfile: null, gelText: '', ledText: '', heatCaution: null, hot: true, led: false, lastReading: reading({ id: id * 10 }), latestFix: null, ...o };
}

export function gelProposal(o: Partial<GelProposalView> = {}): GelProposalView {
	return {
		rank: 1,
		gels: [{ id: 'ctb-full', label: 'Full CTB' }],
		label: 'Full CTB',
		predicted: { x: 0.3324, y: 0.3474, CCT: 5500, Duv: 0.001, Ra: 98 },
		residual: 0.0012,
		within: true,
		lossStops: 1.4,
		miredShift: { nominal: -131, actual: -128 },
		estimate: false,
		...o
	};
}

/** DMX512 16-bit as two slots: value = round(level × 65535), coarse = ⌊value / 256⌋, fine = value mod 256; 8-bit = round(level × 255) (common practice). */
export function channel(id: string, label: string, level: number): LedChannelView {
	const v = Math.round(level * 65535);
	return { id, label, level, percent: level * 100, dmx8: Math.round(level * 255), dmx16: { value: v, coarse: Math.floor(v / 256), fine: v % 256 } };
}

export function ledFix(o: Partial<LedResultView> = {}): LedResultView {
	return {
		fixture: { id: 'generic-rgbw', label: 'Generic RGBW unit (invented)', kind: 'rgbw', generic: true },
		inGamut: true,
		note: 'Met exactly with the brightest mix.',
		channels: [channel('R', 'Red', 0.75), channel('G', 'Green', 0.25), channel('B', 'Blue', 0), channel('W', 'White', 1)],
		predicted: { x: 0.3324, y: 0.3474, CCT: 5500, Duv: 0, Ra: 88, SSI: null },
		relativeOutput: 0.62,
		distance: distance({ duv_prime: 0.00002 }),
		bicolour: null,
		cautions: ['LED readings drift as units warm up: measure again after ten minutes.'],
		warnings: [],
		...o
	};
}
