/**
 * What a reading may look like when it arrives by hand or as JSON. Shared by the typed-entry form,
 * the JSON API and its tests. Messages are sentences a gaffer can act on.
 */
import { z } from 'zod';

const lux = z.number().finite().min(0, 'Lux cannot be negative.').max(1e6, 'Lux above 1,000,000 is not plausible.').nullish();

export const spectrumSchema = z.object({
	start: z.number().finite().min(200).max(1100),
	interval: z.number().finite().positive().max(10, 'The step between wavelengths is at most 10 nm.'),
	values: z.array(z.number().finite('Spectral values must be numbers.')).min(2).max(10_000),
	scale: z.enum(['relative', 'absolute']).default('relative')
});

export const rawReadingSchema = z.discriminatedUnion('kind', [
	z.object({ kind: z.literal('spectral'), spectrum: spectrumSchema, lux }),
	z
		.object({
			kind: z.literal('chromaticity_xy'),
			x: z.number().gt(0, 'x must be above 0.').lt(1, 'x must be below 1.'),
			y: z.number().gt(0, 'y must be above 0.').lt(1, 'y must be below 1.'),
			lux
		})
		.refine((v) => v.x + v.y < 1, { message: 'x + y must be below 1.', path: ['y'] }),
	z.object({
		kind: z.literal('chromaticity_uv_prime'),
		u_prime: z.number().gt(0, "u' must be above 0.").lt(0.7, "u' must be below 0.7."),
		v_prime: z.number().gt(0, "v' must be above 0.").lt(0.7, "v' must be below 0.7."),
		lux
	}),
	z.object({
		kind: z.literal('cct_duv'),
		cct_k: z.number().min(1000, 'CCT below 1000 K is outside what Chromaslate computes.').max(25000, 'CCT above 25000 K is outside what Chromaslate computes.'),
		duv: z.number().min(-0.05, 'Duv below −0.05 is too far from the locus for a CCT.').max(0.05, 'Duv above 0.05 is too far from the locus for a CCT.'),
		lux
	}),
	z
		.object({
			kind: z.literal('tristimulus'),
			X: z.number().finite().min(0, 'X cannot be negative.'),
			Y: z.number().finite().min(0, 'Y cannot be negative.'),
			Z: z.number().finite().min(0, 'Z cannot be negative.'),
			lux
		})
		.refine((v) => v.X + v.Y + v.Z > 0, { message: 'X, Y and Z cannot all be zero.', path: ['Y'] })
]);
export type RawReadingInput = z.infer<typeof rawReadingSchema>;

const id = z.number().int().positive();
const isoDate = z
	.string()
	.trim()
	.refine((s) => !Number.isNaN(Date.parse(s)), 'Give the time as an ISO 8601 date and time, e.g. 2026-12-01T21:30.');

export const createReadingSchema = z.object({
	label: z.string().trim().min(1, 'Give the reading a label.').max(200),
	raw: rawReadingSchema,
	setupId: id.nullish(),
	lightId: id.nullish(),
	takenAt: isoDate.nullish(),
	meter: z.string().trim().max(120).nullish(),
	notes: z.string().trim().max(5000).nullish()
});
export type CreateReadingInput = z.infer<typeof createReadingSchema>;

export const patchReadingSchema = z
	.object({
		version: z.number().int().positive(),
		label: z.string().trim().min(1).max(200).optional(),
		setupId: id.nullable().optional(),
		lightId: id.nullable().optional(),
		takenAt: isoDate.nullable().optional(),
		notes: z.string().trim().max(5000).nullable().optional()
	})
	.strict();

const intParam = z.coerce.number().int().positive();
export const listReadingsQuerySchema = z.object({
	setup: intParam.optional(),
	light: intParam.optional(),
	from: isoDate.optional(),
	to: isoDate.optional(),
	kind: z.enum(['spectral', 'chromaticity_xy', 'chromaticity_uv_prime', 'cct_duv', 'tristimulus']).optional(),
	sort: z.enum(['taken_at', 'created_at', 'label', 'cct_k', 'duv', 'cri_ra', 'id']).default('created_at'),
	order: z.enum(['asc', 'desc']).default('desc'),
	limit: z.coerce.number().int().min(1).max(500).default(50),
	offset: z.coerce.number().int().min(0).default(0)
});
