/**
 * A gel stack's combined transmission: filters in a stack multiply (each sheet passes its fraction
 * of what reaches it, so the order does not matter). Each filter is held flat beyond its own range,
 * as the solvers treat it.
 *
 * References:
 *   Transmission of filters in series: τ(λ) = Π τᵢ(λ) (Beer–Lambert; densities add).
 */
import { valueAt, type Spectrum } from '../../colour';
import type { Gel } from './library';

/** Π τᵢ(λ) over the stack on start–end nm at `interval` (default 380–780 nm at 1 nm); an empty stack is clear (1). */
export function stackTransmission(stack: readonly Pick<Gel, 'transmission'>[], start = 380, end = 780, interval = 1): Spectrum {
	if (!(interval > 0) || !(end >= start)) throw new RangeError(`A grid needs end ≥ start and a positive step, got ${start}–${end} at ${interval} nm.`);
	const n = Math.round((end - start) / interval) + 1;
	const values = new Float64Array(n).fill(1);
	for (const g of stack) for (let i = 0; i < n; i++) values[i] *= valueAt(g.transmission, start + i * interval, 'hold');
	return { start, interval, values, scale: 'relative' };
}
