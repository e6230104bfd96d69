/**
 * The typed-entry form: what a gaffer reads off a colour meter's display. Numbers arrive as text so
 * a decimal comma (a phone keyboard in many countries) is accepted; `toRawReading` turns a valid
 * form into a stored reading's raw input, with the same range rules as the API.
 */
import { z } from 'zod';
import { rawReadingSchema, type RawReadingInput } from './readings';

export const TYPED_MODES = ['xy', 'uv_prime', 'cct_duv'] as const;
export type TypedMode = (typeof TYPED_MODES)[number];

const num = z.string().trim().max(32).default('');

export const typedReadingFormSchema = z.object({
	mode: z.enum(TYPED_MODES).default('xy'),
	x: num,
	y: num,
	u_prime: num,
	v_prime: num,
	cct_k: num,
	duv: num,
	lux: num,
	label: z.string().trim().min(1, 'Give the reading a label, e.g. "Key, full, 2 m".').max(200),
	lightId: z.string().trim().default(''),
	takenAt: z.string().trim().max(40).default('')
});
export type TypedReadingForm = z.infer<typeof typedReadingFormSchema>;

/** "0,3127" and "0.3127" both read as 0.3127; an empty field is undefined; junk is NaN. */
export function readNumber(text: string): number | undefined {
	const t = text.trim().replace(/\s/g, '');
	if (t === '') return undefined;
	const normalised = /^[+-]?\d*,\d+$/.test(t) ? t.replace(',', '.') : t;
	return /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(normalised) ? Number(normalised) : Number.NaN;
}

const FIELDS: Record<TypedMode, [keyof TypedReadingForm, keyof TypedReadingForm]> = {
	xy: ['x', 'y'],
	uv_prime: ['u_prime', 'v_prime'],
	cct_duv: ['cct_k', 'duv']
};
const NAMES: Record<string, string> = { x: 'x', y: 'y', u_prime: "u'", v_prime: "v'", cct_k: 'CCT', duv: 'Duv', lux: 'Lux' };

/** Either the raw reading, or field errors keyed like the form. */
export function toRawReading(form: TypedReadingForm): { raw: RawReadingInput } | { errors: Partial<Record<keyof TypedReadingForm, string>> } {
	const errors: Partial<Record<keyof TypedReadingForm, string>> = {};
	const values: Record<string, number | undefined> = {};
	for (const f of [...FIELDS[form.mode], 'lux'] as const) {
		const v = readNumber(form[f] as string);
		if (v === undefined && f !== 'lux') errors[f] = `Type the ${NAMES[f]} value.`;
		else if (v !== undefined && Number.isNaN(v)) errors[f] = `${NAMES[f]} must be a number, e.g. 0.3127.`;
		values[f] = v;
	}
	if (Object.keys(errors).length) return { errors };
	const kind = form.mode === 'xy' ? 'chromaticity_xy' : form.mode === 'uv_prime' ? 'chromaticity_uv_prime' : 'cct_duv';
	const candidate = { kind, ...values };
	const parsed = rawReadingSchema.safeParse(candidate);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const key = String(issue.path[0] ?? FIELDS[form.mode][1]) as keyof TypedReadingForm;
			errors[key] ??= issue.message;
		}
		return { errors };
	}
	return { raw: parsed.data };
}
