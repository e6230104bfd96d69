import { describe, expect, it } from 'vitest';
import { chartHome, chartReadings, directionWords, distanceVerdict, fixArrows, fmtLevel, fmtPercent, fmtStops, gelAcceptBody, ledAcceptBody, sortByDistance, updatedAgo } from '../../../src/lib/components/bench/bench';
import { XY_FULL_DOMAIN, XY_PLOT } from '../../../src/lib/charts/cie1931';
import { channel, distance, gelProposal, ledFix, light, mired, reading } from './factories';

describe('sortByDistance', () => {
	it('puts the nearest light first and lights without a distance last, keeping their order', () => {
		const far = light({ label: 'far', lastReading: reading({ distance: distance({ duv_prime: 0.02, within: false }) }) });
		const none = light({ label: 'no reading', lastReading: null });
		const near = light({ label: 'near', lastReading: reading({ distance: distance({ duv_prime: 0.0005 }) }) });
		const noTarget = light({ label: 'no target', lastReading: reading({ distance: null }) });
		const mid = light({ label: 'mid', lastReading: reading({ distance: distance({ duv_prime: 0.004, within: false }) }) });
		expect(sortByDistance([far, none, near, noTarget, mid]).map((l) => l.label)).toEqual(['near', 'mid', 'far', 'no reading', 'no target']);
	});
	it('keeps ties and an empty list stable', () => {
		const a = light({ label: 'a' });
		const b = light({ label: 'b' });
		expect(sortByDistance([a, b]).map((l) => l.label)).toEqual(['a', 'b']);
		expect(sortByDistance([])).toEqual([]);
	});
});

describe('distance words', () => {
	it('states within or outside the tolerance in words, with the multiple', () => {
		expect(distanceVerdict(distance({ within: true }), 0.002)).toMatch(/on target/);
		expect(distanceVerdict(distance({ duv_prime: 0.0052, within: false }), 0.002)).toBe('off target (2.6 × the tolerance)');
		expect(distanceVerdict(distance({ duv_prime: 0.0052, within: false }), 0)).toBe('off target');
		expect(distanceVerdict(null, 0.002)).toBe('no distance yet');
	});
	it('3200 K to 5600 K: −134 mired, "cooler (toward CTB)"; a positive Duv need is plus green (arithmetic; trade terms, common practice)', () => {
		const dM = mired(5600) - mired(3200);
		expect(dM).toBeCloseTo(-133.9, 1);
		expect(directionWords(distance({ within: false, mired: dM, dDuv: 0.003 }))).toEqual(['cooler (toward CTB)', 'plus green']);
		expect(directionWords(distance({ within: false, mired: 60, dDuv: -0.004 }))).toEqual(['warmer (toward CTO)', 'minus green']);
		expect(directionWords(distance({ within: true, mired: 60 }))).toEqual([]);
		expect(directionWords(distance({ within: false, mired: null, dDuv: null }))).toEqual([]);
	});
});

describe('chart data', () => {
	it('plots each light’s latest reading and draws arrows from now to each shown fix', () => {
		const l = light({ id: 7, label: 'Key', role: 'key', lastReading: reading({ x: 0.4476, y: 0.4074 }) }); // CIE 15:2004 Table T.3: illuminant A
		expect(chartReadings([l, light({ lastReading: null })])).toEqual([{ id: '7', label: 'Key', x: 0.4476, y: 0.4074, role: 'key' }]);
		const arrows = fixArrows(l, [{ label: 'Full CTB', predicted: { x: 0.33, y: 0.34 } }]);
		expect(arrows).toEqual([{ from: { x: 0.4476, y: 0.4074 }, to: { x: 0.33, y: 0.34 }, label: 'Full CTB' }]);
		expect(fixArrows(light({ lastReading: null }), [{ label: 'x', predicted: { x: 0.3, y: 0.3 } }])).toEqual([]);
		expect(fixArrows(null, [])).toEqual([]);
	});
	it('opens the chart around the points with equal units on both axes, never wider than the whole chart', () => {
		const d = chartHome([{ x: 0.4476, y: 0.4074 }, { x: 0.31272, y: 0.32903 }], XY_PLOT, XY_FULL_DOMAIN);
		expect(d.x0).toBeLessThan(0.31272);
		expect(d.x1).toBeGreaterThan(0.4476);
		expect(d.y0).toBeLessThan(0.32903);
		expect(d.y1).toBeGreaterThan(0.4074);
		expect(chartHome([], XY_PLOT, XY_FULL_DOMAIN)).toEqual(XY_FULL_DOMAIN);
		const wide = chartHome([{ x: 0.01, y: 0.01 }, { x: 0.75, y: 0.85 }], XY_PLOT, XY_FULL_DOMAIN);
		expect(wide.x1 - wide.x0).toBeLessThanOrEqual(0.8 + 1e-12);
	});
});

describe('numbers on the cards', () => {
	it('formats stops, shares, levels and ages', () => {
		expect(fmtStops(1.36)).toBe('1.4\u00a0stops');
		expect(fmtStops(1)).toBe('1.0\u00a0stop');
		expect(fmtStops(NaN)).toBe('—');
		expect(fmtPercent(0.624)).toBe('62\u00a0%');
		expect(fmtPercent(null)).toBe('—');
		expect(fmtLevel(63.46)).toBe('63.5\u00a0%');
		expect(updatedAgo(0, 3000)).toBe('updated just now');
		expect(updatedAgo(0, 42_000)).toBe('updated 42 s ago');
		expect(updatedAgo(0, 185_000)).toBe('updated 3 min ago');
		expect(updatedAgo(5000, 0)).toBe('updated just now');
	});
});

describe('accept bodies', () => {
	it('a gel fix sends its stack of filter ids and the prediction', () => {
		const body = gelAcceptBody(gelProposal({ gels: [{ id: 'ctb-full', label: 'Full CTB' }, { id: 'plusgreen-quarter', label: '¼ plus green' }] }));
		expect(body.kind).toBe('gel');
		expect(body.fix).toEqual({ stack: ['ctb-full', 'plusgreen-quarter'] });
		expect(body.predicted.residual).toBe(0.0012);
	});
	it('an LED fix sends percent per channel (0–100), and a bi-colour its CCT and green/magenta', () => {
		const body = ledAcceptBody(ledFix({ channels: [channel('WW', 'Warm white', 0.3333), channel('CW', 'Cool white', 1)], bicolour: { cctSettingK: 4312.4, mixDuv: 0.001, greenMagentaDuv: -0.002, note: '' } }));
		expect(body.fix).toEqual({ levels: { WW: 33.3, CW: 100 }, cct_k: 4312, gm: -0.002 });
		expect(ledAcceptBody(ledFix()).fix).toEqual({ levels: { R: 75, G: 25, B: 0, W: 100 } });
	});
});
