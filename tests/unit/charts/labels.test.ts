import { describe, expect, it } from 'vitest';
import { declutter, labelBox, overlaps, pointBoxes } from '$lib/charts/labels';

describe('declutter', () => {
	it('keeps the first of two overlapping labels and any label clear of the others', () => {
		const keep = declutter(
			[
				{ x: 0, y: 10, text: '3200 K', anchor: 'start' },
				{ x: 5, y: 12, text: '3333 K', anchor: 'start' },
				{ x: 100, y: 10, text: '5000 K', anchor: 'start' }
			],
			10
		);
		expect(keep).toEqual([true, false, true]);
	});

	it('drops a label that would sit on a reading mark', () => {
		const keep = declutter([{ x: 0, y: 10, text: '2500 K', anchor: 'start' }], 10, pointBoxes([{ x: 10, y: 7 }], 4));
		expect(keep).toEqual([false]);
	});

	it('drops a label that would be cut off at the edge of the plot', () => {
		const bounds = { x0: 0, y0: 0, x1: 100, y1: 100 };
		expect(declutter([{ x: 95, y: 50, text: '590', anchor: 'start' }, { x: 50, y: 50, text: '590', anchor: 'start' }], 10, [], bounds)).toEqual([false, true]);
	});

	it('places boxes by text anchor', () => {
		const s = labelBox({ x: 50, y: 20, text: 'abcd', anchor: 'start' }, 10, 0);
		const e = labelBox({ x: 50, y: 20, text: 'abcd', anchor: 'end' }, 10, 0);
		const m = labelBox({ x: 50, y: 20, text: 'abcd', anchor: 'middle' }, 10, 0);
		expect(s.x0).toBe(50);
		expect(e.x1).toBe(50);
		expect((m.x0 + m.x1) / 2).toBeCloseTo(50, 9);
		expect(overlaps(s, e)).toBe(false);
		expect(overlaps(s, m)).toBe(true);
	});
});
