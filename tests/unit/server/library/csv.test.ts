import { describe, expect, it } from 'vitest';
import { ApiError } from '../../../../src/lib/server/api';
import {
	filterViews,
	gelFromRow,
	keyFromName,
	overrideSchema,
	parseDecimalField,
	profileFromRow,
	readChannelsCsv,
	readTransmissionCsv
} from '../../../../src/lib/server/services/library';
import type { FilterOverride } from '../../../../src/lib/server/db/filter-overrides';
import { solveLedFix } from '../../../../src/lib/matching';
import { encode, longCsv, modelledGelCsv, rgbwCsv } from './factories';

function refusal(run: () => unknown): ApiError {
	try {
		run();
	} catch (e) {
		if (e instanceof ApiError) return e;
		throw e;
	}
	throw new Error('expected an ApiError');
}

const stored = (t: { start: number; interval: number; values: Float64Array }) => ({ start: t.start, interval: t.interval, values: Array.from(t.values) });

describe('readTransmissionCsv', () => {
	it('reads a long file in percent, says it chose percent, and returns fractions 0..1', () => {
		const r = readTransmissionCsv(encode(modelledGelCsv('cto-full')));
		expect(r.sourceUnit).toBe('percent');
		expect(r.columnLabel).toBe('Sample sheet');
		expect(Math.max(...r.transmission.values)).toBeLessThanOrEqual(1);
		expect(Math.max(...r.transmission.values)).toBeCloseTo(0.9, 3); // the model's 0.9 peak
		expect(r.notes.join(' ')).toMatch(/Read as percent/);
	});

	it('reads fractions 0–1 as fractions when left to work it out', () => {
		const r = readTransmissionCsv(encode(modelledGelCsv('ctb-half', { percent: false })));
		expect(r.sourceUnit).toBe('fraction');
		expect(r.notes.join(' ')).toMatch(/fractions 0–1/);
	});

	it('reads a semicolon file with decimal commas', () => {
		const text = longCsv({ Flat: () => 0.5 }).replace(/,/g, ';').replace(/(\d)\.(\d)/g, '$1,$2');
		const r = readTransmissionCsv(encode(text), 'fraction');
		expect(r.transmission.values[10]).toBeCloseTo(0.5, 12);
	});

	it('refuses percentages said to be fractions, and more than 100 %, with a hint', () => {
		const asFraction = refusal(() => readTransmissionCsv(encode(modelledGelCsv('cto-full')), 'fraction'));
		expect(asFraction.status).toBe(400);
		expect(asFraction.code).toBe('transmission_invalid');
		expect(asFraction.message).toMatch(/percent/);
		const over = refusal(() => readTransmissionCsv(encode(longCsv({ Bad: () => 150 })), 'percent'));
		expect(over.message).toMatch(/cannot pass more than 100 %/);
	});

	it('refuses two filters in one file, naming the columns', () => {
		const e = refusal(() => readTransmissionCsv(encode(longCsv({ One: () => 0.5, Two: () => 0.4 }))));
		expect(e.code).toBe('one_filter_per_file');
		expect(e.message).toMatch(/One, Two/);
	});

	it('refuses a chromaticity file, a file with a bad cell (naming the row), an empty file and a range too short', () => {
		expect(refusal(() => readTransmissionCsv(encode('label,x,y\nA,0.31,0.33\n'))).code).toBe('not_spectral');
		const bad = refusal(() => readTransmissionCsv(encode(longCsv({ Sheet: () => 0.5 }).replace('\n400,0.500000', '\n400,abc'))));
		expect(bad.code).toBe('csv_invalid');
		expect(bad.message).toMatch(/row 5/);
		expect(Array.isArray(bad.details)).toBe(true);
		expect(refusal(() => readTransmissionCsv(new Uint8Array()))).toMatchObject({ status: 400, code: 'empty' });
		expect(refusal(() => readTransmissionCsv(encode(longCsv({ Short: () => 0.5 }, { start: 450, end: 650 })))).code).toBe('csv_invalid');
	});

	it('refuses a file over the upload limit with 413', () => {
		expect(refusal(() => readTransmissionCsv(new Uint8Array(2 * 1024 * 1024 + 1).fill(0x31))).status).toBe(413);
	});
});

describe('custom filter from a measured transmission', () => {
	it('regression/self-consistency: the modelled full CTO read back from CSV is within 2 % of its nominal +159 mired on 3200 K and 5600 K', () => {
		const r = readTransmissionCsv(encode(modelledGelCsv('cto-full')));
		const { gel } = gelFromRow({ id: 7, name: 'Read-back CTO', transmission: stored(r.transmission), projectId: 1 });
		expect(gel.id).toBe('custom-7');
		for (const e of gel.effects) expect(Math.abs(e.miredShift - 159) / 159).toBeLessThan(0.02);
		expect(Math.abs(gel.miredShift - 159) / 159).toBeLessThan(0.02);
		expect(Math.abs(gel.effects[0].duvShift)).toBeLessThan(1e-3);
	});

	it('definition of a stop (a factor of 2): a flat 50 % sheet loses 1 stop and moves neither mired nor Duv', () => {
		const r = readTransmissionCsv(encode(longCsv({ Half: () => 50 })));
		const { gel } = gelFromRow({ id: 1, name: 'Flat half', transmission: stored(r.transmission), projectId: null });
		expect(gel.lossStops).toBeCloseTo(1, 10);
		for (const e of gel.effects) {
			expect(Math.abs(e.miredShift)).toBeLessThan(1e-6);
			expect(Math.abs(e.duvShift)).toBeLessThan(1e-9);
		}
	});

	it('holds the end values beyond a measured 400–700 nm range, and says so', () => {
		const r = readTransmissionCsv(encode(modelledGelCsv('ctb-full', { start: 400, end: 700 })));
		const { gel, notes } = gelFromRow({ id: 2, name: 'Short range', transmission: stored(r.transmission), projectId: 3 });
		expect(gel.transmission.start).toBeLessThanOrEqual(360);
		expect(gel.transmission.values[0]).toBeCloseTo(r.transmission.values[0], 12);
		expect(notes.join(' ')).toMatch(/400–700 nm; beyond that the end values are held/);
		// Still a CTB: it cools 3200 K by roughly its nominal −131 mired (common practice), within the disputed spread.
		expect(gel.effects[0].miredShift).toBeLessThan(-110);
		expect(gel.effects[0].miredShift).toBeGreaterThan(-150);
	});
});

describe('readChannelsCsv and profiles from measured channels', () => {
	it('reads one channel per column and solves an in-gamut target exactly (Δu′v′ ≤ 1e-4)', () => {
		const r = readChannelsCsv(encode(rgbwCsv()));
		expect(r.channels.map((c) => c.label)).toEqual(['Red', 'Green', 'Blue', 'White']);
		expect(r.grid).toEqual({ start: 380, end: 780, interval: 5 });
		const profile = profileFromRow({
			key: 'test-rgbw',
			name: 'Test RGBW',
			notes: '',
			channels: r.channels.map((c, i) => ({ id: `c${i}`, label: c.label, spectrum: stored(c.spectrum), maxFlux: [0.3, 0.6, 0.12, 1][i] }))
		});
		const fix = solveLedFix(profile, { kind: 'cct', CCT: 4300, Duv: 0 });
		expect(fix.inGamut).toBe(true);
		expect(fix.distance.duv_prime).toBeLessThanOrEqual(1e-4);
	});

	it('puts channels that cover part of the range on the whole range with zero outside, and notes it', () => {
		const text = 'wavelength_nm,Wide,Narrow\n' + Array.from({ length: 81 }, (_, i) => {
			const nm = 380 + i * 5;
			return `${nm},1,${nm >= 400 && nm <= 700 ? 1 : ''}`;
		}).join('\n');
		const r = readChannelsCsv(encode(text));
		const narrow = r.channels[1].spectrum;
		expect(narrow.start).toBe(380);
		expect(narrow.values[0]).toBe(0);
		expect(narrow.values[10]).toBe(1);
		expect(r.notes.join(' ')).toMatch(/Narrow: resampled/);
	});

	it('refuses more than 16 channels and a file with no spectra', () => {
		const many: Record<string, () => number> = {};
		for (let i = 1; i <= 17; i++) many[`C${i}`] = () => 1;
		expect(refusal(() => readChannelsCsv(encode(longCsv(many))))).toMatchObject({ status: 400, code: 'too_many_channels' });
		expect(refusal(() => readChannelsCsv(encode('label,cct,duv\nA,3200,0\n'))).code).toBe('not_spectral');
	});
});

describe('overrides', () => {
	const override = (gelId: string, miredShift: number | null, lossStops: number | null): FilterOverride => ({
		id: 1,
		projectId: 1,
		gelId,
		miredShift,
		lossStops,
		note: 'swatch book',
		version: 1,
		updatedBy: null,
		updatedByName: 'Test',
		updatedAt: new Date('2026-12-01T00:00:00Z')
	});

	it('½ CTB at −68 (one of the quoted figures, common practice) replaces the built-in −65.5 and reshapes the curve', () => {
		const before = filterViews().find((f) => f.id === 'ctb-half');
		const after = filterViews([override('ctb-half', -68, null)]).find((f) => f.id === 'ctb-half');
		expect(before?.miredShift).toBeCloseTo(-65.5, 10);
		expect(before?.miredRange).toEqual({ min: -80, max: -58 });
		expect(after?.miredShift).toBe(-68);
		expect(after?.builtIn?.miredShift).toBeCloseTo(-65.5, 10);
		expect(after?.miredRange).toBeNull();
		// Mired definition M = 10⁶/T: the reshaped filter turns 3200 K into 10⁶/(312.5 − 68) K, i.e. −68 mired on 3200 K.
		expect(after?.effects[0].miredShift).toBeCloseTo(-68, 1);
		expect(after?.curve.values).not.toEqual(before?.curve.values);
	});

	it('parses typed numbers with a typographic minus or a decimal comma', () => {
		expect(parseDecimalField('−68')).toBe(-68);
		expect(parseDecimalField(' -68 ')).toBe(-68);
		expect(parseDecimalField('0,7')).toBe(0.7);
		expect(parseDecimalField('+1.5e1')).toBe(15);
		expect(parseDecimalField('')).toBeNaN();
		expect(parseDecimalField('minus 68')).toBeNaN();
	});

	it('needs a mired shift or a light loss, and keeps both in range', () => {
		expect(overrideSchema.parse({ miredShift: '−68', lossStops: '' })).toEqual({ miredShift: -68, lossStops: null, note: '' });
		expect(overrideSchema.safeParse({ miredShift: '', lossStops: '' }).success).toBe(false);
		expect(overrideSchema.safeParse({ lossStops: -0.5 }).success).toBe(false);
		expect(overrideSchema.safeParse({ miredShift: 'abc' }).success).toBe(false);
		expect(overrideSchema.safeParse({ miredShift: 900 }).success).toBe(false);
		expect(overrideSchema.safeParse({ miredShift: Number.NaN }).success).toBe(false);
	});
});

describe('keyFromName', () => {
	it('makes lower-case keys of letters, digits and dashes', () => {
		expect(keyFromName('Façade Panel #2')).toBe('facade-panel-2');
		expect(keyFromName('  ')).toBe('fixture');
		expect(keyFromName('照明')).toBe('fixture');
	});
});
