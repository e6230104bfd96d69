import { describe, expect, it } from 'vitest';
import { makeStamp, parseHex, stamp } from '$lib/charts/stamp';

const sum = (a: Float32Array) => a.reduce((s, v) => s + v, 0);
const buffer = (w: number, h: number) => new Uint8ClampedArray(w * h * 4);

describe('makeStamp', () => {
	it('covers about the requested area, inside the outline', () => {
		// Disk of area 64 at 2 px per unit: radius 2·√(64/π) ≈ 9.03 px; an outline 1 px wide takes
		// half a pixel off the inside: π·8.53² ≈ 228.6 px².
		const st = makeStamp('circle', 64, 2, 1);
		expect(sum(st.fill)).toBeGreaterThan(228.6 * 0.95);
		expect(sum(st.fill)).toBeLessThan(228.6 * 1.05);
		// The ring: circumference × width ≈ 2π·9.03 ≈ 56.7 px².
		expect(sum(st.edge)).toBeGreaterThan(56.7 * 0.9);
		expect(sum(st.edge)).toBeLessThan(56.7 * 1.1);
	});

	it('is symmetric for a square and lists only covered pixels', () => {
		const st = makeStamp('square', 16, 2, 0);
		expect(sum(st.fill)).toBeCloseTo(64, 0);
		for (let j = 0; j < st.size; j++) for (let i = 0; i < st.size; i++) expect(st.fill[j * st.size + i]).toBeCloseTo(st.fill[j * st.size + (st.size - 1 - i)], 6);
		for (const m of st.covered) expect(st.fill[m] + st.edge[m]).toBeGreaterThan(0);
	});

	it('throws on a zero or NaN size', () => {
		expect(() => makeStamp('circle', 0, 1)).toThrow(/size/);
		expect(() => makeStamp('circle', 10, Number.NaN)).toThrow(/size/);
		expect(() => makeStamp('circle', 10, 1, -1)).toThrow(/size/);
	});
});

describe('stamp', () => {
	it('writes the colour exactly where the mark covers a pixel fully', () => {
		const buf = buffer(20, 20);
		const st = makeStamp('square', 36, 1, 0);
		stamp(buf, 20, 20, st, 10, 10, [200, 100, 50], [0, 0, 0]);
		const o = (10 * 20 + 10) * 4;
		expect([...buf.slice(o, o + 4)]).toEqual([200, 100, 50, 255]);
		expect(buf[3]).toBe(0); // a corner far from the mark stays transparent
	});

	it('Porter & Duff (1984) "over": 50 % red over opaque blue gives half red, half blue, opaque', () => {
		const buf = new Uint8ClampedArray([0, 0, 255, 255]);
		const st = { size: 1, centre: 0.5, fill: new Float32Array([0.5]), edge: new Float32Array([0]), covered: new Uint16Array([0]) };
		stamp(buf, 1, 1, st, 0.5, 0.5, [255, 0, 0], [0, 0, 0]);
		expect(buf[0]).toBeCloseTo(128, -1);
		expect(buf[2]).toBeCloseTo(128, -1);
		expect(buf[3]).toBe(255);
	});

	it('keeps the colour and takes the coverage as alpha over a transparent pixel (straight alpha)', () => {
		const buf = buffer(1, 1);
		const st = { size: 1, centre: 0.5, fill: new Float32Array([0.25]), edge: new Float32Array([0]), covered: new Uint16Array([0]) };
		stamp(buf, 1, 1, st, 0.5, 0.5, [10, 20, 30], [0, 0, 0]);
		expect([...buf]).toEqual([10, 20, 30, 64]);
	});

	it('clips marks at the buffer edges', () => {
		const buf = buffer(4, 4);
		expect(() => stamp(buf, 4, 4, makeStamp('circle', 64, 1, 1), 0, 0, [255, 255, 255], [0, 0, 0])).not.toThrow();
		expect(buf[3]).toBeGreaterThan(0);
		expect(buf.length).toBe(64);
	});
});

describe('parseHex', () => {
	it('reads #rrggbb and #rgb, grey otherwise', () => {
		expect(parseHex('#ff8000')).toEqual([255, 128, 0]);
		expect(parseHex('#f80')).toEqual([255, 136, 0]);
		expect(parseHex('color(display-p3 1 0 0)')).toEqual([128, 128, 128]);
	});
});
