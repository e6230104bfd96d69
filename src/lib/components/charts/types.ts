/** Props shared by the chart components (chromaticities are CIE 1931 xy). */
import type { PointShape } from '$lib/charts/cie1931';

export type { PointShape };

/** One reading on a chart. `shape` picks its mark (else its role's mark, else one by position). */
export interface ChartReading {
	id: string;
	label: string;
	x: number;
	y: number;
	shape?: PointShape;
	/** Light role (key, fill, back, practical, ambient, background, effect): picks a default mark. */
	role?: string;
}

/** The target white and its tolerance, a distance Δu′v′. */
export interface ChartTarget {
	x: number;
	y: number;
	tolerance: number;
	label: string;
}

/** A proposed fix: where a light is now and where the fix is predicted to take it. */
export interface ChartArrow {
	from: { x: number; y: number };
	to: { x: number; y: number };
	label: string;
}

/** A mark as the chart frame draws it: plane coordinates (xy or u′v′) plus how it looks. */
export interface FramePoint {
	id: string;
	label: string;
	/** Plane coordinates: x, y on the CIE 1931 chart; u′, v′ on the distance chart. */
	px: number;
	py: number;
	/** The reading's chromaticity (for details), CIE 1931 xy. */
	x: number;
	y: number;
	fill: string;
	shape: PointShape;
	role?: string;
}

export type DetailRow = [label: string, value: string];
