/**
 * Saving the set tools' state between visits (the page keeps it in localStorage): versioned JSON in,
 * checked plain objects out. Anything unreadable gives null, never a half-read plan.
 * Numbers a user left blank are NaN in memory and null in JSON.
 */
import { z } from 'zod';
import { SUPPLY_PRESETS, type PowerPlan, type SupplyPresetId } from './power';

export const POWER_STORAGE_KEY = 'chromaslate.settools.power.v1';
export const SHUTTER_STORAGE_KEY = 'chromaslate.settools.shutter.v1';

/** A number, or null for a field left blank (read back as NaN). */
const num = z
	.number()
	.nullable()
	.transform((v) => (v === null ? NaN : v));
const presetIds = SUPPLY_PRESETS.map((p) => p.id) as [SupplyPresetId, ...SupplyPresetId[]];

const planSchema = z.object({
	version: z.literal(1),
	circuits: z.array(
		z.object({
			id: z.string().min(1),
			label: z.string(),
			volts: num,
			breakerAmps: num,
			continuousFraction: num,
			presetId: z.enum(presetIds).optional()
		})
	),
	lights: z.array(
		z.object({
			id: z.string().min(1),
			label: z.string(),
			watts: num,
			quantity: num,
			circuitId: z.string().nullable()
		})
	)
});

export function serializePowerPlan(plan: PowerPlan): string {
	return JSON.stringify({ version: 1, circuits: plan.circuits, lights: plan.lights });
}

/** The plan stored by `serializePowerPlan`, or null when the text is missing, not JSON or not a plan. */
export function parsePowerPlan(text: string | null | undefined): PowerPlan | null {
	if (!text) return null;
	let raw: unknown;
	try {
		raw = JSON.parse(text);
	} catch {
		return null;
	}
	const parsed = planSchema.safeParse(raw);
	if (!parsed.success) return null;
	const { circuits, lights } = parsed.data;
	return {
		circuits: circuits.map(({ presetId, ...c }) => (presetId ? { ...c, presetId } : c)),
		lights
	};
}

export type ShutterMode = 'angle' | 'speed';

export interface ShutterSettings {
	fps: number;
	mainsHz: number;
	mode: ShutterMode;
	/** degrees */
	angleDeg: number;
	/** x in a shutter speed of 1/x s */
	speedDenominator: number;
}

export const DEFAULT_SHUTTER_SETTINGS: ShutterSettings = { fps: 24, mainsHz: 50, mode: 'angle', angleDeg: 180, speedDenominator: 50 };

const shutterSchema = z.object({
	version: z.literal(1),
	fps: num,
	mainsHz: num,
	mode: z.enum(['angle', 'speed']),
	angleDeg: num,
	speedDenominator: num
});

export function serializeShutterSettings(s: ShutterSettings): string {
	return JSON.stringify({ version: 1, ...s });
}

/** The settings stored by `serializeShutterSettings`, or null when unreadable. */
export function parseShutterSettings(text: string | null | undefined): ShutterSettings | null {
	if (!text) return null;
	try {
		const parsed = shutterSchema.safeParse(JSON.parse(text));
		if (!parsed.success) return null;
		const { version: _version, ...settings } = parsed.data;
		return settings;
	} catch {
		return null;
	}
}
