/**
 * The lighting log as CSV: one row per light per setup, in shooting order. `LOG_CSV_COLUMNS` is the
 * documented column list (name, what it holds, unit); the header row uses the names exactly.
 *
 * The reading columns describe the light's last reading (by time taken, else time entered); the
 * distance is CIE 1976 Δu'v' from that reading to the setup's target white. Text cells that a
 * spreadsheet would run as a formula (starting with = + - @ or a tab) get a leading apostrophe.
 */
import Papa from 'papaparse';
import type { ProjectAccess } from '$lib/server/authz';
import { reviewLog, type ReviewLight, type ReviewSetup } from './review';

export interface CsvColumn {
	name: string;
	description: string;
	type: 'text' | 'number';
	value: (s: ReviewSetup, l: ReviewLight) => string | number | null;
}

const fixed = (v: number | null | undefined, digits: number) => (v === null || v === undefined || !Number.isFinite(v) ? null : Number(v.toFixed(digits)));
const iso = (d: Date | string | null | undefined) => (d ? (d instanceof Date ? d.toISOString() : d) : null);

function targetText(s: ReviewSetup): string {
	if (s.target) return s.target.label;
	return s.targetMissing ? 'target reading removed' : '';
}

/** The log's CSV columns, in order. */
export const LOG_CSV_COLUMNS: readonly CsvColumn[] = [
	{ name: 'day_date', description: 'Shoot day, YYYY-MM-DD', type: 'text', value: (s) => s.day.date },
	{ name: 'day_label', description: 'Shoot day label', type: 'text', value: (s) => s.day.label },
	{ name: 'location', description: 'Location of the day', type: 'text', value: (s) => s.day.locationName },
	{ name: 'mains', description: 'Mains supply of the day, e.g. "230 V 50 Hz"', type: 'text', value: (s) => `${s.day.mainsVoltage} V ${s.day.mainsFrequency} Hz` },
	{ name: 'setup', description: 'Setup name', type: 'text', value: (s) => s.name },
	{ name: 'setup_status', description: 'planning, lit or shot', type: 'text', value: (s) => s.status },
	{ name: 'target', description: 'Target white as chosen (a reading, CCT + Duv, xy or a CIE illuminant)', type: 'text', value: (s) => targetText(s) },
	{ name: 'target_cct_k', description: 'Target CCT, K (Ohno 2013)', type: 'number', value: (s) => fixed(s.target?.CCT, 0) },
	{ name: 'target_duv', description: 'Target Duv (CIE 1960 uv; > 0 above the Planckian locus, greenish)', type: 'number', value: (s) => fixed(s.target?.Duv, 4) },
	{ name: 'target_x', description: 'Target CIE 1931 x', type: 'number', value: (s) => fixed(s.target?.x, 4) },
	{ name: 'target_y', description: 'Target CIE 1931 y', type: 'number', value: (s) => fixed(s.target?.y, 4) },
	{ name: 'tolerance_duv_prime', description: 'Δu′v′ within which a light counts as on target', type: 'number', value: (s) => fixed(s.targetTolerance, 4) },
	{ name: 'light', description: 'Light label', type: 'text', value: (_s, l) => l.light.label },
	{ name: 'role', description: 'key, fill, back, practical, ambient, background or effect', type: 'text', value: (_s, l) => l.light.role },
	{ name: 'kind', description: 'Kind of source (tungsten, hmi, fluorescent, sodium, led-…)', type: 'text', value: (_s, l) => l.light.kind },
	{ name: 'fixture_profile', description: 'Fixture profile, if any', type: 'text', value: (_s, l) => l.light.fixtureProfile ?? '' },
	{ name: 'gel_stack', description: 'Gels on the light, lamp side first, joined by " + "', type: 'text', value: (_s, l) => l.light.gelText },
	{ name: 'led_settings', description: 'LED settings: CCT, green/magenta, level, channel levels in %', type: 'text', value: (_s, l) => l.light.ledText },
	{ name: 'dimmer_percent', description: 'Dimmer level, %', type: 'number', value: (_s, l) => l.light.dimmerPercent },
	{ name: 'power_w', description: 'Power draw, W', type: 'number', value: (_s, l) => l.light.powerW },
	{ name: 'circuit', description: 'Circuit it is plugged into', type: 'text', value: (_s, l) => l.light.circuitLabel ?? '' },
	{ name: 'reading', description: 'Label of the last reading', type: 'text', value: (_s, l) => l.light.lastReading?.label ?? '' },
	{ name: 'reading_taken_at', description: 'When the last reading was taken (UTC, ISO 8601), else when it was entered', type: 'text', value: (_s, l) => (l.light.lastReading ? (l.light.lastReading.takenAt ?? l.light.lastReading.createdAt) : '') },
	{ name: 'reading_cct_k', description: 'CCT of the last reading, K (empty when |Duv| > 0.05 or out of range)', type: 'number', value: (_s, l) => fixed(l.light.lastReading?.cct_k, 0) },
	{ name: 'reading_duv', description: 'Duv of the last reading', type: 'number', value: (_s, l) => fixed(l.light.lastReading?.duv, 4) },
	{ name: 'reading_x', description: 'CIE 1931 x of the last reading', type: 'number', value: (_s, l) => fixed(l.light.lastReading?.x, 4) },
	{ name: 'reading_y', description: 'CIE 1931 y of the last reading', type: 'number', value: (_s, l) => fixed(l.light.lastReading?.y, 4) },
	{ name: 'reading_ra', description: 'CRI Ra of the last reading (spectral readings only)', type: 'number', value: (_s, l) => fixed(l.light.lastReading?.ra, 1) },
	{ name: 'distance_duv_prime', description: 'Δu′v′ from the last reading to the target white', type: 'number', value: (_s, l) => fixed(l.light.lastReading?.distance?.duv_prime, 4) },
	{ name: 'on_target', description: '"yes" when the distance is within the tolerance, "no" when not, empty without a reading or target', type: 'text', value: (_s, l) => (l.light.lastReading?.distance ? (l.light.lastReading.distance.within ? 'yes' : 'no') : '') },
	{ name: 'fix_kind', description: 'Latest accepted fix: gel or led', type: 'text', value: (_s, l) => l.light.latestFix?.kind ?? '' },
	{ name: 'fix_setting', description: 'Latest accepted fix as set', type: 'text', value: (_s, l) => l.light.latestFix?.setting ?? '' },
	{ name: 'fix_accepted_by', description: 'Who accepted it', type: 'text', value: (_s, l) => l.light.latestFix?.acceptedBy ?? '' },
	{ name: 'fix_accepted_at', description: 'When it was accepted (UTC, ISO 8601)', type: 'text', value: (_s, l) => iso(l.light.latestFix?.acceptedAt) ?? '' },
	{ name: 'changed_by', description: 'Who last changed the light', type: 'text', value: (_s, l) => l.changedBy ?? '' },
	{ name: 'changed_at', description: 'When the light was last changed (UTC, ISO 8601)', type: 'text', value: (_s, l) => iso(l.changedAt) ?? '' }
];

/** A text cell a spreadsheet will not run as a formula. */
export function safeCell(v: string): string {
	return /^[=+\-@\t\r]/.test(v) ? `'${v}` : v;
}

export function logCsvRows(setups: readonly ReviewSetup[]): (string | number | null)[][] {
	const rows: (string | number | null)[][] = [];
	for (const s of setups) {
		for (const l of s.lights) {
			rows.push(
				LOG_CSV_COLUMNS.map((c) => {
					const v = c.value(s, l);
					return c.type === 'text' && typeof v === 'string' ? safeCell(v) : v;
				})
			);
		}
	}
	return rows;
}

/** The whole log (optionally filtered like the review) as CSV text, CRLF line ends, header first. */
export async function logCsv(access: ProjectAccess, filters: { dayId?: number; setupId?: number; kind?: string } = {}): Promise<string> {
	const review = await reviewLog(access, { ...filters, pageSize: 0 });
	return Papa.unparse({ fields: LOG_CSV_COLUMNS.map((c) => c.name), data: logCsvRows(review.setups) }, { newline: '\r\n' }) + '\r\n';
}

/** A file name for the download: the project's name in safe characters and the date. */
export function exportFileName(projectName: string, kind: string, ext: string, now = new Date()): string {
	const slug = projectName.normalize('NFKD').replace(/[^\w\s-]/g, '').trim().replace(/\s+/g, '-').toLowerCase().slice(0, 60) || 'project';
	return `${slug}-${kind}-${now.toISOString().slice(0, 10)}.${ext}`;
}
