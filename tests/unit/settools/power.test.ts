/**
 * Power budget. Ratings and the 80 % continuous-load margin are common practice for location power
 * (not a published standard); the other expected values are arithmetic from them (P = V × I × k, I = P / V).
 */
import { describe, expect, it } from 'vitest';
import {
	NEAR_LIMIT_FRACTION,
	POWER_CAUTIONS,
	SUPPLY_PRESETS,
	addCircuit,
	addLight,
	breakerWatts,
	circuitErrors,
	circuitLoad,
	continuousWatts,
	emptyPlan,
	lightErrors,
	loadLevel,
	loadMessage,
	nextId,
	powerBudget,
	removeCircuit,
	removeLight,
	supplyPreset,
	updateCircuit,
	updateLight,
	wattsToAmps,
	type PowerPlan,
	type SupplyPresetId
} from '../../../src/lib/settools/power';

/** A plan with one circuit from a preset and lights on it (watts each). */
function planWith(preset: SupplyPresetId, ...watts: number[]): PowerPlan {
	let plan = addCircuit(emptyPlan(), preset);
	for (const w of watts) plan = addLight(plan, { watts: w, circuitId: 'c1' });
	return plan;
}
const loadOf = (plan: PowerPlan, index = 0) => powerBudget(plan).circuits[index];

describe('circuit limits', () => {
	it('common practice: 20 A at 120 V at 80 % continuous = 1,920 W (breaker 2,400 W)', () => {
		expect(breakerWatts(120, 20)).toBe(2400);
		expect(continuousWatts(120, 20, 0.8)).toBeCloseTo(1920, 9);
		expect(continuousWatts(120, 20)).toBeCloseTo(1920, 9);
	});

	it('common practice: 15 A at 120 V → 1,440 W continuous (breaker 1,800 W)', () => {
		expect(breakerWatts(120, 15)).toBe(1800);
		expect(continuousWatts(120, 15)).toBeCloseTo(1440, 9);
	});

	it('common practice: UK 13 A plug fuse at 230 V ≈ 3 kW a socket; continental 16 A at 230 V ≈ 3.7 kW (derived)', () => {
		expect(breakerWatts(230, 13)).toBe(2990);
		expect(breakerWatts(230, 16)).toBe(3680);
	});

	it('derived (I = P / V): 1,920 W at 120 V is 16 A; 2,300 W at 230 V is 10 A', () => {
		expect(wattsToAmps(1920, 120)).toBeCloseTo(16, 9);
		expect(wattsToAmps(2300, 230)).toBeCloseTo(10, 9);
		expect(() => wattsToAmps(100, 0)).toThrow('The voltage must be above 0 V.');
	});
});

describe('presets', () => {
	it('common practice: regional household supplies', () => {
		const by = (id: SupplyPresetId) => supplyPreset(id);
		expect(by('na-15')).toMatchObject({ volts: 120, breakerAmps: 15, continuousFraction: 0.8 });
		expect(by('na-20')).toMatchObject({ volts: 120, breakerAmps: 20, continuousFraction: 0.8 });
		expect(by('uk-13')).toMatchObject({ volts: 230, breakerAmps: 13 });
		expect(by('eu-16')).toMatchObject({ volts: 230, breakerAmps: 16 });
		expect(by('au-10')).toMatchObject({ volts: 240, breakerAmps: 10 });
		expect(SUPPLY_PRESETS).toHaveLength(5);
		expect(() => supplyPreset('xx' as SupplyPresetId)).toThrow('Unknown supply preset');
	});

	it('common practice: a preset seeds a circuit that stays editable', () => {
		let plan = addCircuit(emptyPlan(), 'na-20');
		expect(plan.circuits[0]).toMatchObject({ id: 'c1', label: 'Circuit 1', volts: 120, breakerAmps: 20, presetId: 'na-20' });
		plan = updateCircuit(plan, 'c1', { breakerAmps: 15 });
		expect(loadOf(plan).continuousWatts).toBeCloseTo(1440, 9);
		plan = updateCircuit(plan, 'c1', { continuousFraction: 1 });
		expect(loadOf(plan).continuousWatts).toBe(1800);
	});

	it('common practice: Australia 10 A at 240 V at 80 % leaves 1,920 W', () => {
		expect(loadOf(addCircuit(emptyPlan(), 'au-10')).continuousWatts).toBeCloseTo(1920, 9);
	});
});

describe('load levels and warnings', () => {
	it('common practice (80 % rule) with our 90 % note: levels at the edges of a 20 A / 120 V circuit', () => {
		const c = 1920;
		const b = 2400;
		expect(loadLevel(0, c, b)).toBe('clear');
		expect(loadLevel(c * NEAR_LIMIT_FRACTION, c, b)).toBe('clear');
		expect(loadLevel(1750, c, b)).toBe('near');
		expect(loadLevel(1920, c, b)).toBe('near');
		expect(loadLevel(1921, c, b)).toBe('over-continuous');
		expect(loadLevel(2400, c, b)).toBe('over-continuous');
		expect(loadLevel(2401, c, b)).toBe('over-breaker');
		expect(loadLevel(100, NaN, b)).toBe('invalid');
	});

	it('common practice: 2,000 W on 20 A / 120 V is over the continuous limit by 80 W (still under the breaker)', () => {
		const load = loadOf(planWith('na-20', 1000, 1000));
		expect(load.watts).toBe(2000);
		expect(load.amps).toBeCloseTo(16.667, 3);
		expect(load.headroomWatts).toBeCloseTo(-80, 9);
		expect(load.level).toBe('over-continuous');
		expect(loadMessage(load)).toBe(
			'Over the continuous limit by 80 W: keep lights that stay on under 1920 W. Move a light to another circuit.'
		);
	});

	it('common practice: 2,500 W on 20 A / 120 V is over the breaker (2,400 W)', () => {
		const load = loadOf(planWith('na-20', 2500));
		expect(load.level).toBe('over-breaker');
		expect(loadMessage(load)).toContain('Over the breaker rating by 100 W');
	});

	it('common practice: 1,800 W on 20 A / 120 V is close to the 1,920 W limit', () => {
		const load = loadOf(planWith('na-20', 1800));
		expect(load.level).toBe('near');
		expect(loadMessage(load)).toBe('Close to the continuous limit: 120 W to spare.');
	});

	it('common practice: 1,000 W on 15 A / 120 V leaves 440 W (3.7 A) of head-room', () => {
		const load = loadOf(planWith('na-15', 650, 350));
		expect(load.level).toBe('clear');
		expect(load.headroomWatts).toBeCloseTo(440, 9);
		expect(load.headroomAmps).toBeCloseTo(12 - 1000 / 120, 9);
		expect(loadMessage(load, (w) => `${w.toFixed(0)} watts`)).toBe('440 watts to spare.');
	});
});

describe('totals', () => {
	it('derived: per circuit and overall, with quantities and an unassigned light', () => {
		let plan = addCircuit(addCircuit(emptyPlan(), 'na-20'), 'na-15');
		plan = addLight(plan, { label: 'Key', watts: 650, quantity: 2, circuitId: 'c1' });
		plan = addLight(plan, { label: 'Fill', watts: 300, circuitId: 'c2' });
		plan = addLight(plan, { label: 'Spare', watts: 150 });
		const b = powerBudget(plan);
		expect(b.circuits.map((c) => c.watts)).toEqual([1300, 300]);
		expect(b.assignedWatts).toBe(1600);
		expect(b.unassignedWatts).toBe(150);
		expect(b.unassigned.map((l) => l.label)).toEqual(['Spare']);
		expect(b.totalWatts).toBe(1750);
		expect(b.totalContinuousWatts).toBeCloseTo(1920 + 1440, 9);
		expect(b.totalBreakerWatts).toBe(2400 + 1800);
		expect(b.totalHeadroomWatts).toBeCloseTo(3360 - 1600, 9);
		expect(b.commonVolts).toBe(120);
		expect(b.totalAmps).toBeCloseTo(1750 / 120, 9);
		expect(b.worst).toBe('clear');
		expect(b.overCount).toBe(0);
	});

	it('derived: amps are not added across different voltages', () => {
		const plan = addCircuit(addCircuit(emptyPlan(), 'na-20'), 'uk-13');
		const b = powerBudget(plan);
		expect(b.totalAmps).toBeNaN();
		expect(b.commonVolts).toBeNaN();
	});

	it('derived: the worst circuit sets the overall level', () => {
		let plan = addCircuit(addCircuit(emptyPlan(), 'na-20'), 'na-20');
		plan = addLight(plan, { watts: 2000, circuitId: 'c2' });
		const b = powerBudget(plan);
		expect(b.worst).toBe('over-continuous');
		expect(b.overCount).toBe(1);
	});

	it('an empty plan totals zero', () => {
		const b = powerBudget(emptyPlan());
		expect(b).toMatchObject({ totalWatts: 0, assignedWatts: 0, totalContinuousWatts: 0, worst: 'clear', overCount: 0 });
	});
});

describe('editing a plan', () => {
	it('ids are the next free number, never reused while a higher one exists', () => {
		expect(nextId('c', [])).toBe('c1');
		expect(nextId('c', [{ id: 'c1' }, { id: 'c7' }, { id: 'x9' }])).toBe('c8');
	});

	it('removing a circuit leaves its lights unassigned', () => {
		let plan = planWith('eu-16', 1000);
		plan = removeCircuit(plan, 'c1');
		expect(plan.circuits).toEqual([]);
		expect(plan.lights[0].circuitId).toBeNull();
		expect(powerBudget(plan).unassignedWatts).toBe(1000);
	});

	it('a light whose circuit vanished from stored data counts as unassigned', () => {
		const plan: PowerPlan = { circuits: [], lights: [{ id: 'l1', label: 'x', watts: 500, quantity: 1, circuitId: 'c9' }] };
		expect(powerBudget(plan).unassigned).toHaveLength(1);
	});

	it('moving, editing and removing lights; the old plan is untouched', () => {
		const before = addCircuit(planWith('na-20', 1000), 'na-20');
		const moved = updateLight(before, 'l1', { circuitId: 'c2' });
		expect(loadOf(moved, 0).watts).toBe(0);
		expect(loadOf(moved, 1).watts).toBe(1000);
		expect(loadOf(before, 0).watts).toBe(1000);
		expect(loadOf(updateLight(moved, 'l1', { quantity: 3 }), 1).watts).toBe(3000);
		expect(removeLight(moved, 'l1').lights).toEqual([]);
	});

	it('a light gets a default name', () => {
		expect(addLight(emptyPlan(), { watts: 100, label: '  ' }).lights[0].label).toBe('Light 1');
	});
});

describe('bad input', () => {
	it('circuit ratings must be positive; the continuous share between 0 and 100 %', () => {
		expect(circuitErrors({ volts: 120, breakerAmps: 20, continuousFraction: 0.8 })).toEqual([]);
		expect(circuitErrors({ volts: 0, breakerAmps: 20, continuousFraction: 0.8 })).toEqual(['The voltage must be above 0 V.']);
		expect(circuitErrors({ volts: 120, breakerAmps: NaN, continuousFraction: 0.8 })).toEqual(['The breaker rating must be above 0 A.']);
		expect(circuitErrors({ volts: 120, breakerAmps: 20, continuousFraction: 1.2 })).toHaveLength(1);
		expect(circuitErrors({ volts: -1, breakerAmps: -1, continuousFraction: 0 })).toHaveLength(3);
	});

	it('an unusable circuit is flagged, not counted', () => {
		const plan = updateCircuit(planWith('na-20', 500), 'c1', { volts: NaN });
		const b = powerBudget(plan);
		expect(b.circuits[0].level).toBe('invalid');
		expect(b.circuits[0].amps).toBeNaN();
		expect(loadMessage(b.circuits[0])).toBe('Check the rating: The voltage must be above 0 V.');
		expect(b.totalContinuousWatts).toBe(0);
		expect(b.worst).toBe('invalid');
	});

	it('negative or NaN watts and a fractional quantity are flagged and count as 0 W', () => {
		expect(lightErrors({ watts: -5, quantity: 1 })).toEqual(['A light draws 0 W or more.']);
		expect(lightErrors({ watts: 100, quantity: 1.5 })).toEqual(['The quantity is a whole number, 1 or more.']);
		const plan = addLight(planWith('na-20', 300), { watts: NaN, circuitId: 'c1' });
		const b = powerBudget(plan);
		expect(b.circuits[0].watts).toBe(300);
		expect(b.lightIssues).toEqual({ l2: ['A light draws 0 W or more.'] });
	});
});

describe('cautions', () => {
	it('common practice: shared circuits, crew appliances, inrush and power factor, local codes', () => {
		const text = POWER_CAUTIONS.join(' ');
		expect(text).toMatch(/share a circuit/);
		expect(text).toMatch(/tester/);
		expect(text).toMatch(/kettles/i);
		expect(text).toMatch(/inrush/);
		expect(text).toMatch(/power factor/);
		expect(text).toMatch(/generators/);
		expect(text).toMatch(/local codes/);
		expect(text).toMatch(/qualified person/);
	});
});
