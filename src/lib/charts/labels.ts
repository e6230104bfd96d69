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

/* ------------------------------------------------------------------ arrow labels */

export interface ArrowLabelInput {
	from: { x: number; y: number };
	to: { x: number; y: number };
	/** The full label, e.g. "Full CTB + ⅛ CTB". */
	text: string;
	/** A short stand-in used when the full label finds no room (e.g. the arrow's number). */
	short: string;
}

export interface PlacedArrowLabel extends LabelBox {
	/** True when the full text was placed, false when only the short one found room. */
	full: boolean;
	/** A thin line from the arrow to a label set away from it, or null when it sits beside the shaft. */
	leader: { x1: number; y1: number; x2: number; y2: number } | null;
	box: Box;
}

/** Along-shaft positions tried, as fractions from the tail (middle first), and distances out from it in font sizes. */
const ALONG = [0.5, 0.35, 0.65, 0.2, 0.8, 0.05];
const OUT = [0.35, 1.3, 2.4, 3.6, 5];

/**
 * Places one label per arrow so that no two labels overlap each other or an obstacle (reading marks,
 * other labels) and each stays inside `bounds`. Arrows are taken in order (most important first);
 * for each, positions beside the shaft (middle out, near side then far) and behind its tail are
 * tried with the full text, then with the short text. Labels set more than a font size from the
 * shaft get a leader line. An arrow whose label finds no room at all gets null.
 */
export function placeArrowLabels(arrows: readonly ArrowLabelInput[], font: number, obstacles: readonly Box[] = [], bounds?: Box): Array<PlacedArrowLabel | null> {
	const kept: Box[] = [];
	const fits = (b: Box) =>
		!(bounds && (b.x0 < bounds.x0 || b.x1 > bounds.x1 || b.y0 < bounds.y0 || b.y1 > bounds.y1)) && !obstacles.some((o) => overlaps(b, o)) && !kept.some((k) => overlaps(b, k));
	return arrows.map((a) => {
		for (const [text, full] of [
			[a.text, true],
			[a.short, false]
		] as const) {
			if (!text) continue;
			for (const c of arrowLabelCandidates(a, text, font)) {
				if (fits(c.box)) {
					kept.push(c.box);
					return { ...c, full };
				}
			}
		}
		return null;
	});
}

/** Candidate places for an arrow's label, in the order they are tried. */
export function arrowLabelCandidates(a: Pick<ArrowLabelInput, 'from' | 'to'>, text: string, font: number): Array<Omit<PlacedArrowLabel, 'full'>> {
	const dx = a.to.x - a.from.x;
	const dy = a.to.y - a.from.y;
	const len = Math.hypot(dx, dy);
	const ux = len > 0 ? dx / len : 1;
	const uy = len > 0 ? dy / len : 0;
	// Normals: the upper side first (screen y grows downward), so labels lean the same way.
	const raw = { x: uy, y: -ux };
	const n1 = raw.y > 0 || (raw.y === 0 && raw.x < 0) ? { x: -raw.x, y: -raw.y } : raw;
	const normals = [n1, { x: -n1.x, y: -n1.y }];
	const w = text.length * font * 0.58;
	const h = font;
	const out: Array<Omit<PlacedArrowLabel, 'full'>> = [];
	const make = (px: number, py: number, dir: { x: number; y: number }, gap: number) => {
		const extent = (Math.abs(dir.x) * w) / 2 + (Math.abs(dir.y) * h) / 2;
		const cx = px + dir.x * (gap + extent);
		const cy = py + dir.y * (gap + extent);
		const l: LabelBox = { x: cx, y: cy + font * 0.3, text, anchor: 'middle' };
		const leader = gap > font ? { x1: px, y1: py, x2: cx - dir.x * extent, y2: cy - dir.y * extent } : null;
		out.push({ ...l, leader, box: labelBox(l, font) });
	};
	for (const out_ of OUT) {
		for (const t of ALONG) {
			for (const n of normals) make(a.from.x + dx * t, a.from.y + dy * t, n, out_ * font);
		}
		// Behind the tail, on the line of the arrow.
		make(a.from.x, a.from.y, { x: -ux, y: -uy }, out_ * font + font * 0.4);
	}
	return out;
}

/**
 * Labels for the arrows that want one (`need`), each numbered by its place in the whole list (the
 * chart's key uses the same numbers): `placeArrowLabels` over those, null for the rest.
 */
export function placeNumberedArrowLabels(
	arrows: ReadonlyArray<Omit<ArrowLabelInput, 'short'> & { need: boolean }>,
	font: number,
	obstacles: readonly Box[] = [],
	bounds?: Box
): Array<PlacedArrowLabel | null> {
	const list = arrows.map((a, i) => ({ a, i })).filter((x) => x.a.need);
	const placed = placeArrowLabels(
		list.map(({ a, i }) => ({ from: a.from, to: a.to, text: a.text, short: String(i + 1) })),
		font,
		obstacles,
		bounds
	);
	const out: Array<PlacedArrowLabel | null> = arrows.map(() => null);
	list.forEach(({ i }, k) => (out[i] = placed[k]));
	return out;
}
