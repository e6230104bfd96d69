import { describe, expect, it } from 'vitest';
import {
	DmxError,
	dmx16ToLevel,
	dmx8ToLevel,
	levelToDmx16,
	levelToDmx8,
	levelToPercent
} from '../../../src/lib/matching/dmx';

describe('levelToDmx8 (ANSI E1.11 slot range 0–255; rounding half up, ours)', () => {
	it('0 %, 50 %, 100 % map to 0, 128, 255 exactly (50 % → 127.5 → 128)', () => {
		expect(levelToDmx8(0)).toBe(0);
		expect(levelToDmx8(0.5)).toBe(128);
		expect(levelToDmx8(1)).toBe(255);
	});
	it('rounds to the nearest code below and above a half step', () => {
		expect(levelToDmx8(127.4 / 255)).toBe(127);
		expect(levelToDmx8(127.6 / 255)).toBe(128);
	});
	it('every code survives a round trip', () => {
		for (let v = 0; v <= 255; v++) expect(levelToDmx8(dmx8ToLevel(v))).toBe(v);
	});
	it('clamps solver noise just outside 0..1 but refuses real errors and NaN', () => {
		expect(levelToDmx8(-1e-12)).toBe(0);
		expect(levelToDmx8(1 + 1e-12)).toBe(255);
		expect(() => levelToDmx8(1.2)).toThrow(DmxError);
		expect(() => levelToDmx8(-0.1)).toThrow(/0 to 1/);
		expect(() => levelToDmx8(Number.NaN)).toThrow(/number/);
	});
});

describe('levelToDmx16 (coarse = high byte, fine = low byte: common practice)', () => {
	it('0 %, 50 %, 100 % → 0/0, 32768 = coarse 128 fine 0, 65535 = 255/255', () => {
		expect(levelToDmx16(0)).toEqual({ value: 0, coarse: 0, fine: 0 });
		expect(levelToDmx16(0.5)).toEqual({ value: 32768, coarse: 128, fine: 0 });
		expect(levelToDmx16(1)).toEqual({ value: 65535, coarse: 255, fine: 255 });
	});
	it('coarse·256 + fine reproduces the value, and reading back inverts it', () => {
		for (const level of [0.001, 0.123456, 0.333, 0.75, 0.999]) {
			const d = levelToDmx16(level);
			expect(d.coarse * 256 + d.fine).toBe(d.value);
			expect(Math.abs(dmx16ToLevel(d.coarse, d.fine) - level)).toBeLessThanOrEqual(0.5 / 65535 + 1e-15);
		}
	});
	it('refuses out-of-range slot values', () => {
		expect(() => dmx16ToLevel(256, 0)).toThrow(/coarse/);
		expect(() => dmx16ToLevel(0, -1)).toThrow(/fine/);
		expect(() => dmx16ToLevel(1.5, 0)).toThrow(DmxError);
		expect(() => dmx8ToLevel(300)).toThrow(/0 to 255/);
	});
});

describe('levelToPercent', () => {
	it('is level × 100', () => {
		expect(levelToPercent(0.5)).toBe(50);
		expect(levelToPercent(1)).toBe(100);
	});
});
