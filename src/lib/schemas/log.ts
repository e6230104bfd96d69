/**
 * What the lighting log accepts: shoot days, setups, target whites, lights, circuits, comments and
 * project backups. One set of schemas serves the pages (form fields arrive as strings) and the JSON
 * API (numbers and arrays): the small field helpers below read both. Messages are sentences a
 * gaffer on a dark set can act on.
 */
import { z } from 'zod';
import { SUPPLY_PRESETS } from '../settools/power';

export const SETUP_STATUSES = ['planning', 'lit', 'shot'] as const;
export type SetupStatus = (typeof SETUP_STATUSES)[number];
export const SETUP_STATUS_LABELS: Record<SetupStatus, string> = { planning: 'Planning', lit: 'Lit', shot: 'Shot' };

export const LIGHT_ROLES = ['key', 'fill', 'back', 'practical', 'ambient', 'background', 'effect'] as const;
export type LightRole = (typeof LIGHT_ROLES)[number];

/** Kinds of source, with the words the log shows for them. */
export const LIGHT_KINDS = {
	tungsten: 'Tungsten',
	hmi: 'HMI',
	fluorescent: 'Fluorescent',
	sodium: 'Sodium',
	'led-bicolour': 'LED, bi-colour',
	'led-rgbw': 'LED, RGBW',
	'led-rgb': 'LED, RGB',
	'led-white': 'LED, fixed white',
	daylight: 'Daylight',
	practical: 'Practical',
	other: 'Other'
} as const;
export type LightKind = keyof typeof LIGHT_KINDS;
export const LIGHT_KIND_IDS = Object.keys(LIGHT_KINDS) as LightKind[];

export const COMMENT_SUBJECTS = ['setup', 'light', 'reading'] as const;
export type CommentSubject = (typeof COMMENT_SUBJECTS)[number];

/** CIE standard illuminants a target white can name (the colour core's table). */
export const TARGET_ILLUMINANTS = ['A', 'C', 'D50', 'D55', 'D65', 'D75', 'F1', 'F2', 'F3', 'F4', 'F5', 'F6', 'F7', 'F8', 'F9', 'F10', 'F11', 'F12'] as const;

// ——— Field helpers: strings from forms, numbers from JSON ———

/** Blank text is "not given". */
const blank = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

/** A number from JSON, or from a form field (spaces ignored, a decimal comma accepted). */
function toNumber(v: unknown): unknown {
	if (typeof v !== 'string') return v;
	const s = v.trim().replace(/\s+/g, '').replace(',', '.');
	if (s === '') return undefined;
	return /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(s) ? Number(s) : v;
}

/** A number field; `message` is used for anything that is not a number. */
export const num = (message: string) => z.preprocess(toNumber, z.number({ error: message }).finite(message));
const optionalNum = (message: string) => z.preprocess(toNumber, z.number({ error: message }).finite(message).nullish());

const id = (what: string) => z.preprocess(toNumber, z.number({ error: `Pick a ${what}.` }).int(`Pick a ${what}.`).positive(`Pick a ${what}.`));
const optionalId = (what: string) =>
	z.preprocess((v) => (v === '' || v === 'none' ? null : toNumber(v)), z.number({ error: `Pick a ${what}.` }).int().positive().nullish());

export const versionField = z.preprocess(toNumber, z.number({ error: 'The form is missing its version: reload the page.' }).int().positive());

const text = (max: number, what: string) => z.string().trim().max(max, `Keep ${what} under ${max} characters.`);
const optionalText = (max: number, what: string) => z.preprocess((v) => (v === null ? undefined : v), text(max, what).optional().default(''));

const isoDate = z
	.string({ error: 'Give the date as YYYY-MM-DD.' })
	.trim()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the date as YYYY-MM-DD.')
	.refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'That date does not exist.');

// ——— Shoot days ———

export const shootDayFields = {
	date: isoDate,
	label: optionalText(120, 'the label'),
	locationName: optionalText(200, 'the location name'),
	mainsVoltage: num('Give the mains voltage in volts (e.g. 230 or 120).').pipe(
		z.number().int('Give the voltage as a whole number of volts.').min(90, 'Mains below 90 V is not a supply we plan for.').max(480, 'Mains above 480 V is not a supply we plan for.')
	),
	mainsFrequency: z.preprocess(toNumber, z.union([z.literal(50), z.literal(60)], { error: 'Mains frequency is 50 Hz or 60 Hz.' })),
	notes: optionalText(5000, 'the notes')
};
export const shootDaySchema = z.object(shootDayFields);
export type ShootDayInput = z.infer<typeof shootDaySchema>;
export const shootDayPatchSchema = patchOf(z.object({ version: versionField, ...partial(shootDayFields) }).strict());

// ——— Setups ———

export const setupFields = {
	name: z.string({ error: 'Give the setup a name.' }).trim().min(1, 'Give the setup a name.').max(160, 'Keep the name under 160 characters.'),
	notes: optionalText(5000, 'the notes'),
	status: z.enum(SETUP_STATUSES, { error: 'The status is planning, lit or shot.' }).default('planning')
};
export const setupSchema = z.object({ ...setupFields, shootDayId: id('shoot day') });
export type SetupInput = z.infer<typeof setupSchema>;
export const setupFormSchema = z.object(setupFields);
export const setupPatchSchema = patchOf(z.object({ version: versionField, ...partial(setupFields), shootDayId: id('shoot day').optional() }).strict());

// ——— Target white ———

/** A target white as stored on a setup. */
export const storedTargetSchema = z.discriminatedUnion('kind', [
	z.object({ kind: z.literal('reading'), readingId: id('reading') }),
	z.object({
		kind: z.literal('cct_duv'),
		cct_k: num('Give the CCT in kelvin.').pipe(z.number().min(1000, 'A target below 1000 K is outside what Chromaslate computes.').max(25000, 'A target above 25000 K is outside what Chromaslate computes.')),
		duv: z.preprocess((v) => (v === undefined || v === '' ? 0 : toNumber(v)), z.number({ error: 'Give Duv as a number such as 0.002.' }).min(-0.05, 'Duv below −0.05 is too far from the locus.').max(0.05, 'Duv above 0.05 is too far from the locus.'))
	}),
	z
		.object({
			kind: z.literal('xy'),
			x: num('Give x as a number between 0 and 1.').pipe(z.number().gt(0, 'x must be above 0.').lt(1, 'x must be below 1.')),
			y: num('Give y as a number between 0 and 1.').pipe(z.number().gt(0, 'y must be above 0.').lt(1, 'y must be below 1.'))
		})
		.refine((v) => v.x + v.y < 1, { message: 'x + y must be below 1.', path: ['y'] }),
	z.object({ kind: z.literal('illuminant'), name: z.enum(TARGET_ILLUMINANTS, { error: 'Pick a CIE illuminant.' }) })
]);
export type StoredTarget = z.infer<typeof storedTargetSchema>;

const toleranceField = z.preprocess(
	(v) => (v === undefined || v === '' || v === null ? undefined : toNumber(v)),
	z.number({ error: 'Give the tolerance as a Δu′v′ such as 0.002.' }).gt(0, 'The tolerance must be above 0.').max(0.1, 'A tolerance above 0.1 Δu′v′ means nothing matches anything.').optional()
);

export const setTargetSchema = z.object({ target: storedTargetSchema, tolerance: toleranceField, version: versionField });

/** The target form: one kind picked, its fields beside it. */
export const targetFormSchema = z
	.object({
		kind: z.enum(['reading', 'cct_duv', 'xy', 'illuminant'], { error: 'Pick how the target is given.' }),
		readingId: z.string().optional(),
		cct_k: z.string().optional(),
		duv: z.string().optional(),
		x: z.string().optional(),
		y: z.string().optional(),
		name: z.string().optional(),
		tolerance: z.string().optional(),
		version: z.string().optional()
	})
	.transform((f, ctx) => {
		const target = storedTargetSchema.safeParse(
			f.kind === 'reading' ? { kind: f.kind, readingId: f.readingId } : f.kind === 'cct_duv' ? { kind: f.kind, cct_k: f.cct_k, duv: f.duv } : f.kind === 'xy' ? { kind: f.kind, x: f.x, y: f.y } : { kind: f.kind, name: f.name }
		);
		const rest = z.object({ tolerance: toleranceField, version: versionField }).safeParse({ tolerance: f.tolerance, version: f.version });
		for (const issue of [...(target.success ? [] : target.error.issues), ...(rest.success ? [] : rest.error.issues)]) {
			ctx.addIssue({ code: 'custom', message: issue.message, path: issue.path.filter((p) => p !== 'target') as (string | number)[] });
		}
		if (!target.success || !rest.success) return z.NEVER;
		return { target: target.data, tolerance: rest.data.tolerance, version: rest.data.version };
	});

// ——— Lights ———

/** LED settings as logged: CCT and green/magenta where the fixture has them, else channel levels. */
export const ledSettingsSchema = z
	.object({
		cct_k: z.number().min(1000).max(25000).nullish(),
		/** Green/magenta offset as the fixture shows it, −100 (full minus green) to +100 (full plus green). */
		gm: z.number().min(-100).max(100).nullish(),
		/** Output level, % */
		intensity: z.number().min(0).max(100).nullish(),
		/** Raw channel levels in %, e.g. { R: 40, G: 20, B: 10, W: 80 } */
		channels: z.record(z.string().trim().min(1).max(12), z.number().min(0, 'Channel levels are 0 to 100 %.').max(100, 'Channel levels are 0 to 100 %.')).nullish(),
		/** Our own proposal or preset this came from, free text */
		note: z.string().trim().max(200).nullish()
	})
	.strict();
export type LedSettings = z.infer<typeof ledSettingsSchema>;

/** "R 40, G 20, B 10, W 80" or "R=40 G=20" → { R: 40, … }; throws a sentence for anything else. */
export function parseChannelLevels(input: string): Record<string, number> {
	const out: Record<string, number> = {};
	const s = input.trim();
	if (!s) return out;
	for (const part of s.split(/[,;]+|\s+(?=[A-Za-z])/)) {
		const p = part.trim();
		if (!p) continue;
		const m = /^([A-Za-z][A-Za-z0-9]{0,11})\s*[=:]?\s*([0-9]+(?:[.,][0-9]+)?)\s*%?$/.exec(p);
		if (!m) throw new Error(`Write channel levels as “R 40, G 20, W 80” (could not read “${p}”).`);
		const v = Number(m[2].replace(',', '.'));
		if (v > 100) throw new Error(`Channel ${m[1]} is above 100 %.`);
		out[m[1]] = v;
	}
	return out;
}

export function formatChannelLevels(ch: Record<string, number> | null | undefined): string {
	return ch ? Object.entries(ch).map(([k, v]) => `${k} ${v}`).join(', ') : '';
}

/** A gel stack as JSON (array of names or filter ids) or typed ("½ CTO + ¼ plus green", "cto-half, plusgreen-quarter"). */
export const gelStackField = z.preprocess(
	(v) => {
		if (v === null || v === undefined) return [];
		if (typeof v === 'string') return v.split(/\s*[+,;]\s*/).map((s) => s.trim()).filter(Boolean);
		return v;
	},
	z.array(z.string().trim().min(1).max(60, 'Keep each gel under 60 characters.')).max(8, 'A stack of more than 8 gels is not a plan, it is a wall.')
);

export const lightFields = {
	label: z.string({ error: 'Give the light a label.' }).trim().min(1, 'Give the light a label.').max(160, 'Keep the label under 160 characters.'),
	role: z.enum(LIGHT_ROLES, { error: 'Pick a role: key, fill, back, practical, ambient, background or effect.' }).default('key'),
	kind: z.enum(LIGHT_KIND_IDS as [LightKind, ...LightKind[]], { error: 'Pick what kind of source it is.' }).default('other'),
	fixtureProfile: z.preprocess((v) => (v === '' ? null : v), z.string().trim().max(80, 'Keep the fixture profile under 80 characters.').nullish()),
	gelStack: gelStackField.optional().default([]),
	ledSettings: ledSettingsSchema.nullish(),
	dimmerPercent: optionalNum('Give the dimmer level in %, 0 to 100.').pipe(z.number().min(0, 'The dimmer is 0 to 100 %.').max(100, 'The dimmer is 0 to 100 %.').nullish()),
	powerW: optionalNum('Give the draw in watts.').pipe(z.number().int('Give the draw in whole watts.').min(0, 'A light draws 0 W or more.').max(100_000, 'Above 100 kW is not one light.').nullish()),
	circuitId: optionalId('circuit'),
	notes: optionalText(5000, 'the notes')
};
export const lightSchema = z.object({ ...lightFields, setupId: id('setup') });
export type LightInput = z.infer<typeof lightSchema>;
export const lightPatchSchema = patchOf(z.object({ version: versionField, ...partial(lightFields) }).strict());

/** The light form: LED settings come as separate fields (CCT, green/magenta, level, channels). */
export const lightFormSchema = z
	.object({
		...lightFields,
		ledSettings: z.undefined().optional(),
		ledCct: optionalNum('Give the LED CCT in kelvin.').pipe(z.number().min(1000, 'An LED CCT below 1000 K is not a setting.').max(25000, 'An LED CCT above 25000 K is not a setting.').nullish()),
		ledGm: optionalNum('Give green/magenta as a number from −100 to +100.').pipe(z.number().min(-100, 'Green/magenta is −100 to +100.').max(100, 'Green/magenta is −100 to +100.').nullish()),
		ledIntensity: optionalNum('Give the LED level in %.').pipe(z.number().min(0, 'The LED level is 0 to 100 %.').max(100, 'The LED level is 0 to 100 %.').nullish()),
		ledChannels: z.string().optional().default('')
	})
	.transform((f, ctx) => {
		let channels: Record<string, number> = {};
		try {
			channels = parseChannelLevels(f.ledChannels);
		} catch (e) {
			ctx.addIssue({ code: 'custom', path: ['ledChannels'], message: (e as Error).message });
			return z.NEVER;
		}
		const hasLed = f.ledCct != null || f.ledGm != null || f.ledIntensity != null || Object.keys(channels).length > 0;
		const { ledCct, ledGm, ledIntensity, ledChannels: _c, ...rest } = f;
		void _c;
		// A blank field on the form clears the stored value (null), it does not leave it as it was.
		return {
			...rest,
			fixtureProfile: rest.fixtureProfile ?? null,
			dimmerPercent: rest.dimmerPercent ?? null,
			powerW: rest.powerW ?? null,
			circuitId: rest.circuitId ?? null,
			ledSettings: hasLed ? { cct_k: ledCct ?? null, gm: ledGm ?? null, intensity: ledIntensity ?? null, channels: Object.keys(channels).length ? channels : null } : null
		};
	});
export type LightFormInput = z.infer<typeof lightFormSchema>;

// ——— Circuits (the power plan) ———

export const circuitFields = {
	label: z.string({ error: 'Give the circuit a name.' }).trim().min(1, 'Give the circuit a name.').max(120, 'Keep the name under 120 characters.'),
	preset: z.preprocess((v) => (v === '' ? null : v), z.enum(['na-15', 'na-20', 'uk-13', 'eu-16', 'au-10', 'custom']).nullish()),
	volts: num('Give the voltage in volts.').pipe(z.number().int('Give the voltage as whole volts.').min(12, 'Below 12 V is not a lighting circuit.').max(480, 'Above 480 V: plan it with the electrician, not here.')),
	amps: num('Give the breaker rating in amps.').pipe(z.number().gt(0, 'The breaker rating must be above 0 A.').max(400, 'Above 400 A: plan it with the electrician, not here.')),
	derating: z.preprocess(
		(v) => {
			const n = toNumber(v);
			// A form may give the continuous share as a percentage (80) rather than a fraction (0.8).
			return typeof n === 'number' && n > 1 ? n / 100 : n === undefined ? 0.8 : n;
		},
		z.number({ error: 'Give the continuous share, e.g. 80 %.' }).gt(0, 'The continuous share must be above 0 %.').max(1, 'The continuous share is at most 100 %.')
	)
};
export const circuitSchema = z.object(circuitFields);
export type CircuitInput = z.infer<typeof circuitSchema>;

// ——— Comments ———

export const commentSchema = z.object({
	subjectType: z.enum(COMMENT_SUBJECTS, { error: 'A comment is on a setup, a light or a reading.' }),
	subjectId: id('subject'),
	body: z.string({ error: 'Write something first.' }).trim().min(1, 'Write something first.').max(5000, 'Keep a comment under 5000 characters.')
});
export type CommentInput = z.infer<typeof commentSchema>;
export const commentPatchSchema = z.object({ version: versionField, body: commentSchema.shape.body }).strict();

// ——— Readings typed on the light page ———

/** A reading typed by hand: CCT + Duv or xy, with lux and time if known. */
export const typedReadingFormSchema = z
	.object({
		label: z.string().trim().max(200).optional().default(''),
		entry: z.enum(['cct_duv', 'chromaticity_xy'], { error: 'Pick CCT + Duv or xy.' }),
		cct_k: z.string().optional(),
		duv: z.string().optional(),
		x: z.string().optional(),
		y: z.string().optional(),
		lux: z.string().optional(),
		meter: z.string().trim().max(120).optional().default(''),
		takenAt: z.string().trim().optional().default('')
	})
	.transform((f, ctx) => {
		const lux = toNumber(f.lux ?? '');
		if (lux !== undefined && (typeof lux !== 'number' || lux < 0 || lux > 1e6)) ctx.addIssue({ code: 'custom', path: ['lux'], message: 'Give lux as a number, 0 or more.' });
		let takenAt: string | null = null;
		if (f.takenAt) {
			const t = Date.parse(f.takenAt);
			if (Number.isNaN(t)) ctx.addIssue({ code: 'custom', path: ['takenAt'], message: 'Give the time as e.g. 2026-12-01T21:30.' });
			else takenAt = new Date(t).toISOString();
		}
		const n = (v: string | undefined, path: string, message: string, lo: number, hi: number) => {
			const x = toNumber(v ?? '');
			if (typeof x !== 'number' || !(x >= lo && x <= hi)) {
				ctx.addIssue({ code: 'custom', path: [path], message });
				return NaN;
			}
			return x;
		};
		let raw: { kind: 'cct_duv'; cct_k: number; duv: number } | { kind: 'chromaticity_xy'; x: number; y: number };
		if (f.entry === 'cct_duv') {
			const duvText = f.duv?.trim() ? f.duv : '0';
			raw = { kind: 'cct_duv', cct_k: n(f.cct_k, 'cct_k', 'Give the CCT in kelvin, 1000 to 25000.', 1000, 25000), duv: n(duvText, 'duv', 'Give Duv between −0.05 and +0.05.', -0.05, 0.05) };
		} else {
			raw = { kind: 'chromaticity_xy', x: n(f.x, 'x', 'Give x between 0 and 1.', 0.0001, 0.9999), y: n(f.y, 'y', 'Give y between 0 and 1.', 0.0001, 0.9999) };
			if (raw.x + raw.y >= 1) ctx.addIssue({ code: 'custom', path: ['y'], message: 'x + y must be below 1.' });
		}
		return { label: f.label, raw: { ...raw, lux: typeof lux === 'number' ? lux : null }, meter: f.meter || null, takenAt };
	});

// ——— Lists ———

export const pageQuery = {
	page: z.coerce.number().int().min(1).catch(1).default(1),
	order: z.enum(['asc', 'desc']).catch('asc').default('asc')
};

function partial<T extends Record<string, z.ZodType>>(fields: T): { [K in keyof T]: z.ZodOptional<T[K]> } {
	return Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, v.optional()])) as { [K in keyof T]: z.ZodOptional<T[K]> };
}

/**
 * A patch: every field optional, and only the fields actually sent come out (a default never
 * overwrites a stored value the caller did not mention).
 */
function patchOf<T extends z.ZodObject>(inner: T) {
	return z.record(z.string(), z.unknown()).transform((raw, ctx): Partial<z.infer<T>> => {
		const r = inner.safeParse(raw);
		if (!r.success) {
			for (const issue of r.error.issues) ctx.addIssue({ ...issue, code: 'custom', message: issue.message, path: issue.path as (string | number)[] } as never);
			return z.NEVER;
		}
		const out: Record<string, unknown> = {};
		for (const k of Object.keys(raw)) if (k in (r.data as object)) out[k] = (r.data as Record<string, unknown>)[k];
		return out as Partial<z.infer<T>>;
	});
}

// ——— JSON API queries ———

const queryId = z.coerce.number().int().positive();
const limit = z.coerce.number().int().min(1).max(500).default(100);
const offset = z.coerce.number().int().min(0).default(0);

export const listDaysQuerySchema = z.object({
	q: z.string().trim().max(200).optional(),
	sort: z.enum(['date', 'label', 'location', 'setups']).default('date'),
	order: z.enum(['asc', 'desc']).default('asc'),
	limit,
	offset
});
export const listSetupsQuerySchema = z.object({ day: queryId.optional() });
export const listLightsQuerySchema = z.object({ setup: queryId.optional(), kind: z.enum(LIGHT_KIND_IDS as [LightKind, ...LightKind[]]).optional() });
export const listCommentsQuerySchema = z
	.object({ subject_type: z.enum(COMMENT_SUBJECTS).optional(), subject_id: queryId.optional(), limit, offset })
	.refine((q) => (q.subject_id === undefined) || q.subject_type !== undefined, { message: 'Give subject_type with subject_id.', path: ['subject_type'] });

export const lockBodySchema = z.object({ locked: z.boolean({ error: 'Send "locked": true or false.' }), version: versionField }).strict();
export const targetBodySchema = z.object({ target: storedTargetSchema.nullable(), tolerance: toleranceField, version: versionField }).strict();

export const fixBodySchema = z
	.object({
		kind: z.enum(['gel', 'led'], { error: 'A fix is a gel fix or an LED fix.' }),
		fix: z.record(z.string(), z.unknown()),
		predicted: z.record(z.string(), z.unknown()).nullish(),
		note: z.string().trim().max(2000).nullish()
	})
	.strict();

/** The circuit form: a preset fills whatever was left blank (volts, amps, continuous share). */
export const circuitFormSchema = z.preprocess((raw) => {
	if (!raw || typeof raw !== 'object') return raw;
	const f = { ...(raw as Record<string, unknown>) };
	const preset = SUPPLY_PRESETS.find((p) => p.id === f.preset);
	const empty = (v: unknown) => v === undefined || v === null || (typeof v === 'string' && v.trim() === '');
	if (preset) {
		if (empty(f.volts)) f.volts = preset.volts;
		if (empty(f.amps)) f.amps = preset.breakerAmps;
		if (empty(f.derating)) f.derating = preset.continuousFraction;
	}
	if (empty(f.preset)) f.preset = null;
	return f;
}, circuitSchema);

// ——— Page queries (bad values fall back to defaults: a list never fails on its URL) ———

export const daysPageQuerySchema = z.object({
	q: z.string().trim().max(200).catch('').default(''),
	sort: z.enum(['date', 'label', 'location', 'setups']).catch('date').default('date'),
	...pageQuery
});
export const setupPageQuerySchema = z.object({
	sort: z.enum(['position', 'label', 'role', 'kind', 'power', 'distance', 'cct']).catch('position').default('position'),
	order: z.enum(['asc', 'desc']).catch('asc').default('asc'),
	kind: z.string().max(40).catch('').default(''),
	role: z.string().max(40).catch('').default('')
});
export const reviewQuerySchema = z.object({
	day: z.coerce.number().int().positive().optional().catch(undefined),
	setup: z.coerce.number().int().positive().optional().catch(undefined),
	kind: z.string().max(40).catch('').default(''),
	page: pageQuery.page
});
export const activityQuerySchema = z.object({
	type: z.enum(['project', 'shoot_day', 'setup', 'light', 'circuit', 'reading', 'comment', 'fix', 'photo']).optional().catch(undefined),
	user: z.coerce.number().int().positive().optional().catch(undefined),
	q: z.string().trim().max(200).catch('').default(''),
	order: z.enum(['asc', 'desc']).catch('desc').default('desc'),
	page: pageQuery.page
});

/** Sending the lighting log to a member: who, and a note for them. */
export const shareLogFormSchema = z.object({
	userId: id('person on the project'),
	note: optionalText(1000, 'the note')
});

export const idFormSchema = (key: string) => z.object({ [key]: id(key.replace(/Id$/, '')) });
export const versionFormSchema = z.object({ version: versionField });
