/**
 * Power budget for lights on location circuits: how much each circuit carries, how much it may carry,
 * and what is left.
 *
 * For a circuit of V volts behind a breaker of I amps:
 *  - breaker capacity  P_b = V × I                      (W)
 *  - continuous limit  P_c = V × I × k, k = 0.8 default  (W): loads left on for hours are kept to 80 %
 *    of the breaker (common practice: 20 A at 120 V → 1,920 W, 15 A → 1,440 W)
 *  - current drawn     I_load = P / V                    (A), which assumes a power factor of 1;
 *    LED drivers, ballasts and motors can draw more current than W / V suggests (see POWER_CAUTIONS).
 * A load above P_c is over the continuous limit; above P_b it is over the breaker.
 *
 * Household supply presets (voltage, breaker or fuse) are common practice for each region and editable:
 * North America 15 A and 20 A at 120 V; UK 13 A plug fuse at 230 V (about 3 kW a socket);
 * continental Europe 16 A at 230 V; Australia 10 A at 240 V. The 80 % factor is applied to all of them
 * by default as a conservative planning margin, and can be changed per circuit.
 *
 * The plan is plain data (`PowerPlan`) edited through small pure functions that return a new plan, so a
 * page, a project's per-setup plan or a script can share it.
 *
 * References:
 *  - Common practice (location power): the project's trade notes, section "Power on location".
 *  - Real power of a resistive load, P = V·I (RMS values): J. W. Nilsson and S. A. Riedel, Electric
 *    Circuits, 10th ed., Pearson, 2015, ch. 10 (chapter from memory).
 */

/** Continuous loads are kept to 80 % of the breaker rating (common practice). */
export const DEFAULT_CONTINUOUS_FRACTION = 0.8;

/** Our own choice: above this share of the continuous limit a circuit gets a soft "close to the limit" note. */
export const NEAR_LIMIT_FRACTION = 0.9;

export type SupplyPresetId = 'na-15' | 'na-20' | 'uk-13' | 'eu-16' | 'au-10';

export interface SupplyPreset {
	id: SupplyPresetId;
	/** Short name for a button: "North America 20 A". */
	label: string;
	region: string;
	volts: number;
	breakerAmps: number;
	continuousFraction: number;
	/** One line on what the rating protects. */
	note: string;
}

/** Household supplies by region (common practice; every value is editable once on a circuit). */
export const SUPPLY_PRESETS: readonly SupplyPreset[] = [
	{ id: 'na-15', label: 'North America 15 A', region: 'North America', volts: 120, breakerAmps: 15, continuousFraction: DEFAULT_CONTINUOUS_FRACTION, note: '15 A breaker at 120 V' },
	{ id: 'na-20', label: 'North America 20 A', region: 'North America', volts: 120, breakerAmps: 20, continuousFraction: DEFAULT_CONTINUOUS_FRACTION, note: '20 A breaker at 120 V' },
	{ id: 'uk-13', label: 'UK 13 A plug', region: 'United Kingdom', volts: 230, breakerAmps: 13, continuousFraction: DEFAULT_CONTINUOUS_FRACTION, note: '13 A plug fuse at 230 V, about 3 kW a socket' },
	{ id: 'eu-16', label: 'Europe 16 A', region: 'Continental Europe', volts: 230, breakerAmps: 16, continuousFraction: DEFAULT_CONTINUOUS_FRACTION, note: '16 A breaker at 230 V' },
	{ id: 'au-10', label: 'Australia 10 A', region: 'Australia', volts: 240, breakerAmps: 10, continuousFraction: DEFAULT_CONTINUOUS_FRACTION, note: '10 A socket circuit at 240 V' }
];

export function supplyPreset(id: SupplyPresetId): SupplyPreset {
	const preset = SUPPLY_PRESETS.find((p) => p.id === id);
	if (!preset) throw new RangeError(`Unknown supply preset "${id}".`);
	return preset;
}

export interface Circuit {
	id: string;
	label: string;
	volts: number;
	breakerAmps: number;
	/** Share of the breaker rating allowed for continuous load, 0 < k ≤ 1 (0.8 by default). */
	continuousFraction: number;
	/** Preset it started from, if any (for display only). */
	presetId?: SupplyPresetId;
}

export interface Light {
	id: string;
	label: string;
	/** Draw of one unit, W. */
	watts: number;
	/** How many identical units, a whole number ≥ 1. */
	quantity: number;
	/** The circuit it is plugged into, or null while unassigned. */
	circuitId: string | null;
}

export interface PowerPlan {
	circuits: Circuit[];
	lights: Light[];
}

/** Breaker capacity, W: P_b = V × I. */
export function breakerWatts(volts: number, breakerAmps: number): number {
	return volts * breakerAmps;
}

/** Continuous limit, W: P_c = V × I × k (k = 0.8 by common practice). */
export function continuousWatts(volts: number, breakerAmps: number, continuousFraction = DEFAULT_CONTINUOUS_FRACTION): number {
	return volts * breakerAmps * continuousFraction;
}

/** Current drawn, A: I = P / V (power factor 1 assumed). Throws on a voltage that is not above 0. */
export function wattsToAmps(watts: number, volts: number): number {
	if (!(volts > 0) || !Number.isFinite(volts)) throw new RangeError('The voltage must be above 0 V.');
	return watts / volts;
}

/** Total draw of a light line, W: watts × quantity (0 for an invalid line). */
export function lightWatts(light: Light): number {
	return lightErrors(light).length === 0 ? light.watts * light.quantity : 0;
}

/** Plain-language problems with a circuit's rating; empty when usable. */
export function circuitErrors(circuit: Pick<Circuit, 'volts' | 'breakerAmps' | 'continuousFraction'>): string[] {
	const errors: string[] = [];
	if (!Number.isFinite(circuit.volts) || circuit.volts <= 0) errors.push('The voltage must be above 0 V.');
	if (!Number.isFinite(circuit.breakerAmps) || circuit.breakerAmps <= 0) errors.push('The breaker rating must be above 0 A.');
	if (!Number.isFinite(circuit.continuousFraction) || circuit.continuousFraction <= 0 || circuit.continuousFraction > 1)
		errors.push('The continuous share must be above 0 % and at most 100 %.');
	return errors;
}

/** Plain-language problems with a light line; empty when usable. */
export function lightErrors(light: Pick<Light, 'watts' | 'quantity'>): string[] {
	const errors: string[] = [];
	if (!Number.isFinite(light.watts) || light.watts < 0) errors.push('A light draws 0 W or more.');
	if (!Number.isInteger(light.quantity) || light.quantity < 1) errors.push('The quantity is a whole number, 1 or more.');
	return errors;
}

/**
 * How loaded a circuit is: `clear`; `near` above NEAR_LIMIT_FRACTION of the continuous limit (soft note);
 * `over-continuous` above the continuous limit (warning); `over-breaker` above the breaker rating (the
 * breaker will trip); `invalid` when the rating cannot be used.
 */
export type LoadLevel = 'clear' | 'near' | 'over-continuous' | 'over-breaker' | 'invalid';

/** The level for a load against a continuous limit and a breaker capacity (all W). */
export function loadLevel(loadW: number, continuousW: number, breakerW: number, nearFraction = NEAR_LIMIT_FRACTION): LoadLevel {
	if (!(continuousW > 0) || !(breakerW > 0) || !Number.isFinite(loadW)) return 'invalid';
	if (loadW > breakerW) return 'over-breaker';
	if (loadW > continuousW) return 'over-continuous';
	if (loadW > continuousW * nearFraction) return 'near';
	return 'clear';
}

export interface CircuitLoad {
	circuit: Circuit;
	lights: Light[];
	/** W drawn by the circuit's lights. */
	watts: number;
	/** A drawn: watts / volts (NaN when the voltage is unusable). */
	amps: number;
	breakerWatts: number;
	continuousWatts: number;
	/** A allowed continuously: breakerAmps × k. */
	continuousAmps: number;
	/** W left below the continuous limit (negative when over). */
	headroomWatts: number;
	/** A left below the continuous limit (negative when over). */
	headroomAmps: number;
	/** watts / continuousWatts (1 = at the limit). */
	shareOfContinuous: number;
	level: LoadLevel;
	errors: string[];
}

/** Totals for one circuit (common practice: continuous limit at k of V × I). */
export function circuitLoad(circuit: Circuit, lights: readonly Light[]): CircuitLoad {
	const mine = lights.filter((l) => l.circuitId === circuit.id);
	const watts = mine.reduce((sum, l) => sum + lightWatts(l), 0);
	const errors = circuitErrors(circuit);
	const ok = errors.length === 0;
	const bW = ok ? breakerWatts(circuit.volts, circuit.breakerAmps) : NaN;
	const cW = ok ? continuousWatts(circuit.volts, circuit.breakerAmps, circuit.continuousFraction) : NaN;
	const amps = ok ? wattsToAmps(watts, circuit.volts) : NaN;
	const continuousAmps = ok ? circuit.breakerAmps * circuit.continuousFraction : NaN;
	return {
		circuit,
		lights: mine,
		watts,
		amps,
		breakerWatts: bW,
		continuousWatts: cW,
		continuousAmps,
		headroomWatts: cW - watts,
		headroomAmps: continuousAmps - amps,
		shareOfContinuous: watts / cW,
		level: ok ? loadLevel(watts, cW, bW) : 'invalid',
		errors
	};
}

export interface PowerBudget {
	circuits: CircuitLoad[];
	/** Lights not on any circuit (no circuit chosen, or their circuit no longer exists). */
	unassigned: Light[];
	unassignedWatts: number;
	/** W of every valid light, assigned or not. */
	totalWatts: number;
	/** W on circuits. */
	assignedWatts: number;
	/** Sum of the usable circuits' continuous limits, W. */
	totalContinuousWatts: number;
	totalBreakerWatts: number;
	/** totalContinuousWatts − assignedWatts, over usable circuits. */
	totalHeadroomWatts: number;
	/** A for totalWatts when every circuit has the same voltage; NaN when voltages differ or there are no circuits. */
	totalAmps: number;
	/** The voltage shared by all circuits, or NaN. */
	commonVolts: number;
	/** Worst level over the circuits ('clear' when there are none). */
	worst: LoadLevel;
	/** Circuits over the continuous limit or the breaker. */
	overCount: number;
	/** Lines with a problem (id → messages). */
	lightIssues: Record<string, string[]>;
}

const SEVERITY: Record<LoadLevel, number> = { clear: 0, near: 1, invalid: 2, 'over-continuous': 3, 'over-breaker': 4 };

/** Per-circuit and overall totals for a plan. */
export function powerBudget(plan: PowerPlan): PowerBudget {
	const circuits = plan.circuits.map((c) => circuitLoad(c, plan.lights));
	const ids = new Set(plan.circuits.map((c) => c.id));
	const unassigned = plan.lights.filter((l) => l.circuitId === null || !ids.has(l.circuitId));
	const usable = circuits.filter((c) => c.errors.length === 0);
	const assignedWatts = usable.reduce((s, c) => s + c.watts, 0);
	const totalContinuousWatts = usable.reduce((s, c) => s + c.continuousWatts, 0);
	const volts = new Set(plan.circuits.map((c) => c.volts));
	const commonVolts = volts.size === 1 && usable.length === circuits.length ? [...volts][0] : NaN;
	const lightIssues: Record<string, string[]> = {};
	for (const l of plan.lights) {
		const e = lightErrors(l);
		if (e.length > 0) lightIssues[l.id] = e;
	}
	const unassignedWatts = unassigned.reduce((s, l) => s + lightWatts(l), 0);
	const totalWatts = plan.lights.reduce((s, l) => s + lightWatts(l), 0);
	return {
		circuits,
		unassigned,
		unassignedWatts,
		totalWatts,
		assignedWatts,
		totalContinuousWatts,
		totalBreakerWatts: usable.reduce((s, c) => s + c.breakerWatts, 0),
		totalHeadroomWatts: totalContinuousWatts - assignedWatts,
		totalAmps: Number.isNaN(commonVolts) ? NaN : totalWatts / commonVolts,
		commonVolts,
		worst: circuits.reduce<LoadLevel>((w, c) => (SEVERITY[c.level] > SEVERITY[w] ? c.level : w), 'clear'),
		overCount: circuits.filter((c) => c.level === 'over-continuous' || c.level === 'over-breaker').length,
		lightIssues
	};
}

/** One plain sentence for a circuit's level, with the figures a gaffer acts on. */
export function loadMessage(load: CircuitLoad, fmtW: (w: number) => string = (w) => `${Math.round(w)} W`): string {
	switch (load.level) {
		case 'invalid':
			return `Check the rating: ${load.errors.join(' ')}`;
		case 'over-breaker':
			return `Over the breaker rating by ${fmtW(load.watts - load.breakerWatts)}: it will trip. Move lights to another circuit.`;
		case 'over-continuous':
			return `Over the continuous limit by ${fmtW(-load.headroomWatts)}: keep lights that stay on under ${fmtW(load.continuousWatts)}. Move a light to another circuit.`;
		case 'near':
			return `Close to the continuous limit: ${fmtW(load.headroomWatts)} to spare.`;
		case 'clear':
			return `${fmtW(load.headroomWatts)} to spare.`;
	}
}

/** Standing cautions shown beside every power budget. */
export const POWER_CAUTIONS: readonly string[] = [
	'Sockets on one wall often share a circuit: map outlets to breakers with a tester before plugging in.',
	'Kettles, heaters and other crew appliances draw from the same circuits: count them, or keep them off the lighting circuits.',
	'Switch-on (inrush) current and power factor push the real current above W ÷ V, especially on generators: leave head-room. Amps here assume a power factor of 1.',
	'Electrical work must follow local codes and be done or checked by a qualified person. This budget is a planning aid, not an electrical survey.'
];

// ——— Editing a plan: each function returns a new plan and leaves the old one untouched. ———

export function emptyPlan(): PowerPlan {
	return { circuits: [], lights: [] };
}

/** The next free id with a prefix: c1, c2, … (smallest number above every id already used). */
export function nextId(prefix: string, existing: readonly { id: string }[]): string {
	let max = 0;
	for (const { id } of existing) {
		if (!id.startsWith(prefix)) continue;
		const n = Number(id.slice(prefix.length));
		if (Number.isInteger(n) && n > max) max = n;
	}
	return `${prefix}${max + 1}`;
}

export type CircuitInput = Partial<Omit<Circuit, 'id'>> & { presetId?: SupplyPresetId };

/** Adds a circuit, from a preset and/or explicit values; the label defaults to "Circuit n". */
export function addCircuit(plan: PowerPlan, input: SupplyPresetId | CircuitInput): PowerPlan {
	const spec: CircuitInput = typeof input === 'string' ? { presetId: input } : input;
	const preset = spec.presetId ? supplyPreset(spec.presetId) : undefined;
	const id = nextId('c', plan.circuits);
	const circuit: Circuit = {
		id,
		label: spec.label ?? `Circuit ${plan.circuits.length + 1}`,
		volts: spec.volts ?? preset?.volts ?? 230,
		breakerAmps: spec.breakerAmps ?? preset?.breakerAmps ?? 16,
		continuousFraction: spec.continuousFraction ?? preset?.continuousFraction ?? DEFAULT_CONTINUOUS_FRACTION,
		...(preset ? { presetId: preset.id } : {})
	};
	return { ...plan, circuits: [...plan.circuits, circuit] };
}

export function updateCircuit(plan: PowerPlan, id: string, patch: Partial<Omit<Circuit, 'id'>>): PowerPlan {
	return { ...plan, circuits: plan.circuits.map((c) => (c.id === id ? { ...c, ...patch } : c)) };
}

/** Removes a circuit; its lights stay in the plan, unassigned. */
export function removeCircuit(plan: PowerPlan, id: string): PowerPlan {
	return {
		circuits: plan.circuits.filter((c) => c.id !== id),
		lights: plan.lights.map((l) => (l.circuitId === id ? { ...l, circuitId: null } : l))
	};
}

export type LightInput = Partial<Omit<Light, 'id'>> & Pick<Light, 'watts'>;

/** Adds a light line (quantity 1 and unassigned unless given). */
export function addLight(plan: PowerPlan, input: LightInput): PowerPlan {
	const id = nextId('l', plan.lights);
	const light: Light = {
		id,
		label: input.label?.trim() || `Light ${plan.lights.length + 1}`,
		watts: input.watts,
		quantity: input.quantity ?? 1,
		circuitId: input.circuitId ?? null
	};
	return { ...plan, lights: [...plan.lights, light] };
}

export function updateLight(plan: PowerPlan, id: string, patch: Partial<Omit<Light, 'id'>>): PowerPlan {
	return { ...plan, lights: plan.lights.map((l) => (l.id === id ? { ...l, ...patch } : l)) };
}

export function removeLight(plan: PowerPlan, id: string): PowerPlan {
	return { ...plan, lights: plan.lights.filter((l) => l.id !== id) };
}
