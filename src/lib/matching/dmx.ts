/**
 * DMX512 level conversions: a channel level (0–1) to 8-bit and 16-bit (coarse/fine) slot values
 * and back.
 *
 * References:
 *   ANSI E1.11-2008 (R2018), "Entertainment Technology — USITT DMX512-A": each data slot carries one
 *   8-bit value, 0–255 (from memory). Sixteen-bit parameters across two slots (coarse = high byte, fine = low byte)
 *   are a fixture convention, not part of the standard (common practice).
 *
 * Rounding convention (ours, stated once): the level is scaled to the full code range and rounded
 * half up, so 8-bit value = round(level × 255) (50 % → 127.5 → 128) and 16-bit value =
 * round(level × 65535) (50 % → 32767.5 → 32768 → coarse 128, fine 0). 0 % → 0 and 100 % → the top
 * code exactly. Reading back, value / 255 or value / 65535.
 */

export const DMX8_MAX = 255;
export const DMX16_MAX = 65535;

export class DmxError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'DmxError';
	}
}

function checkLevel(level: number): number {
	if (typeof level !== 'number' || Number.isNaN(level)) {
		throw new DmxError(`Channel level must be a number from 0 to 1, got ${String(level)}.`);
	}
	// Levels a hair outside 0..1 come from floating-point solvers; clamp, but refuse real errors.
	if (level < -1e-9 || level > 1 + 1e-9) {
		throw new DmxError(`Channel level must be from 0 to 1 (0–100 %), got ${level}.`);
	}
	return Math.min(1, Math.max(0, level));
}

/** Level 0–1 → 8-bit DMX value 0–255, rounded half up (see header). */
export function levelToDmx8(level: number): number {
	return Math.floor(checkLevel(level) * DMX8_MAX + 0.5);
}

/** Level 0–1 → 16-bit DMX value 0–65535 with its coarse (high byte) and fine (low byte) slots. */
export function levelToDmx16(level: number): { value: number; coarse: number; fine: number } {
	const value = Math.floor(checkLevel(level) * DMX16_MAX + 0.5);
	return { value, coarse: value >> 8, fine: value & 0xff };
}

function checkCode(v: number, max: number, what: string): number {
	if (!Number.isInteger(v) || v < 0 || v > max) {
		throw new DmxError(`${what} must be a whole number from 0 to ${max}, got ${String(v)}.`);
	}
	return v;
}

/** 8-bit DMX value 0–255 → level 0–1. */
export function dmx8ToLevel(value: number): number {
	return checkCode(value, DMX8_MAX, '8-bit DMX value') / DMX8_MAX;
}

/** 16-bit DMX coarse and fine slot values (0–255 each) → level 0–1. */
export function dmx16ToLevel(coarse: number, fine: number): number {
	const c = checkCode(coarse, DMX8_MAX, 'DMX coarse value');
	const f = checkCode(fine, DMX8_MAX, 'DMX fine value');
	return (c * 256 + f) / DMX16_MAX;
}

/** Level 0–1 → percent (0–100), for display. */
export function levelToPercent(level: number): number {
	return checkLevel(level) * 100;
}
