import { describe, expect, it } from 'vitest';
import { addCircuit, addLight, emptyPlan, updateLight } from '../../../src/lib/settools/power';
import {
	DEFAULT_SHUTTER_SETTINGS,
	parsePowerPlan,
	parseShutterSettings,
	serializePowerPlan,
	serializeShutterSettings
} from '../../../src/lib/settools/storage';

const samplePlan = () => addLight(addCircuit(emptyPlan(), 'uk-13'), { label: 'Key', watts: 650, quantity: 2, circuitId: 'c1' });

describe('power plan storage', () => {
	it('round-trips a plan', () => {
		const plan = samplePlan();
		expect(parsePowerPlan(serializePowerPlan(plan))).toEqual(plan);
	});

	it('a blank number survives as NaN', () => {
		const plan = updateLight(samplePlan(), 'l1', { watts: NaN });
		expect(parsePowerPlan(serializePowerPlan(plan))?.lights[0].watts).toBeNaN();
	});

	it('rejects missing, broken, foreign and future data', () => {
		expect(parsePowerPlan(null)).toBeNull();
		expect(parsePowerPlan('')).toBeNull();
		expect(parsePowerPlan('{not json')).toBeNull();
		expect(parsePowerPlan('{"circuits":[],"lights":[]}')).toBeNull();
		expect(parsePowerPlan('{"version":2,"circuits":[],"lights":[]}')).toBeNull();
		expect(parsePowerPlan('{"version":1,"circuits":[{"id":"c1"}],"lights":[]}')).toBeNull();
		expect(
			parsePowerPlan('{"version":1,"circuits":[{"id":"c1","label":"x","volts":1,"breakerAmps":1,"continuousFraction":1,"presetId":"zz"}],"lights":[]}')
		).toBeNull();
	});
});

describe('shutter settings storage', () => {
	it('round-trips the settings', () => {
		const s = { ...DEFAULT_SHUTTER_SETTINGS, fps: 23.976, mainsHz: 60, mode: 'speed' as const };
		expect(parseShutterSettings(serializeShutterSettings(s))).toEqual(s);
	});

	it('rejects unreadable settings', () => {
		expect(parseShutterSettings(undefined)).toBeNull();
		expect(parseShutterSettings('[]')).toBeNull();
		expect(parseShutterSettings('{"version":1,"fps":24,"mainsHz":50,"mode":"x","angleDeg":180,"speedDenominator":50}')).toBeNull();
	});
});
