/** Shapes of the generated reference tables in this folder (hand-written; the tables are generated). */

/** One spectral table on a uniform grid: values[i] belongs to start + i·interval nm. */
export interface SpectralTable {
	readonly start: number;
	readonly interval: number;
	readonly values: readonly number[];
}

/** Colour-matching functions x̄, ȳ, z̄ on one uniform grid. */
export interface CmfTable {
	readonly start: number;
	readonly interval: number;
	readonly x: readonly number[];
	readonly y: readonly number[];
	readonly z: readonly number[];
}
