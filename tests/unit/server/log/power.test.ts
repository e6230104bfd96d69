import { describe, expect, it } from 'vitest';
import { powerPlan } from '../../../../src/lib/server/services/log';
import type { Circuit } from '../../../../src/lib/server/db/circuits';
import type { Light } from '../../../../src/lib/server/db/lights';

const now = new Date('2026-12-01T20:00:00Z');
const circuit = (id: number, volts: number, amps: number, derating = 0.8): Circuit => ({ id, projectId: 1, setupId: 1, label: `C${id}`, preset: null, volts, amps, derating, version: 1, createdBy: null, updatedBy: null, createdAt: now, updatedAt: now });
const light = (id: number, powerW: number | null, circuitId: number | null): Light => ({
	id, projectId: 1, setupId: 1, label: `L${id}`, role: 'key', kind: 'tungsten', fixtureProfile: null, gelStack: [], ledSettings: null, dimmerPercent: null, powerW, circuitId, notes: '', position: id, deletedAt: null, version: 1, createdBy: null, updatedBy: null, createdAt: now, updatedAt: now
});

describe('powerPlan', () => {
	it('common practice: a 20 A circuit at 120 V carries 1,920 W continuously (80 %)', () => {
		const p = powerPlan([circuit(1, 120, 20)], [light(1, 1000, 1), light(2, 650, 1)], 120);
		expect(p.circuits[0].continuousWatts).toBe(1920);
		expect(p.circuits[0].breakerWatts).toBe(2400);
		expect(p.circuits[0].watts).toBe(1650);
		expect(p.circuits[0].level).toBe('clear');
		expect(p.overCount).toBe(0);
	});
	it('warns over the continuous limit and over the breaker (16 A at 230 V: 2,944 W / 3,680 W, derived)', () => {
		const over = powerPlan([circuit(1, 230, 16)], [light(1, 2000, 1), light(2, 1200, 1)], 230);
		expect(over.circuits[0].level).toBe('over-continuous');
		expect(over.circuits[0].message).toMatch(/continuous limit by 256/);
		const trip = powerPlan([circuit(1, 230, 16)], [light(1, 2000, 1), light(2, 2000, 1)], 230);
		expect(trip.circuits[0].level).toBe('over-breaker');
		expect(trip.worst).toBe('over-breaker');
		expect(trip.overCount).toBe(1);
	});
	it('counts unassigned lights, lights on a circuit with no draw given, lights not on the crew’s supply, and notes a circuit off the day’s mains', () => {
		const p = powerPlan([circuit(1, 120, 15)], [light(1, 500, null), light(2, null, 1), light(3, null, null)], 230);
		expect(p.unassigned.map((l) => l.id)).toEqual([1]);
		expect(p.unassignedWatts).toBe(500);
		expect(p.noDraw.map((l) => l.id)).toEqual([2]);
		expect(p.external.map((l) => l.id)).toEqual([3]);
		expect(p.totalWatts).toBe(500);
		expect(p.notes[0]).toMatch(/120 V .* 230 V/);
	});
	it('always carries the standing cautions, the last one deferring to qualified people', () => {
		const p = powerPlan([], [], null);
		expect(p.cautions.length).toBeGreaterThanOrEqual(4);
		expect(p.cautions.at(-1)).toMatch(/qualified person/);
		expect(p.circuits).toEqual([]);
	});
});
