import { describe, expect, it } from 'vitest';
import { columnMappingSchema, guessMapping } from '../../../src/lib/import';
import { bandHeaderNm, mappingFormat, normaliseHeader } from '../../../src/lib/import/mapping';

describe('columnMappingSchema', () => {
	it('accepts a complete mapping and fills in units', () => {
		const m = columnMappingSchema.parse({ columns: [{ column: 'a', meaning: 'x' }, { column: 2, meaning: 'y' }] });
		expect(m.units).toEqual({ wavelength: 'nm', spectral: 'relative' });
	});

	it('accepts W/m²/nm written with a plain 2', () => {
		const m = columnMappingSchema.parse({
			columns: [{ column: 'w', meaning: 'wavelength' }, { column: 'a', meaning: 'spectrum' }],
			units: { spectral: 'W/m2/nm' }
		});
		expect(m.units.spectral).toBe('W/m²/nm');
	});

	it.each([
		[[{ column: 'a', meaning: 'x' }], /x is mapped but y is not/],
		[[{ column: 'a', meaning: 'x' }, { column: 'b', meaning: 'x' }, { column: 'c', meaning: 'y' }], /x is given to more than one column/],
		[[{ column: 'a', meaning: 'x' }, { column: 'b', meaning: 'y' }, { column: 'c', meaning: 'cct' }, { column: 'd', meaning: 'duv' }], /map one kind of reading only/],
		[[{ column: 'a', meaning: { band_nm: 400 } }, { column: 'b', meaning: { band_nm: 405 } }], /at least 3 band columns/],
		[[{ column: 'a', meaning: { band_nm: 400 } }, { column: 'b', meaning: { band_nm: 400 } }, { column: 'c', meaning: { band_nm: 405 } }], /400 nm appears in two columns/],
		[[{ column: 'a', meaning: 'spectrum' }], /spectrum columns need a wavelength column/],
		[[{ column: 'a', meaning: 'wavelength' }, { column: 'b', meaning: 'spectrum' }, { column: 'c', meaning: 'label' }], /each reading is a column/],
		[[{ column: 'a', meaning: 'label' }], /no column holds a reading/]
	])('refuses an unusable mapping (%#)', (columns, message) => {
		const r = columnMappingSchema.safeParse({ columns });
		expect(r.success).toBe(false);
		expect(r.error!.issues[0].message).toMatch(message);
	});

	it('refuses unknown meanings, wavelength units and band wavelengths out of range', () => {
		expect(columnMappingSchema.safeParse({ columns: [{ column: 'a', meaning: 'colour' }] }).success).toBe(false);
		expect(columnMappingSchema.safeParse({ columns: [{ column: 'a', meaning: { band_nm: 50 } }] }).success).toBe(false);
		expect(
			columnMappingSchema.safeParse({ columns: [{ column: 'a', meaning: 'x' }, { column: 'b', meaning: 'y' }], units: { wavelength: 'um' } }).success
		).toBe(false);
		expect(columnMappingSchema.safeParse({ columns: [] }).success).toBe(false);
	});
});

describe('guessMapping', () => {
	it('names columns by header when unique, by position otherwise', () => {
		const g = guessMapping(['label', 'x', 'y', 'notes', 'notes']);
		expect(g.format).toBe('chromaticity_xy');
		expect(g.mapping.columns).toEqual([
			{ column: 'label', meaning: 'label' },
			{ column: 'x', meaning: 'x' },
			{ column: 'y', meaning: 'y' },
			{ column: 3, meaning: 'notes' }
		]);
		expect(g.unused).toEqual(['notes']);
	});

	it('names a very long header by position (a mapping names columns in at most 200 characters)', () => {
		const g = guessMapping(['wavelength', 'r'.repeat(250), 'short']);
		expect(g.format).toBe('long_spectral');
		expect(g.mapping.columns).toEqual([
			{ column: 'wavelength', meaning: 'wavelength' },
			{ column: 1, meaning: 'spectrum' },
			{ column: 'short', meaning: 'spectrum' }
		]);
		expect(columnMappingSchema.safeParse(g.mapping).success).toBe(true);
		expect(guessMapping([' '.repeat(3), 'x', 'y']).mapping.columns).toHaveLength(2);
	});

	it('reads band headers with decimal commas only when allowed', () => {
		expect(bandHeaderNm('380,5', true)).toBe(380.5);
		expect(bandHeaderNm('380,5', false)).toBeNull();
		expect(bandHeaderNm('380.5 nm', false)).toBe(380.5);
		expect(bandHeaderNm('nm', false)).toBeNull();
	});

	it('does not take numbers outside 200–1100 nm as wavelengths', () => {
		const g = guessMapping(['1', '2', '3', 'x', 'y']);
		expect(g.format).toBe('chromaticity_xy');
		expect(g.unused).toEqual(['1', '2', '3']);
	});

	it('normalises headers: trimmed, lower case, spaces collapsed', () => {
		expect(normaliseHeader('  Taken   At ')).toBe('taken at');
	});

	it('mappingFormat names each layout', () => {
		expect(mappingFormat(['X', 'Y', 'Z'])).toEqual({ format: 'tristimulus' });
		expect(mappingFormat(['u_prime', 'v_prime', 'lux'])).toEqual({ format: 'chromaticity_uv_prime' });
		expect(mappingFormat(['cct', 'duv'])).toEqual({ format: 'cct_duv' });
		expect(mappingFormat(['wavelength', 'spectrum', 'spectrum'])).toEqual({ format: 'long_spectral' });
		expect(mappingFormat([{ band_nm: 400 }, { band_nm: 410 }, { band_nm: 420 }, 'label'])).toEqual({ format: 'wide_spectral' });
	});
});
