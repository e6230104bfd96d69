import { describe, expect, it } from 'vitest';
import {
	circuitFormSchema,
	gelStackField,
	lightFormSchema,
	lightPatchSchema,
	parseChannelLevels,
	setupPatchSchema,
	shootDaySchema,
	storedTargetSchema,
	targetFormSchema,
	typedReadingFormSchema
} from '../../../../src/lib/schemas/log';

const day = (over: Record<string, unknown> = {}) => ({ date: '2026-12-01', label: 'Night 1', locationName: 'Laundromat (invented)', mainsVoltage: '230', mainsFrequency: '50', notes: '', ...over });

describe('shoot day schema', () => {
	it('reads form strings into numbers', () => {
		expect(shootDaySchema.parse(day())).toMatchObject({ mainsVoltage: 230, mainsFrequency: 50 });
	});
	it('refuses a date that does not exist, a frequency other than 50/60 Hz and a blank voltage', () => {
		const r = shootDaySchema.safeParse(day({ date: '2026-02-30', mainsFrequency: '55', mainsVoltage: '' }));
		expect(r.success).toBe(false);
		const paths = r.error!.issues.map((i) => i.path[0]);
		expect(paths).toEqual(expect.arrayContaining(['date', 'mainsFrequency', 'mainsVoltage']));
	});
	it('refuses NaN and out-of-range voltages', () => {
		expect(shootDaySchema.safeParse(day({ mainsVoltage: 'abc' })).success).toBe(false);
		expect(shootDaySchema.safeParse(day({ mainsVoltage: 12 })).success).toBe(false);
		expect(shootDaySchema.safeParse(day({ mainsVoltage: 120, mainsFrequency: 60 })).success).toBe(true);
	});
});

describe('patch schemas', () => {
	it('return only the fields that were sent (no defaults slipped in)', () => {
		expect(setupPatchSchema.parse({ version: 3, name: 'Wide' })).toEqual({ version: 3, name: 'Wide' });
		expect(lightPatchSchema.parse({ version: 1, dimmerPercent: 40 })).toEqual({ version: 1, dimmerPercent: 40 });
	});
	it('need a version and refuse unknown fields', () => {
		expect(setupPatchSchema.safeParse({ name: 'Wide' }).success).toBe(false);
		expect(lightPatchSchema.safeParse({ version: 1, colour: 'red' }).success).toBe(false);
	});
});

describe('gel stacks and LED channels', () => {
	it('split a typed stack on + and commas, lamp side first', () => {
		expect(gelStackField.parse('cto-half + plusgreen-quarter')).toEqual(['cto-half', 'plusgreen-quarter']);
		expect(gelStackField.parse('½ CTO, ¼ plus green')).toEqual(['½ CTO', '¼ plus green']);
		expect(gelStackField.parse('')).toEqual([]);
		expect(gelStackField.parse(['ctb-full'])).toEqual(['ctb-full']);
	});
	it('refuse a stack of more than 8 gels', () => {
		expect(gelStackField.safeParse(Array.from({ length: 9 }, () => 'nd-0.3')).success).toBe(false);
	});
	it('read channel levels in several spellings', () => {
		expect(parseChannelLevels('R 40, G 20, B 10, W 80')).toEqual({ R: 40, G: 20, B: 10, W: 80 });
		expect(parseChannelLevels('R=40 G=20.5')).toEqual({ R: 40, G: 20.5 });
		expect(parseChannelLevels('WW: 100; CW: 0 %')).toEqual({ WW: 100, CW: 0 });
		expect(parseChannelLevels('   ')).toEqual({});
	});
	it('throw a sentence for levels above 100 % or text it cannot read', () => {
		expect(() => parseChannelLevels('R 140')).toThrow(/above 100/);
		expect(() => parseChannelLevels('forty')).toThrow(/R 40, G 20/);
	});
});

describe('light form', () => {
	const base = { label: 'Key panel', role: 'key', kind: 'led-rgbw', gelStack: '', dimmerPercent: '', powerW: '200', circuitId: '', notes: '', ledCct: '', ledGm: '', ledIntensity: '', ledChannels: '' };
	it('gives no LED settings when every LED field is blank', () => {
		const r = lightFormSchema.parse(base);
		expect(r.ledSettings).toBeNull();
		expect(r.powerW).toBe(200);
		expect(r.dimmerPercent).toBeNull();
		expect(r.circuitId).toBeNull();
	});
	it('gathers the LED fields into one settings object', () => {
		const r = lightFormSchema.parse({ ...base, ledCct: '5600', ledGm: '-10', ledChannels: 'R 40, W 80' });
		expect(r.ledSettings).toEqual({ cct_k: 5600, gm: -10, intensity: null, channels: { R: 40, W: 80 } });
	});
	it('names the field that is wrong', () => {
		const r = lightFormSchema.safeParse({ ...base, ledChannels: 'R 400' });
		expect(r.success).toBe(false);
		expect(r.error!.issues.map((i) => i.path[0])).toEqual(['ledChannels']);
		const r2 = lightFormSchema.safeParse({ ...base, dimmerPercent: '140' });
		expect(r2.error!.issues.map((i) => i.path[0])).toEqual(['dimmerPercent']);
	});
	it('accepts a decimal comma', () => {
		expect(lightFormSchema.parse({ ...base, dimmerPercent: '62,5' }).dimmerPercent).toBe(62.5);
	});
});

describe('target white', () => {
	it('takes each kind from the form', () => {
		expect(targetFormSchema.parse({ kind: 'cct_duv', cct_k: '3200', duv: '', version: '2' })).toEqual({ target: { kind: 'cct_duv', cct_k: 3200, duv: 0 }, tolerance: undefined, version: 2 });
		expect(targetFormSchema.parse({ kind: 'reading', readingId: '7', version: '1', tolerance: '0,003' })).toEqual({ target: { kind: 'reading', readingId: 7 }, tolerance: 0.003, version: 1 });
		expect(targetFormSchema.parse({ kind: 'illuminant', name: 'D65', version: '1' }).target).toEqual({ kind: 'illuminant', name: 'D65' });
	});
	it('refuses xy outside the chromaticity diagram and CCT outside 1000–25000 K, on the right field', () => {
		const r = targetFormSchema.safeParse({ kind: 'xy', x: '0.7', y: '0.5', version: '1' });
		expect(r.success).toBe(false);
		expect(r.error!.issues[0].path).toEqual(['y']);
		const r2 = targetFormSchema.safeParse({ kind: 'cct_duv', cct_k: '900', version: '1' });
		expect(r2.error!.issues[0].path).toEqual(['cct_k']);
		expect(storedTargetSchema.safeParse({ kind: 'illuminant', name: 'F13' }).success).toBe(false);
	});
	it('needs the version the form was drawn with', () => {
		expect(targetFormSchema.safeParse({ kind: 'cct_duv', cct_k: '3200' }).success).toBe(false);
	});
});

describe('circuit form', () => {
	// Common practice (trade notes, "Power on location"): continental Europe 16 A at 230 V; North America 20 A at 120 V.
	it('fills blanks from the preset', () => {
		expect(circuitFormSchema.parse({ label: 'Wall', preset: 'eu-16', volts: '', amps: '', derating: '' })).toEqual({ label: 'Wall', preset: 'eu-16', volts: 230, amps: 16, derating: 0.8 });
		expect(circuitFormSchema.parse({ label: 'Kitchen', preset: 'na-20' })).toMatchObject({ volts: 120, amps: 20 });
	});
	it('keeps what was typed over the preset and reads the continuous share as a percentage', () => {
		expect(circuitFormSchema.parse({ label: 'Wall', preset: 'eu-16', volts: '', amps: '10', derating: '75' })).toMatchObject({ amps: 10, derating: 0.75 });
	});
	it('refuses a custom circuit without a rating', () => {
		const r = circuitFormSchema.safeParse({ label: 'Odd', preset: '', volts: '230', amps: '' });
		expect(r.success).toBe(false);
		expect(r.error!.issues[0].path).toEqual(['amps']);
	});
});

describe('typed reading', () => {
	it('builds a CCT + Duv reading with Duv 0 when blank', () => {
		expect(typedReadingFormSchema.parse({ entry: 'cct_duv', cct_k: '4100', duv: '', lux: '350' }).raw).toEqual({ kind: 'cct_duv', cct_k: 4100, duv: 0, lux: 350 });
	});
	it('refuses x + y ≥ 1 and a time it cannot read', () => {
		const r = typedReadingFormSchema.safeParse({ entry: 'chromaticity_xy', x: '0.6', y: '0.45', takenAt: 'yesterday-ish' });
		expect(r.success).toBe(false);
		expect(r.error!.issues.map((i) => i.path[0]).sort()).toEqual(['takenAt', 'y']);
	});
});
