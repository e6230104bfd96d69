import { describe, expect, it } from 'vitest';
import {
	formatAmps,
	formatAngle,
	formatExposure,
	formatHz,
	formatPercent,
	formatSeconds,
	formatWatts,
	numberText,
	parseDecimal,
	trimmed
} from '../../../src/lib/settools/format';

describe('set tools formatting', () => {
	it('angles keep two decimals at most', () => {
		expect(formatAngle(172.8)).toBe('172.8°');
		expect(formatAngle(143.856)).toBe('143.86°');
		expect(formatAngle(144)).toBe('144°');
		expect(formatAngle(NaN)).toBe('–°');
		expect(trimmed(100, 2)).toBe('100');
		expect(trimmed(0.5, 0)).toBe('1');
	});

	it('exposures read like a camera menu', () => {
		expect(formatExposure(1 / 100)).toBe('1/100\u00a0s');
		expect(formatExposure(1 / 50)).toBe('1/50\u00a0s');
		expect(formatExposure(3 / 100)).toBe('1/33.3\u00a0s');
		expect(formatExposure(1 / 47.952)).toBe('1/48\u00a0s');
		expect(formatExposure(1.25)).toBe('1.25\u00a0s');
		expect(formatExposure(0)).toBe('–');
	});

	it('beats and periods', () => {
		expect(formatHz(0.12)).toBe('0.12\u00a0Hz');
		expect(formatHz(4)).toBe('4\u00a0Hz');
		expect(formatHz(100)).toBe('100\u00a0Hz');
		expect(formatSeconds(1 / 0.12)).toBe('8.3\u00a0s');
		expect(formatSeconds(0.25)).toBe('0.25\u00a0s');
		expect(formatSeconds(1234.5)).toBe('1,235\u00a0s');
		expect(formatSeconds(Infinity)).toBe('–');
	});

	it('watts, amps and shares', () => {
		expect(formatWatts(1920)).toBe('1,920\u00a0W');
		expect(formatWatts(NaN)).toBe('–\u00a0W');
		expect(formatAmps(16)).toBe('16\u00a0A');
		expect(formatAmps(1000 / 120)).toBe('8.3\u00a0A');
		expect(formatPercent(0.8)).toBe('80\u00a0%');
	});
});

describe('typed numbers', () => {
	it('reads decimals with a point or a comma, blank and junk as NaN', () => {
		expect(parseDecimal('23.976')).toBe(23.976);
		expect(parseDecimal(' 23,976 ')).toBe(23.976);
		expect(parseDecimal('24.')).toBe(24);
		expect(parseDecimal('.5')).toBe(0.5);
		expect(parseDecimal('-5')).toBe(-5);
		expect(parseDecimal('1e3')).toBe(1000);
		expect(parseDecimal('')).toBeNaN();
		expect(parseDecimal('abc')).toBeNaN();
		expect(parseDecimal('1/50')).toBeNaN();
		expect(parseDecimal('1,000.5')).toBeNaN();
		expect(parseDecimal(null)).toBeNaN();
	});

	it('shows numbers without float noise', () => {
		expect(numberText(0.1 + 0.2)).toBe('0.3');
		expect(numberText(23.976)).toBe('23.976');
		expect(numberText(NaN)).toBe('');
	});
});
