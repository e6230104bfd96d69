/**
 * Label placement: keep a label only if its box overlaps no label kept before it and no obstacle
 * (reading marks), taking labels in the order given (most important first). Boxes are estimated
 * from the character count, which is close enough for short numeric labels in a tabular font.
 *
 * References: none (greedy rectangle packing).
 */

export interface LabelBox {
	x: number;
	y: number;
	text: string;
	anchor: 'start' | 'middle' | 'end';
}

export interface Box {
	x0: number;
	y0: number;
	x1: number;
	y1: number;
}

/** Box of a text label at baseline (x, y), font size `font`, in the same units. */
export function labelBox(l: LabelBox, font: number, pad = 1): Box {
	const w = l.text.length * font * 0.58;
	const x0 = l.anchor === 'start' ? l.x : l.anchor === 'end' ? l.x - w : l.x - w / 2;
	return { x0: x0 - pad, x1: x0 + w + pad, y0: l.y - font * 0.8 - pad, y1: l.y + font * 0.2 + pad };
}

export function overlaps(a: Box, b: Box): boolean {
	return a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
}

/** Which labels to draw (true = keep), in input order; with `bounds`, only labels wholly inside it. */
export function declutter(labels: readonly LabelBox[], font: number, obstacles: readonly Box[] = [], bounds?: Box): boolean[] {
	const kept: Box[] = [];
	return labels.map((l) => {
		const b = labelBox(l, font);
		if (bounds && (b.x0 < bounds.x0 || b.x1 > bounds.x1 || b.y0 < bounds.y0 || b.y1 > bounds.y1)) return false;
		if (obstacles.some((o) => overlaps(b, o)) || kept.some((k) => overlaps(b, k))) return false;
		kept.push(b);
		return true;
	});
}

/** A square obstacle of half-size `r` around each point. */
export function pointBoxes(points: ReadonlyArray<{ x: number; y: number }>, r: number): Box[] {
	return points.map((p) => ({ x0: p.x - r, x1: p.x + r, y0: p.y - r, y1: p.y + r }));
}
