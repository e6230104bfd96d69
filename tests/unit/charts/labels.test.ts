import { describe, expect, it } from 'vitest';
import { declutter, labelBox, overlaps, placeArrowLabels, pointBoxes } from '$lib/charts/labels';

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

describe('placeArrowLabels', () => {
	// Five fixes from one light, all ending within a few units of the target (a crowded case).
	const from = { x: 100, y: 200 };
	const heads = [
		{ x: 300, y: 100 },
		{ x: 303, y: 102 },
		{ x: 298, y: 97 },
		{ x: 301, y: 99 },
		{ x: 305, y: 104 }
	];
	const texts = ['Full CTB + ⅛ CTB', '¾ CTB + ¼ CTB', 'Full CTB + ¼ plus green', '¾ CTB', 'LED fix'];
	const arrows = heads.map((to, i) => ({ from, to, text: texts[i], short: String(i + 1) }));
	const bounds = { x0: 0, y0: 0, x1: 480, y1: 400 };

	it('no two labels overlap, none leaves the plot, and each arrow gets its label or its number', () => {
		const placed = placeArrowLabels(arrows, 10, [], bounds);
		const boxes = placed.map((p) => p!.box);
		expect(placed.every((p) => p !== null)).toBe(true);
		for (let i = 0; i < boxes.length; i++) {
			for (let j = i + 1; j < boxes.length; j++) expect(overlaps(boxes[i], boxes[j]), `${texts[i]} / ${texts[j]}`).toBe(false);
			expect(boxes[i].x0).toBeGreaterThanOrEqual(0);
			expect(boxes[i].x1).toBeLessThanOrEqual(480);
		}
		// Room enough here for every full label.
		expect(placed.map((p) => p!.text)).toEqual(texts);
	});

	it('keeps clear of obstacles (the target and its label) and falls back to the number when boxed in', () => {
		const target = { x0: 280, y0: 80, x1: 320, y1: 120 };
		const placed = placeArrowLabels(arrows, 10, [target], bounds);
		for (const p of placed) expect(overlaps(p!.box, target)).toBe(false);
		// A tiny plot leaves room only for short labels, or none; still no overlaps.
		const tight = placeArrowLabels(arrows.map((a) => ({ ...a, from: { x: 20, y: 30 }, to: { x: 40, y: 20 } })), 10, [], { x0: 0, y0: 0, x1: 60, y1: 60 });
		const kept = tight.filter((p) => p !== null).map((p) => p!.box);
		expect(tight.some((p) => p && !p.full)).toBe(true);
		for (let i = 0; i < kept.length; i++) for (let j = i + 1; j < kept.length; j++) expect(overlaps(kept[i], kept[j])).toBe(false);
	});

	it('the old single spot beside the shaft does collide in this case (so the layout is doing the work)', () => {
		const same = arrows.map((a) => labelBox({ x: (a.from.x + a.to.x) / 2, y: (a.from.y + a.to.y) / 2 - 6, text: a.text, anchor: 'middle' }, 10, 0));
		expect(overlaps(same[0], same[1])).toBe(true);
	});
});
