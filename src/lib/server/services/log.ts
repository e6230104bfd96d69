/**
 * The lighting log's rules: shoot days → setups → lights, the power plan's circuits, target whites
 * and locks, accepted fixes, comments with @mentions, and the activity log every change writes.
 *
 * Callers pass a `ProjectAccess` from `$lib/server/authz` (membership already checked). Each verb
 * checks its own permission again, refuses edits a lock forbids, and saves with optimistic
 * concurrency: a stale `version` gives a `LogError` with code `conflict` whose details say who
 * saved first, when, and both versions field by field. `LogError` is an `ApiError`, so the JSON API
 * passes it through as `{ error: { code, message, details } }`; pages turn it into `fail(…)` with
 * `attempt`.
 */
import { fail, type ActionFailure } from '@sveltejs/kit';
import type { z } from 'zod';
import { displaySwatch } from '$lib/colour';
import { distance, type TargetWhite } from '$lib/matching/target';
import { gelDefinition } from '$lib/matching/gels/definitions';
import { POWER_CAUTIONS, loadMessage, powerBudget, type PowerPlan } from '$lib/settools/power';
import { formatWatts } from '$lib/settools/format';
import { ApiError } from '$lib/server/api';
import { db } from '$lib/server/db';
import * as activity from '$lib/server/db/activity';
import * as circuits from '$lib/server/db/circuits';
import * as comments from '$lib/server/db/comments';
import * as fixes from '$lib/server/db/fixes';
import * as lights from '$lib/server/db/lights';
import * as members from '$lib/server/db/members';
import * as readings from '$lib/server/db/readings';
import * as setups from '$lib/server/db/setups';
import * as shootDays from '$lib/server/db/shoot-days';
import * as users from '$lib/server/db/users';
import type { ActivitySubject } from '$lib/server/db/activity';
import type { Circuit, CircuitFields } from '$lib/server/db/circuits';
import type { Comment } from '$lib/server/db/comments';
import type { AcceptedFix, FixKind } from '$lib/server/db/fixes';
import type { Light, LightFields } from '$lib/server/db/lights';
import type { Member } from '$lib/server/db/members';
import type { Reading, RawReading } from '$lib/server/db/readings';
import type { Setup, SetupFields } from '$lib/server/db/setups';
import type { ShootDay, ShootDayFields } from '$lib/server/db/shoot-days';
import type { Permission, ProjectAccess } from '$lib/server/authz';
import { createReading, UnusableInputError } from '$lib/server/services/readings';
import { resolveStoredTarget, TargetError } from '$lib/server/services/targets';
import { formValues, parseForm } from '$lib/server/auth/form';
import { sendMail } from '$lib/server/mail/transport';
import { escapeHtml } from '$lib/server/mail/templates';
import {
	formatChannelLevels,
	LIGHT_KINDS,
	SETUP_STATUS_LABELS,
	type CommentSubject,
	type LedSettings,
	type StoredTarget
} from '$lib/schemas/log';

// ——— Errors ———

export type LogErrorCode = 'not_found' | 'forbidden' | 'locked' | 'conflict' | 'invalid';

const STATUS: Record<LogErrorCode, number> = { not_found: 404, forbidden: 403, locked: 409, conflict: 409, invalid: 400 };

/** An expected refusal, with a sentence for the person and (for conflicts) both versions. */
export class LogError extends ApiError {
	constructor(
		readonly logCode: LogErrorCode,
		message: string,
		details?: unknown
	) {
		super(STATUS[logCode], logCode, message, details);
	}
}

export interface ConflictField {
	field: string;
	label: string;
	yours: string;
	theirs: string;
}

/** What a conflicting save reports: who saved first, when, and both versions where they differ. */
export interface ConflictDetails {
	changedBy: { id: number; name: string } | null;
	changedAt: string;
	version: number;
	fields: ConflictField[];
	current: Record<string, unknown>;
}

/** What a page's form action answers (success or failure), so every form reads the same fields. */
export interface FormResult {
	action: string;
	ok?: boolean;
	/** A sentence for the person (refusals, or a success note). */
	message?: string;
	code?: LogErrorCode;
	conflict?: ConflictDetails;
	issues?: Record<string, string[]>;
	values?: Record<string, string>;
	subjectType?: string;
	subjectId?: number;
	lightId?: number;
	circuitId?: number;
	commentId?: number;
	mentioned?: { userId: number; name: string }[];
}

/**
 * For form actions: runs a service call and turns a `LogError` into `fail(status, …)` with the
 * message, the conflict (if any) and the submitted values for the form to refill.
 */
export async function attempt<T>(
	action: string,
	values: Record<string, string>,
	fn: () => Promise<T>,
	extra: Partial<FormResult> = {}
): Promise<{ ok: true; value: T } | { ok: false; failure: ActionFailure<FormResult> }> {
	try {
		return { ok: true, value: await fn() };
	} catch (e) {
		if (e instanceof LogError) {
			const issues = e.logCode === 'invalid' && Array.isArray(e.details) ? issuesFromDetails(e.details as { path: string; message: string }[]) : undefined;
			return {
				ok: false,
				failure: fail(e.status, {
					action,
					...extra,
					message: e.message,
					code: e.logCode,
					conflict: e.logCode === 'conflict' ? (e.details as ConflictDetails) : undefined,
					issues,
					values
				})
			};
		}
		throw e;
	}
}

function issuesFromDetails(details: { path: string; message: string }[]): Record<string, string[]> {
	const out: Record<string, string[]> = {};
	for (const d of details) (out[d.path] ??= []).push(d.message);
	return out;
}

/**
 * A whole form action after the permission check: parse the form with `schema` (400 with field
 * issues and the values to refill), run the service call (refusals become `fail`), and answer
 * `{ action, ok: true, … }`. `extra` picks ids from the form that the page needs to place the answer.
 */
export async function formAction<S extends z.ZodType>(
	request: Request,
	action: string,
	schema: S,
	run: (data: z.infer<S>, form: FormData) => Promise<Partial<FormResult> | void>,
	extra: (form: FormData) => Partial<FormResult> = () => ({})
): Promise<FormResult | ActionFailure<FormResult>> {
	const form = await request.formData();
	const more = extra(form);
	const parsed = parseForm(schema, form);
	if (!parsed.ok) return fail(400, { action, ...more, issues: parsed.issues, values: parsed.values });
	const r = await attempt(action, formValues(form), () => run(parsed.data, form), more);
	if (!r.ok) return r.failure;
	return { action, ...more, ok: true, ...(r.value ?? {}) };
}

/** An id field of a submitted form (0 when absent or malformed). */
export function formId(form: FormData, key: string): number {
	return parseId(String(form.get(key) ?? '')) ?? 0;
}

function need(access: ProjectAccess, permission: Permission): void {
	if (!access.can(permission)) throw new LogError('forbidden', 'Your role on this project cannot do that.');
}

/** A positive id from a URL segment, or null. */
export function parseId(raw: string | undefined): number | null {
	return raw && /^[1-9][0-9]{0,9}$/.test(raw) ? Number(raw) : null;
}

const who = (u: { name: string; email: string } | null | undefined) => (u ? u.name || u.email : 'someone');

async function userName(id: number | null): Promise<string | null> {
	if (id === null) return null;
	const u = await users.read(id);
	return u ? u.name || u.email : null;
}

async function names(ids: (number | null)[]): Promise<Map<number, string>> {
	const list = await users.list([...new Set(ids.filter((i): i is number => i !== null))]);
	return new Map(list.map((u) => [u.id, u.name || u.email]));
}

// ——— Display of values (conflicts, activity, CSV) ———

export function gelLabel(id: string): string {
	return gelDefinition(id)?.label ?? id;
}

export function formatGelStack(stack: readonly string[]): string {
	return stack.length ? stack.map(gelLabel).join(' + ') : '';
}

export function formatLedSettings(s: LedSettings | null | undefined): string {
	if (!s) return '';
	const parts: string[] = [];
	if (s.cct_k != null) parts.push(`${Math.round(s.cct_k)} K`);
	if (s.gm != null) parts.push(`G/M ${s.gm > 0 ? '+' : ''}${s.gm}`);
	if (s.intensity != null) parts.push(`${s.intensity} %`);
	if (s.channels) parts.push(formatChannelLevels(s.channels));
	if (s.note) parts.push(s.note);
	return parts.join(', ');
}

function show(v: unknown): string {
	if (v === null || v === undefined || v === '') return '—';
	if (v instanceof Date) return v.toISOString();
	if (Array.isArray(v)) return v.length ? v.map(String).join(' + ') : '—';
	if (typeof v === 'object') return JSON.stringify(v);
	return String(v);
}

const DAY_LABELS: Record<keyof ShootDayFields, string> = {
	date: 'Date',
	label: 'Label',
	locationName: 'Location',
	mainsVoltage: 'Mains voltage',
	mainsFrequency: 'Mains frequency',
	notes: 'Notes'
};
const SETUP_LABELS: Partial<Record<keyof SetupFields, string>> = { shootDayId: 'Shoot day', name: 'Name', notes: 'Notes', status: 'Status' };
const LIGHT_LABELS: Record<Exclude<keyof LightFields, 'position'>, string> = {
	label: 'Label',
	role: 'Role',
	kind: 'Kind',
	fixtureProfile: 'Fixture profile',
	gelStack: 'Gel stack',
	ledSettings: 'LED settings',
	dimmerPercent: 'Dimmer %',
	powerW: 'Power W',
	circuitId: 'Circuit',
	notes: 'Notes'
};
const CIRCUIT_LABELS: Record<keyof CircuitFields, string> = { label: 'Name', preset: 'Preset', volts: 'Volts', amps: 'Breaker A', derating: 'Continuous share' };

function showField(field: string, v: unknown): string {
	if (field === 'gelStack') return formatGelStack((v as string[]) ?? []) || '—';
	if (field === 'ledSettings') return formatLedSettings(v as LedSettings | null) || '—';
	return show(v);
}

/** Field-by-field differences between what was sent and what is stored. */
function differences(labels: Record<string, string | undefined>, yours: Record<string, unknown>, theirs: Record<string, unknown>): ConflictField[] {
	const out: ConflictField[] = [];
	for (const [field, label] of Object.entries(labels)) {
		if (!label || !(field in yours)) continue;
		const a = showField(field, yours[field]);
		const b = showField(field, theirs[field]);
		if (a !== b) out.push({ field, label, yours: a, theirs: b });
	}
	return out;
}

/** Changes as `{ field: [before, after] }`, for the activity log. */
export function changes(labels: Record<string, string | undefined>, before: Record<string, unknown>, after: Record<string, unknown>): Record<string, [string, string]> {
	const out: Record<string, [string, string]> = {};
	for (const [field, label] of Object.entries(labels)) {
		if (!label || !(field in after)) continue;
		const a = showField(field, before[field]);
		const b = showField(field, after[field]);
		if (a !== b) out[field] = [a, b];
	}
	return out;
}

export function describeChanges(labels: Record<string, string | undefined>, ch: Record<string, [string, string]>): string {
	const parts = Object.entries(ch).map(([f, [a, b]]) => (f === 'notes' ? 'notes' : `${(labels[f] ?? f).toLowerCase()} ${a} → ${b}`));
	return parts.length ? parts.join('; ') : 'no visible change';
}

/** Throws the conflict of a save that lost the race: who saved first, when, and both versions field by field. */
export async function raiseConflict(what: string, labels: Record<string, string | undefined>, yours: Record<string, unknown>, current: { version: number; updatedBy: number | null; updatedAt: Date } & object): Promise<never> {
	const by = current.updatedBy ? await users.read(current.updatedBy) : null;
	const details: ConflictDetails = {
		changedBy: by ? { id: by.id, name: by.name || by.email } : null,
		changedAt: current.updatedAt.toISOString(),
		version: current.version,
		fields: differences(labels, yours, current as unknown as Record<string, unknown>),
		current: current as unknown as Record<string, unknown>
	};
	throw new LogError(
		'conflict',
		`${who(by)} changed this ${what} first (${current.updatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC, now version ${current.version}). Compare both versions, then save again or keep theirs.`,
		details
	);
}

async function log(access: ProjectAccess, a: { action: string; subjectType: ActivitySubject; subjectId: number | null; summary: string; details?: Record<string, unknown> | null }, q = db): Promise<void> {
	await activity.create(access.project.id, { userId: access.user.id, ...a }, q);
}

// ——— Shoot days ———

export function listDays(access: ProjectAccess, o: shootDays.ListOptions = {}) {
	return shootDays.list(access.project.id, o);
}

export function readDay(access: ProjectAccess, id: number): Promise<ShootDay | null> {
	return shootDays.read(access.project.id, id);
}

const dayName = (d: Pick<ShootDay, 'date' | 'label'>) => (d.label ? `${d.label} (${d.date})` : d.date);

export async function createDay(access: ProjectAccess, input: ShootDayFields): Promise<ShootDay> {
	need(access, 'light.edit');
	return db.transaction(async (trx) => {
		const day = await shootDays.create(access.project.id, input, access.user.id, trx);
		await log(access, { action: 'create', subjectType: 'shoot_day', subjectId: day.id, summary: `Added shoot day ${dayName(day)} at ${day.locationName || 'an unnamed location'}` }, trx);
		return day;
	});
}

export async function updateDay(access: ProjectAccess, id: number, patch: Partial<ShootDayFields>, version: number): Promise<ShootDay> {
	need(access, 'light.edit');
	const before = await shootDays.read(access.project.id, id);
	if (!before) throw new LogError('not_found', 'There is no such shoot day in this project.');
	return db.transaction(async (trx) => {
		const r = await shootDays.update(access.project.id, id, patch, version, access.user.id, trx);
		if (!r) throw new LogError('not_found', 'There is no such shoot day in this project.');
		if ('conflict' in r) return raiseConflict('shoot day', DAY_LABELS, patch, r.conflict);
		const ch = changes(DAY_LABELS, before as unknown as Record<string, unknown>, patch);
		await log(access, { action: 'update', subjectType: 'shoot_day', subjectId: id, summary: `Changed shoot day ${dayName(r.day)}: ${describeChanges(DAY_LABELS, ch)}`, details: { changes: ch } }, trx);
		return r.day;
	});
}

export async function deleteDay(access: ProjectAccess, id: number): Promise<void> {
	need(access, 'light.edit');
	const day = await shootDays.read(access.project.id, id);
	if (!day) throw new LogError('not_found', 'There is no such shoot day in this project.');
	if ((await setups.lockedOnDay(access.project.id, id)) > 0) {
		throw new LogError('locked', `Shoot day ${dayName(day)} has a locked setup. A DP or the owner unlocks it first.`);
	}
	await db.transaction(async (trx) => {
		await shootDays.destroy(access.project.id, id, trx);
		await log(access, { action: 'delete', subjectType: 'shoot_day', subjectId: id, summary: `Deleted shoot day ${dayName(day)} with its setups` }, trx);
	});
}

// ——— Setups ———

export function listSetups(access: ProjectAccess, o: setups.ListOptions = {}) {
	return setups.list(access.project.id, o);
}

export function readSetup(access: ProjectAccess, id: number): Promise<Setup | null> {
	return setups.read(access.project.id, id);
}

async function setupOrThrow(access: ProjectAccess, id: number): Promise<Setup> {
	const s = await setups.read(access.project.id, id);
	if (!s) throw new LogError('not_found', 'There is no such setup in this project.');
	return s;
}

/** Refuses edits to lights and readings of a locked setup, saying who locked it and when. */
async function assertOpen(setup: Setup): Promise<void> {
	if (!setup.lockedAt) return;
	const by = await userName(setup.lockedBy);
	throw new LogError(
		'locked',
		`“${setup.name}” is locked${by ? ` by ${by}` : ''} since ${setup.lockedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC: its lights and readings are frozen. A DP or the owner can unlock it.`
	);
}

/**
 * Whether readings may be added to or changed on this setup now: throws `LogError('locked')` for
 * a locked setup. For any route that writes readings of a setup.
 */
export async function assertSetupOpen(projectId: number, setupId: number | null): Promise<void> {
	if (setupId === null) return;
	const s = await setups.read(projectId, setupId);
	if (s) await assertOpen(s);
}

export async function createSetup(access: ProjectAccess, input: { shootDayId: number; name: string; notes: string; status: Setup['status'] }): Promise<Setup> {
	need(access, 'light.edit');
	const day = await shootDays.read(access.project.id, input.shootDayId);
	if (!day) throw new LogError('invalid', 'That shoot day is not in this project.', [{ path: 'shootDayId', message: 'No such shoot day in this project.' }]);
	return db.transaction(async (trx) => {
		const s = await setups.create(access.project.id, input, access.user.id, trx);
		await log(access, { action: 'create', subjectType: 'setup', subjectId: s.id, summary: `Added setup “${s.name}” on ${dayName(day)}` }, trx);
		return s;
	});
}

export async function updateSetup(access: ProjectAccess, id: number, patch: Partial<Pick<SetupFields, 'name' | 'notes' | 'status' | 'shootDayId'>>, version: number): Promise<Setup> {
	need(access, 'light.edit');
	const before = await setupOrThrow(access, id);
	if (patch.shootDayId !== undefined && !(await shootDays.read(access.project.id, patch.shootDayId))) {
		throw new LogError('invalid', 'That shoot day is not in this project.', [{ path: 'shootDayId', message: 'No such shoot day in this project.' }]);
	}
	return db.transaction(async (trx) => {
		const r = await setups.update(access.project.id, id, patch, version, access.user.id, trx);
		if (!r) throw new LogError('not_found', 'There is no such setup in this project.');
		if ('conflict' in r) return raiseConflict('setup', SETUP_LABELS, patch, r.conflict);
		const ch = changes(SETUP_LABELS, before as unknown as Record<string, unknown>, patch);
		await log(access, { action: 'update', subjectType: 'setup', subjectId: id, summary: `Changed setup “${r.setup.name}”: ${describeChanges(SETUP_LABELS, ch)}`, details: { changes: ch } }, trx);
		return r.setup;
	});
}

export async function deleteSetup(access: ProjectAccess, id: number): Promise<void> {
	need(access, 'light.edit');
	const s = await setupOrThrow(access, id);
	await assertOpen(s);
	await db.transaction(async (trx) => {
		await setups.destroy(access.project.id, id, trx);
		await log(access, { action: 'delete', subjectType: 'setup', subjectId: id, summary: `Deleted setup “${s.name}” with its lights and circuits` }, trx);
	});
}

async function saveSetupState(access: ProjectAccess, s: Setup, version: number, patch: Partial<SetupFields>, entry: { action: string; summary: string; details?: Record<string, unknown> }): Promise<Setup> {
	return db.transaction(async (trx) => {
		const r = await setups.update(access.project.id, s.id, patch, version, access.user.id, trx);
		if (!r) throw new LogError('not_found', 'There is no such setup in this project.');
		if ('conflict' in r) return raiseConflict('setup', { ...SETUP_LABELS, target: 'Target white' } as Record<string, string>, patch, r.conflict);
		await log(access, { subjectType: 'setup', subjectId: s.id, ...entry }, trx);
		return r.setup;
	});
}

/** Sets (or, with null, clears) the target white. Refused while the target is locked. */
export async function setTarget(access: ProjectAccess, id: number, target: StoredTarget | null, tolerance: number | undefined, version: number): Promise<Setup> {
	need(access, 'target.set');
	const s = await setupOrThrow(access, id);
	if (s.targetLockedAt) {
		const by = await userName(s.targetLockedBy);
		throw new LogError('locked', `The target white of “${s.name}” is locked${by ? ` by ${by}` : ''}. Unlock it before choosing another.`);
	}
	if (target?.kind === 'reading' && !(await readings.read(access.project.id, target.readingId))) {
		throw new LogError('invalid', 'That reading is not in this project.', [{ path: 'readingId', message: 'Pick a reading of this project.' }]);
	}
	const resolved = target ? await resolveTarget(access.project.id, target, tolerance ?? s.targetTolerance) : null;
	if (target && !resolved) throw new LogError('invalid', 'That target white cannot be computed.');
	return saveSetupState(access, s, version, { target, ...(tolerance !== undefined ? { targetTolerance: tolerance } : {}) }, {
		action: target ? 'target.set' : 'target.clear',
		summary: target ? `Set the target white of “${s.name}” to ${resolved!.label}` : `Cleared the target white of “${s.name}”`,
		details: { before: s.target, after: target }
	});
}

export async function lockTarget(access: ProjectAccess, id: number, locked: boolean, version: number): Promise<Setup> {
	need(access, 'target.lock');
	const s = await setupOrThrow(access, id);
	if (locked && !s.target) throw new LogError('invalid', 'Choose a target white before locking it.');
	return saveSetupState(access, s, version, { targetLockedAt: locked ? new Date() : null, targetLockedBy: locked ? access.user.id : null }, {
		action: locked ? 'target.lock' : 'target.unlock',
		summary: `${locked ? 'Locked' : 'Unlocked'} the target white of “${s.name}”`
	});
}

export async function lockSetup(access: ProjectAccess, id: number, locked: boolean, version: number): Promise<Setup> {
	need(access, 'setup.lock');
	const s = await setupOrThrow(access, id);
	return saveSetupState(access, s, version, { lockedAt: locked ? new Date() : null, lockedBy: locked ? access.user.id : null }, {
		action: locked ? 'setup.lock' : 'setup.unlock',
		summary: `${locked ? 'Locked' : 'Unlocked'} setup “${s.name}”${locked ? ': lights and readings frozen' : ''}`
	});
}

// ——— Target white ———

export interface TargetView {
	stored: StoredTarget;
	label: string;
	x: number;
	y: number;
	u_prime: number;
	v_prime: number;
	CCT: number | null;
	Duv: number | null;
	mired: number | null;
	tolerance: number;
	warnings: string[];
	/** sRGB hex of the tint, for a swatch. */
	swatch: string | null;
}

/** sRGB swatch of a chromaticity (null when it cannot be shown). */
export function swatchOf(x: number, y: number): string | null {
	try {
		return displaySwatch({ x, y }).hex;
	} catch {
		return null;
	}
}

/** The target white as the pages show it. */
export function targetView(stored: StoredTarget, t: TargetWhite): TargetView {
	return { stored, label: t.label, x: t.x, y: t.y, u_prime: t.u_prime, v_prime: t.v_prime, CCT: t.CCT, Duv: t.Duv, mired: t.mired, tolerance: t.tolerance, warnings: t.warnings, swatch: swatchOf(t.x, t.y) };
}

/**
 * The stored target resolved (through the one resolver the fix solvers use too) for display: null
 * when its reading was removed or it cannot be computed, which the pages show as a missing target.
 */
export async function resolveTarget(projectId: number, stored: StoredTarget, tolerance: number, readingLookup?: Map<number, Reading>): Promise<TargetView | null> {
	try {
		return targetView(stored, await resolveStoredTarget(projectId, stored, tolerance, readingLookup));
	} catch (e) {
		if (e instanceof TargetError) return null;
		throw e;
	}
}

export interface DistanceView {
	duv_prime: number;
	mired: number | null;
	dDuv: number | null;
	within: boolean;
}

/** How far a reading is from the target (Δu'v', with the mired and Duv it needs). */
export function readingDistance(r: Pick<Reading, 'computed'> | null | undefined, target: TargetView | null): DistanceView | null {
	if (!r || !target) return null;
	const d = distance({ x: r.computed.x, y: r.computed.y }, { ...target, resolved: true, kind: target.stored.kind === 'cct_duv' ? 'cct' : target.stored.kind, spectrum: null } as TargetWhite);
	return { duv_prime: d.duv_prime, mired: d.mired, dDuv: d.dDuv, within: d.within };
}

// ——— Lights ———

async function checkCircuit(access: ProjectAccess, setupId: number, circuitId: number | null | undefined): Promise<void> {
	if (circuitId == null) return;
	const c = await circuits.read(access.project.id, circuitId);
	if (!c || c.setupId !== setupId) throw new LogError('invalid', 'That circuit is not in this setup’s power plan.', [{ path: 'circuitId', message: 'Pick a circuit of this setup.' }]);
}

export function readLight(access: ProjectAccess, id: number): Promise<Light | null> {
	return lights.read(access.project.id, id);
}

export function listLights(access: ProjectAccess, o: lights.ListOptions = {}): Promise<Light[]> {
	return lights.list(access.project.id, o);
}

/** A light as the forms and the API give it: optional fields may be missing or null. */
export type LightInput = { label: string } & { [K in Exclude<keyof LightFields, 'label' | 'position'>]?: LightFields[K] | null | undefined };

function lightFields(i: LightInput): Omit<LightFields, 'position'> {
	return {
		label: i.label,
		role: i.role ?? 'key',
		kind: i.kind ?? 'other',
		fixtureProfile: i.fixtureProfile ?? null,
		gelStack: i.gelStack ?? [],
		ledSettings: i.ledSettings ?? null,
		dimmerPercent: i.dimmerPercent ?? null,
		powerW: i.powerW ?? null,
		circuitId: i.circuitId ?? null,
		notes: i.notes ?? ''
	};
}

export async function createLight(access: ProjectAccess, setupId: number, given: LightInput): Promise<Light> {
	const input = lightFields(given);
	need(access, 'light.edit');
	const s = await setups.read(access.project.id, setupId);
	if (!s) throw new LogError('invalid', 'That setup is not in this project.', [{ path: 'setupId', message: 'No such setup in this project.' }]);
	await assertOpen(s);
	await checkCircuit(access, setupId, input.circuitId);
	return db.transaction(async (trx) => {
		const l = await lights.create(access.project.id, setupId, input, access.user.id, trx);
		await log(access, { action: 'create', subjectType: 'light', subjectId: l.id, summary: `Added ${l.role} light “${l.label}” (${LIGHT_KINDS[l.kind] ?? l.kind}) to “${s.name}”` }, trx);
		return l;
	});
}

export async function updateLight(access: ProjectAccess, id: number, patch: Partial<Omit<LightFields, 'position'>>, version: number): Promise<Light> {
	need(access, 'light.edit');
	const before = await lights.read(access.project.id, id);
	if (!before) throw new LogError('not_found', 'There is no such light in this project.');
	await assertOpen(await setupOrThrow(access, before.setupId));
	await checkCircuit(access, before.setupId, patch.circuitId);
	return db.transaction(async (trx) => {
		const r = await lights.update(access.project.id, id, patch, version, access.user.id, trx);
		if (!r) throw new LogError('not_found', 'There is no such light in this project.');
		if ('conflict' in r) return raiseConflict('light', LIGHT_LABELS, patch, r.conflict);
		const ch = changes(LIGHT_LABELS, before as unknown as Record<string, unknown>, patch);
		await log(access, { action: 'update', subjectType: 'light', subjectId: id, summary: `Changed light “${r.light.label}”: ${describeChanges(LIGHT_LABELS, ch)}`, details: { changes: ch } }, trx);
		return r.light;
	});
}

export async function deleteLight(access: ProjectAccess, id: number): Promise<void> {
	need(access, 'light.edit');
	const l = await lights.read(access.project.id, id);
	if (!l) throw new LogError('not_found', 'There is no such light in this project.');
	await assertOpen(await setupOrThrow(access, l.setupId));
	await db.transaction(async (trx) => {
		await lights.destroy(access.project.id, id, access.user.id, trx);
		await log(access, { action: 'delete', subjectType: 'light', subjectId: id, summary: `Removed light “${l.label}”` }, trx);
	});
}

/** A reading for one light, computed by the colour core. Refused on a locked setup. */
export async function addReading(
	access: ProjectAccess,
	lightId: number,
	input: { label: string; raw: RawReading; takenAt?: string | null; meter?: string | null; notes?: string | null }
): Promise<Reading> {
	need(access, 'reading.edit');
	const l = await lights.read(access.project.id, lightId);
	if (!l) throw new LogError('not_found', 'There is no such light in this project.');
	const s = await setupOrThrow(access, l.setupId);
	await assertOpen(s);
	let r: Reading;
	try {
		r = await createReading(access.project.id, access.user.id, { ...input, label: input.label || l.label, setupId: s.id, lightId: l.id });
	} catch (e) {
		if (e instanceof UnusableInputError) throw new LogError('invalid', e.message);
		throw e;
	}
	const cct = r.computed.cct_k ? `${Math.round(r.computed.cct_k)} K` : `x ${r.computed.x.toFixed(4)}, y ${r.computed.y.toFixed(4)}`;
	await log(access, { action: 'create', subjectType: 'reading', subjectId: r.id, summary: `Took reading “${r.label}” of “${l.label}”: ${cct}` });
	return r;
}

export interface FixInput {
	kind: FixKind;
	/** Gel fix: `{ stack: string[] }`; LED fix: `{ levels: Record<string, number>, cct_k?, gm?, intensity? }`. */
	fix: Record<string, unknown>;
	predicted?: Record<string, unknown> | null;
	note?: string | null;
}

/**
 * Records a fix the DP or gaffer took for a light, with the setup's target at the time, who and
 * when, and sets it on the light (gel stack, or LED settings). Refused on a locked setup.
 */
export async function acceptFix(access: ProjectAccess, lightId: number, input: FixInput): Promise<{ fix: AcceptedFix; light: Light }> {
	need(access, 'fix.accept');
	const l = await lights.read(access.project.id, lightId);
	if (!l) throw new LogError('not_found', 'There is no such light in this project.');
	const s = await setupOrThrow(access, l.setupId);
	await assertOpen(s);
	let patch: Partial<LightFields>;
	if (input.kind === 'gel') {
		const stack = input.fix.stack;
		if (!Array.isArray(stack) || !stack.every((g) => typeof g === 'string')) throw new LogError('invalid', 'A gel fix needs its stack: a list of gels.');
		patch = { gelStack: stack as string[] };
	} else {
		const levels = input.fix.levels as Record<string, number> | undefined;
		const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
		if (levels !== undefined && (typeof levels !== 'object' || Object.values(levels).some((v) => typeof v !== 'number' || v < 0 || v > 100))) {
			throw new LogError('invalid', 'LED levels are 0 to 100 % per channel.');
		}
		patch = { ledSettings: { cct_k: num(input.fix.cct_k), gm: num(input.fix.gm), intensity: num(input.fix.intensity), channels: levels ?? null, note: 'accepted fix' } };
	}
	return db.transaction(async (trx) => {
		const fix = await fixes.create(access.project.id, { setupId: s.id, lightId, kind: input.kind, fix: input.fix, predicted: input.predicted ?? null, target: s.target as Record<string, unknown> | null, note: input.note ?? null, acceptedBy: access.user.id }, trx);
		const r = await lights.update(access.project.id, lightId, patch, l.version, access.user.id, trx);
		if (!r || 'conflict' in r) throw new LogError('conflict', `Someone changed “${l.label}” a moment ago. Look at it again, then accept the fix.`);
		const setting = input.kind === 'gel' ? formatGelStack(patch.gelStack ?? []) || 'no gel' : formatLedSettings(patch.ledSettings);
		await log(access, { action: 'fix.accept', subjectType: 'light', subjectId: lightId, summary: `Accepted a ${input.kind === 'gel' ? 'gel' : 'LED'} fix for “${l.label}”: ${setting}`, details: { fixId: fix.id } }, trx);
		return { fix, light: r.light };
	});
}

// ——— Circuits (power plan) ———

export async function createCircuit(access: ProjectAccess, setupId: number, given: Omit<CircuitFields, 'preset'> & { preset?: string | null }): Promise<Circuit> {
	const input: CircuitFields = { ...given, preset: given.preset ?? null };
	need(access, 'power.edit');
	const s = await setups.read(access.project.id, setupId);
	if (!s) throw new LogError('not_found', 'There is no such setup in this project.');
	return db.transaction(async (trx) => {
		const c = await circuits.create(access.project.id, setupId, input, access.user.id, trx);
		await log(access, { action: 'create', subjectType: 'circuit', subjectId: c.id, summary: `Added circuit “${c.label}” (${c.volts} V, ${c.amps} A) to “${s.name}”` }, trx);
		return c;
	});
}

export async function updateCircuit(access: ProjectAccess, id: number, given: Partial<Omit<CircuitFields, 'preset'>> & { preset?: string | null }, version: number): Promise<Circuit> {
	const patch: Partial<CircuitFields> = { ...given, ...(given.preset !== undefined ? { preset: given.preset ?? null } : {}) };
	need(access, 'power.edit');
	const before = await circuits.read(access.project.id, id);
	if (!before) throw new LogError('not_found', 'There is no such circuit in this project.');
	return db.transaction(async (trx) => {
		const r = await circuits.update(access.project.id, id, patch, version, access.user.id, trx);
		if (!r) throw new LogError('not_found', 'There is no such circuit in this project.');
		if ('conflict' in r) return raiseConflict('circuit', CIRCUIT_LABELS, patch, r.conflict);
		const ch = changes(CIRCUIT_LABELS, before as unknown as Record<string, unknown>, patch);
		await log(access, { action: 'update', subjectType: 'circuit', subjectId: id, summary: `Changed circuit “${r.circuit.label}”: ${describeChanges(CIRCUIT_LABELS, ch)}`, details: { changes: ch } }, trx);
		return r.circuit;
	});
}

export async function deleteCircuit(access: ProjectAccess, id: number): Promise<void> {
	need(access, 'power.edit');
	const c = await circuits.read(access.project.id, id);
	if (!c) throw new LogError('not_found', 'There is no such circuit in this project.');
	await db.transaction(async (trx) => {
		await circuits.destroy(access.project.id, id, trx);
		await log(access, { action: 'delete', subjectType: 'circuit', subjectId: id, summary: `Removed circuit “${c.label}”; its lights are now unassigned` }, trx);
	});
}

export interface CircuitView {
	id: number;
	label: string;
	preset: string | null;
	volts: number;
	amps: number;
	derating: number;
	version: number;
	watts: number;
	ampsDrawn: number;
	breakerWatts: number;
	continuousWatts: number;
	headroomWatts: number;
	share: number;
	level: 'clear' | 'near' | 'over-continuous' | 'over-breaker' | 'invalid';
	message: string;
	lights: { id: number; label: string; powerW: number }[];
}

export interface PowerView {
	circuits: CircuitView[];
	/** Lights the crew powers that are on no circuit yet. */
	unassigned: { id: number; label: string; powerW: number }[];
	/** Lights on a circuit with no draw given: they count as 0 W until someone fills it in. */
	noDraw: { id: number; label: string }[];
	/** Lights with neither a circuit nor a draw: not on the crew's supply (house lights, the street). */
	external: { id: number; label: string }[];
	totalWatts: number;
	assignedWatts: number;
	unassignedWatts: number;
	totalContinuousWatts: number;
	overCount: number;
	worst: CircuitView['level'];
	/** Circuits whose voltage differs from the day's mains. */
	notes: string[];
	cautions: readonly string[];
}

/** The setup's power plan: each circuit's load against its breaker, totals, warnings (set tools' arithmetic). */
export function powerPlan(circuitList: readonly Circuit[], lightList: readonly Light[], mainsVoltage: number | null): PowerView {
	const plan: PowerPlan = {
		circuits: circuitList.map((c) => ({ id: String(c.id), label: c.label, volts: c.volts, breakerAmps: c.amps, continuousFraction: c.derating })),
		lights: lightList.map((l) => ({ id: String(l.id), label: l.label, watts: l.powerW ?? 0, quantity: 1, circuitId: l.circuitId === null ? null : String(l.circuitId) }))
	};
	const b = powerBudget(plan);
	const external = new Set(lightList.filter((l) => l.powerW === null && l.circuitId === null).map((l) => l.id));
	const byId = new Map(circuitList.map((c) => [String(c.id), c]));
	const lightOut = (id: string) => {
		const l = lightList.find((x) => String(x.id) === id)!;
		return { id: l.id, label: l.label, powerW: l.powerW ?? 0 };
	};
	return {
		circuits: b.circuits.map((load) => {
			const c = byId.get(load.circuit.id)!;
			return {
				id: c.id,
				label: c.label,
				preset: c.preset,
				volts: c.volts,
				amps: c.amps,
				derating: c.derating,
				version: c.version,
				watts: load.watts,
				ampsDrawn: load.amps,
				breakerWatts: load.breakerWatts,
				continuousWatts: load.continuousWatts,
				headroomWatts: load.headroomWatts,
				share: load.shareOfContinuous,
				level: load.level,
				message: loadMessage(load, formatWatts),
				lights: load.lights.map((l) => lightOut(l.id))
			};
		}),
		unassigned: b.unassigned.filter((l) => !external.has(Number(l.id))).map((l) => lightOut(l.id)),
		noDraw: lightList.filter((l) => l.powerW === null && l.circuitId !== null).map((l) => ({ id: l.id, label: l.label })),
		external: lightList.filter((l) => external.has(l.id)).map((l) => ({ id: l.id, label: l.label })),
		totalWatts: b.totalWatts,
		assignedWatts: b.assignedWatts,
		unassignedWatts: b.unassignedWatts,
		totalContinuousWatts: b.totalContinuousWatts,
		overCount: b.overCount,
		worst: b.worst,
		notes: mainsVoltage
			? circuitList.filter((c) => Math.abs(c.volts - mainsVoltage) > 10).map((c) => `“${c.label}” is set to ${c.volts} V but the day’s mains is ${mainsVoltage} V: check the supply.`)
			: [],
		cautions: POWER_CAUTIONS
	};
}

// ——— Comments and mentions ———

export interface CommentView {
	id: number;
	subjectType: CommentSubject;
	subjectId: number;
	authorId: number | null;
	authorName: string;
	body: string;
	version: number;
	createdAt: Date;
	updatedAt: Date | null;
	mine: boolean;
}

export function commentView(c: Comment, viewerId: number): CommentView {
	return {
		id: c.id,
		subjectType: c.subjectType,
		subjectId: c.subjectId,
		authorId: c.authorId,
		authorName: c.authorName ?? 'a former member',
		body: c.body,
		version: c.version,
		createdAt: c.createdAt,
		updatedAt: c.updatedAt,
		mine: c.authorId === viewerId
	};
}

const escapeRe = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * Members mentioned in a text as `@Full Name`, `@FullName`, `@first name` (when no other member shares
 * it) or `@address-local-part`, case-insensitive. Each member once, in the order of the member list.
 */
export function findMentions(body: string, memberList: readonly Pick<Member, 'userId' | 'name' | 'email'>[]): Pick<Member, 'userId' | 'name' | 'email'>[] {
	if (!body.includes('@')) return [];
	const firstNames = new Map<string, number>();
	for (const m of memberList) {
		const first = m.name.trim().split(/\s+/)[0]?.toLowerCase();
		if (first) firstNames.set(first, (firstNames.get(first) ?? 0) + 1);
	}
	const found: Pick<Member, 'userId' | 'name' | 'email'>[] = [];
	for (const m of memberList) {
		const name = m.name.trim();
		const candidates = new Set<string>();
		if (name) {
			candidates.add(name);
			candidates.add(name.replace(/\s+/g, ''));
			const first = name.split(/\s+/)[0];
			if (first && firstNames.get(first.toLowerCase()) === 1) candidates.add(first);
		}
		const local = m.email.split('@')[0];
		if (local) candidates.add(local);
		const hit = [...candidates].some((c) => new RegExp(`(^|[^\\p{L}\\p{N}@._-])@${escapeRe(c).replace(/\s+/g, '\\s+')}(?![\\p{L}\\p{N}])`, 'iu').test(body));
		if (hit) found.push(m);
	}
	return found;
}

async function subjectContext(projectId: number, type: CommentSubject, id: number): Promise<{ setupId: number | null; title: string } | null> {
	if (type === 'setup') {
		const s = await setups.read(projectId, id);
		return s ? { setupId: s.id, title: `setup “${s.name}”` } : null;
	}
	if (type === 'light') {
		const l = await lights.read(projectId, id);
		if (!l) return null;
		const s = await setups.read(projectId, l.setupId);
		return { setupId: l.setupId, title: `light “${l.label}”${s ? ` in “${s.name}”` : ''}` };
	}
	const r = await readings.read(projectId, id);
	return r ? { setupId: r.setupId, title: `reading “${r.label}”` } : null;
}

export function listComments(access: ProjectAccess, o: comments.ListOptions = {}): Promise<Comment[]> {
	return comments.list(access.project.id, o);
}

export function readComment(access: ProjectAccess, id: number): Promise<Comment | null> {
	return comments.read(access.project.id, id);
}

function mentionMail(p: { authorName: string; projectName: string; subjectTitle: string; body: string; url: string }) {
	const subject = `${p.authorName} mentioned you on ${p.subjectTitle} (${p.projectName})`;
	const text = [
		'Hello,',
		'',
		`${p.authorName} mentioned you in a comment on ${p.subjectTitle} in the lighting log of “${p.projectName}”:`,
		'',
		...p.body.split('\n').map((l) => `> ${l}`),
		'',
		'Open it in Chromaslate:',
		p.url,
		'',
		'--',
		'Chromaslate · colour for lighting crews',
		''
	].join('\n');
	const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(subject)}</title></head>
<body style="margin:0;padding:24px;background:#f6f4ef;color:#1d1c1a;font-family:system-ui,sans-serif;font-size:16px">
<div style="max-width:560px;margin:0 auto;background:#fff;border:1px solid #d3cfc5;border-radius:14px;padding:24px">
<p style="margin:0 0 16px;font-weight:600">Chromaslate</p>
<p style="margin:0 0 16px;line-height:1.5">${escapeHtml(p.authorName)} mentioned you in a comment on ${escapeHtml(p.subjectTitle)} in the lighting log of “${escapeHtml(p.projectName)}”:</p>
<blockquote style="margin:0 0 16px;padding:8px 16px;border-left:4px solid #1f7380;white-space:pre-line">${escapeHtml(p.body)}</blockquote>
<p style="margin:24px 0"><a href="${escapeHtml(p.url)}" style="display:inline-block;background:#9c6112;color:#fff;text-decoration:none;font-weight:600;padding:14px 22px;border-radius:10px">Open the comment</a></p>
<p style="margin:0;font-size:13px;color:#85817a">Chromaslate · colour for lighting crews</p>
</div></body></html>
`;
	return { subject, text, html };
}

/**
 * Adds a comment, writes the activity, and mails each member mentioned by name (not the author).
 * Mail that cannot be sent does not undo the comment; the addresses that failed come back.
 */
export async function addComment(
	access: ProjectAccess,
	input: { subjectType: CommentSubject; subjectId: number; body: string },
	origin: string
): Promise<{ comment: Comment; mentioned: { userId: number; name: string }[]; mailFailed: string[] }> {
	need(access, 'comment.create');
	const ctx = await subjectContext(access.project.id, input.subjectType, input.subjectId);
	if (!ctx) throw new LogError('invalid', `That ${input.subjectType} is not in this project.`, [{ path: 'subjectId', message: 'No such subject in this project.' }]);
	const memberList = await members.list(access.project.id);
	const mentioned = findMentions(input.body, memberList).filter((m) => m.userId !== access.user.id);
	const comment = await db.transaction(async (trx) => {
		const c = await comments.create(access.project.id, { ...input, authorId: access.user.id }, trx);
		await log(
			access,
			{
				action: 'create',
				subjectType: 'comment',
				subjectId: c.id,
				summary: `Commented on ${ctx.title}${mentioned.length ? `, mentioning ${mentioned.map((m) => m.name || m.email).join(', ')}` : ''}`,
				details: { subjectType: input.subjectType, subjectId: input.subjectId, mentioned: mentioned.map((m) => m.userId) }
			},
			trx
		);
		return c;
	});
	const url = `${origin.replace(/\/$/, '')}/projects/${access.project.id}/${ctx.setupId ? `setups/${ctx.setupId}` : 'review'}#comment-${comment.id}`;
	const mailFailed: string[] = [];
	for (const m of mentioned) {
		try {
			await sendMail({ to: m.email, ...mentionMail({ authorName: access.user.name || access.user.email, projectName: access.project.name, subjectTitle: ctx.title, body: input.body, url }) });
		} catch (e) {
			mailFailed.push(m.email);
			console.error(`Mention mail to user ${m.userId} failed:`, (e as Error).message);
		}
	}
	return { comment, mentioned: mentioned.map((m) => ({ userId: m.userId, name: m.name || m.email })), mailFailed };
}

async function ownComment(access: ProjectAccess, id: number): Promise<Comment> {
	need(access, 'comment.create');
	const c = await comments.read(access.project.id, id);
	if (!c) throw new LogError('not_found', 'There is no such comment in this project.');
	if (c.authorId !== access.user.id) throw new LogError('forbidden', 'Only the person who wrote a comment can change or delete it.');
	return c;
}

export async function updateComment(access: ProjectAccess, id: number, body: string, version: number): Promise<Comment> {
	const c = await ownComment(access, id);
	const r = await comments.update(access.project.id, id, body, version);
	if (!r) throw new LogError('not_found', 'There is no such comment in this project.');
	if ('conflict' in r) {
		throw new LogError('conflict', 'This comment changed since you opened it. Compare both versions, then save again.', {
			changedBy: c.authorId ? { id: c.authorId, name: c.authorName ?? 'the author' } : null,
			changedAt: (r.conflict.updatedAt ?? r.conflict.createdAt).toISOString(),
			version: r.conflict.version,
			fields: [{ field: 'body', label: 'Comment', yours: body, theirs: r.conflict.body }],
			current: r.conflict as unknown as Record<string, unknown>
		} satisfies ConflictDetails);
	}
	await log(access, { action: 'update', subjectType: 'comment', subjectId: id, summary: 'Edited a comment' });
	return r.comment;
}

export async function deleteComment(access: ProjectAccess, id: number): Promise<void> {
	await ownComment(access, id);
	await comments.destroy(access.project.id, id);
	await log(access, { action: 'delete', subjectType: 'comment', subjectId: id, summary: 'Deleted a comment' });
}

// ——— Views for the pages ———

export interface ReadingView {
	id: number;
	label: string;
	kind: Reading['kind'];
	takenAt: string | null;
	createdAt: string;
	x: number;
	y: number;
	u_prime: number;
	v_prime: number;
	cct_k: number | null;
	duv: number | null;
	ra: number | null;
	r9: number | null;
	ssi: number | null;
	lux: number | null;
	warnings: string[];
	distance: DistanceView | null;
	swatch: string | null;
}

export function readingView(r: Reading, target: TargetView | null): ReadingView {
	return {
		id: r.id,
		label: r.label,
		kind: r.kind,
		takenAt: r.takenAt,
		createdAt: r.createdAt,
		x: r.computed.x,
		y: r.computed.y,
		u_prime: r.computed.u_prime,
		v_prime: r.computed.v_prime,
		cct_k: r.computed.cct_k,
		duv: r.computed.duv,
		ra: r.computed.cri?.ra ?? null,
		r9: r.computed.cri?.r[8] ?? null,
		ssi: r.computed.ssi,
		lux: r.computed.lux,
		warnings: r.computed.warnings ?? [],
		distance: readingDistance(r, target),
		swatch: swatchOf(r.computed.x, r.computed.y)
	};
}

export interface FixView {
	id: number;
	kind: FixKind;
	setting: string;
	note: string;
	acceptedBy: string | null;
	acceptedAt: Date;
}

export function fixView(f: AcceptedFix): FixView {
	const setting = f.kind === 'gel' ? formatGelStack((f.fix.stack as string[]) ?? []) || 'no gel' : formatLedSettings({ channels: (f.fix.levels as Record<string, number>) ?? null, cct_k: (f.fix.cct_k as number) ?? null, gm: (f.fix.gm as number) ?? null, intensity: (f.fix.intensity as number) ?? null });
	return { id: f.id, kind: f.kind, setting, note: f.note, acceptedBy: f.acceptedByName, acceptedAt: f.acceptedAt };
}

export interface LightView {
	id: number;
	label: string;
	role: Light['role'];
	kind: Light['kind'];
	kindLabel: string;
	fixtureProfile: string | null;
	gelStack: string[];
	gelText: string;
	ledSettings: LedSettings | null;
	ledText: string;
	dimmerPercent: number | null;
	powerW: number | null;
	circuitId: number | null;
	circuitLabel: string | null;
	notes: string;
	version: number;
	updatedBy: string | null;
	updatedAt: Date;
	lastReading: ReadingView | null;
	latestFix: FixView | null;
	commentCount: number;
	/** A short heat caution where a gel sits on a hot source. */
	heatCaution: string | null;
}

const HOT_KINDS = new Set(['tungsten', 'hmi', 'practical']);
export const GEL_HEAT_CAUTION = 'Gel on a hot unit: use heat-resistant gel, leave an air gap, clip with wooden pegs, and take off any gel that smokes.';

export function lightView(l: Light, extra: { circuitLabel: string | null; lastReading: ReadingView | null; latestFix: FixView | null; commentCount: number; updatedBy: string | null }): LightView {
	return {
		id: l.id,
		label: l.label,
		role: l.role,
		kind: l.kind,
		kindLabel: LIGHT_KINDS[l.kind] ?? l.kind,
		fixtureProfile: l.fixtureProfile,
		gelStack: l.gelStack,
		gelText: formatGelStack(l.gelStack),
		ledSettings: l.ledSettings,
		ledText: formatLedSettings(l.ledSettings),
		dimmerPercent: l.dimmerPercent,
		powerW: l.powerW,
		circuitId: l.circuitId,
		notes: l.notes,
		version: l.version,
		updatedAt: l.updatedAt,
		heatCaution: HOT_KINDS.has(l.kind) && l.gelStack.length > 0 ? GEL_HEAT_CAUTION : null,
		...extra
	};
}

export interface SetupState {
	id: number;
	name: string;
	notes: string;
	status: Setup['status'];
	statusLabel: string;
	shootDayId: number;
	version: number;
	target: TargetView | null;
	/** A target was set but cannot be resolved now (its reading was removed). */
	targetMissing: boolean;
	targetTolerance: number;
	targetLocked: { at: Date; by: string | null } | null;
	locked: { at: Date; by: string | null } | null;
	updatedBy: string | null;
	updatedAt: Date;
}

async function setupState(projectId: number, s: Setup, readingLookup?: Map<number, Reading>): Promise<SetupState> {
	const n = await names([s.lockedBy, s.targetLockedBy, s.updatedBy]);
	const target = s.target ? await resolveTarget(projectId, s.target, s.targetTolerance, readingLookup) : null;
	return {
		id: s.id,
		name: s.name,
		notes: s.notes,
		status: s.status,
		statusLabel: SETUP_STATUS_LABELS[s.status],
		shootDayId: s.shootDayId,
		version: s.version,
		target,
		targetMissing: Boolean(s.target) && !target,
		targetTolerance: s.targetTolerance,
		targetLocked: s.targetLockedAt ? { at: s.targetLockedAt, by: s.targetLockedBy ? (n.get(s.targetLockedBy) ?? null) : null } : null,
		locked: s.lockedAt ? { at: s.lockedAt, by: s.lockedBy ? (n.get(s.lockedBy) ?? null) : null } : null,
		updatedBy: s.updatedBy ? (n.get(s.updatedBy) ?? null) : null,
		updatedAt: s.updatedAt
	};
}

export interface SetupPageOptions {
	sort?: 'position' | 'label' | 'role' | 'kind' | 'power' | 'distance' | 'cct';
	order?: 'asc' | 'desc';
	kind?: string;
	role?: string;
}

/**
 * Everything the setup page shows: the setup with its target and locks, the lights with their
 * current settings, last reading and distance, the power plan, readings that can be the target,
 * comments. The setup bench adds its chart and fix proposals beside this (see the page's load).
 */
export async function setupPage(access: ProjectAccess, setupId: number, o: SetupPageOptions = {}) {
	const s = await setups.read(access.project.id, setupId);
	if (!s) return null;
	const day = (await shootDays.read(access.project.id, s.shootDayId))!;
	const [lightList, circuitList, latest, latestFixes, setupReadings] = await Promise.all([
		lights.list(access.project.id, { setupId }),
		circuits.list(access.project.id, { setupId }),
		readings.latestByLight(setupId),
		fixes.latestByLight(access.project.id, { setupId }),
		readings.list(access.project.id, { setupId, limit: 500, sort: 'created_at', order: 'desc' })
	]);
	const state = await setupState(access.project.id, s, new Map(setupReadings.items.map((r) => [r.id, r])));
	const commentList = await comments.list(access.project.id, {
		subjects: [{ type: 'setup', id: s.id }, ...lightList.map((l) => ({ type: 'light' as const, id: l.id }))]
	});
	const commentCounts = new Map<number, number>();
	for (const c of commentList) if (c.subjectType === 'light') commentCounts.set(c.subjectId, (commentCounts.get(c.subjectId) ?? 0) + 1);
	const n = await names(lightList.map((l) => l.updatedBy));
	const circuitLabels = new Map(circuitList.map((c) => [c.id, c.label]));
	let rows = lightList.map((l) => {
		const r = latest.get(l.id);
		const f = latestFixes.get(l.id);
		return lightView(l, {
			circuitLabel: l.circuitId ? (circuitLabels.get(l.circuitId) ?? null) : null,
			lastReading: r ? readingView(r, state.target) : null,
			latestFix: f ? fixView(f) : null,
			commentCount: commentCounts.get(l.id) ?? 0,
			updatedBy: l.updatedBy ? (n.get(l.updatedBy) ?? null) : null
		});
	});
	const allKinds = [...new Set(rows.map((r) => r.kind))];
	if (o.kind) rows = rows.filter((r) => r.kind === o.kind);
	if (o.role) rows = rows.filter((r) => r.role === o.role);
	rows = sortLights(rows, o.sort ?? 'position', o.order ?? 'asc');
	return {
		day: { id: day.id, date: day.date, label: day.label, locationName: day.locationName, mainsVoltage: day.mainsVoltage, mainsFrequency: day.mainsFrequency },
		setup: state,
		lights: rows,
		lightCount: lightList.length,
		kinds: allKinds,
		circuits: circuitList.map((c) => ({ id: c.id, label: c.label })),
		power: powerPlan(circuitList, lightList, day.mainsVoltage),
		targetReadings: setupReadings.items.map((r) => ({ id: r.id, label: r.label, cct_k: r.computed.cct_k, lightId: r.lightId })),
		comments: commentList.filter((c) => c.subjectType === 'setup').map((c) => commentView(c, access.user.id))
	};
}

function sortLights(rows: LightView[], sort: NonNullable<SetupPageOptions['sort']>, order: 'asc' | 'desc'): LightView[] {
	const key = (r: LightView): string | number | null => {
		switch (sort) {
			case 'label':
				return r.label.toLowerCase();
			case 'role':
				return r.role;
			case 'kind':
				return r.kindLabel;
			case 'power':
				return r.powerW;
			case 'distance':
				return r.lastReading?.distance?.duv_prime ?? null;
			case 'cct':
				return r.lastReading?.cct_k ?? null;
			default:
				return null;
		}
	};
	const sign = order === 'desc' ? -1 : 1;
	return rows
		.map((r, i) => ({ r, i, k: key(r) }))
		.sort((a, b) => {
			if (sort === 'position') return sign * (a.i - b.i);
			if (a.k === null && b.k === null) return a.i - b.i;
			if (a.k === null) return 1;
			if (b.k === null) return -1;
			return (a.k < b.k ? -1 : a.k > b.k ? 1 : a.i - b.i) * sign;
		})
		.map((x) => x.r);
}

/** The light page: the light, its setup's state, every reading with its distance, fixes and comments. */
export async function lightPage(access: ProjectAccess, setupId: number, lightId: number) {
	const l = await lights.read(access.project.id, lightId);
	if (!l || l.setupId !== setupId) return null;
	const s = (await setups.read(access.project.id, setupId))!;
	const [readingList, fixList, circuitList] = await Promise.all([
		readings.list(access.project.id, { lightId, limit: 200, sort: 'created_at', order: 'desc' }),
		fixes.list(access.project.id, { lightId }),
		circuits.list(access.project.id, { setupId })
	]);
	const state = await setupState(access.project.id, s);
	const commentList = await comments.list(access.project.id, {
		subjects: [{ type: 'light', id: l.id }, ...readingList.items.map((r) => ({ type: 'reading' as const, id: r.id }))]
	});
	const views = readingList.items.map((r) => readingView(r, state.target));
	return {
		setup: state,
		light: lightView(l, {
			circuitLabel: l.circuitId ? (circuitList.find((c) => c.id === l.circuitId)?.label ?? null) : null,
			lastReading: views[0] ?? null,
			latestFix: fixList[0] ? fixView(fixList[0]) : null,
			commentCount: commentList.filter((c) => c.subjectType === 'light').length,
			updatedBy: await userName(l.updatedBy)
		}),
		readings: views,
		fixes: fixList.map(fixView),
		circuits: circuitList.map((c) => ({ id: c.id, label: c.label, volts: c.volts, amps: c.amps })),
		comments: commentList.map((c) => commentView(c, access.user.id))
	};
}

/** Project members for @mention hints. */
export async function mentionable(access: ProjectAccess): Promise<{ userId: number; name: string }[]> {
	return (await members.list(access.project.id)).map((m) => ({ userId: m.userId, name: m.name || m.email }));
}

// ——— API shapes ———

export function toApiDay(d: ShootDay) {
	return {
		id: d.id,
		project_id: d.projectId,
		date: d.date,
		label: d.label,
		location_name: d.locationName,
		mains_voltage: d.mainsVoltage,
		mains_frequency: d.mainsFrequency,
		notes: d.notes,
		version: d.version,
		created_at: d.createdAt.toISOString(),
		updated_at: d.updatedAt.toISOString()
	};
}

export function toApiSetup(s: Setup) {
	return {
		id: s.id,
		project_id: s.projectId,
		shoot_day_id: s.shootDayId,
		name: s.name,
		notes: s.notes,
		status: s.status,
		target: s.target,
		target_tolerance: s.targetTolerance,
		target_locked_at: s.targetLockedAt?.toISOString() ?? null,
		target_locked_by: s.targetLockedBy,
		locked_at: s.lockedAt?.toISOString() ?? null,
		locked_by: s.lockedBy,
		position: s.position,
		version: s.version,
		created_at: s.createdAt.toISOString(),
		updated_at: s.updatedAt.toISOString()
	};
}

export function toApiLight(l: Light) {
	return {
		id: l.id,
		project_id: l.projectId,
		setup_id: l.setupId,
		label: l.label,
		role: l.role,
		kind: l.kind,
		fixture_profile: l.fixtureProfile,
		gel_stack: l.gelStack,
		led_settings: l.ledSettings,
		dimmer_percent: l.dimmerPercent,
		power_w: l.powerW,
		circuit_id: l.circuitId,
		notes: l.notes,
		position: l.position,
		version: l.version,
		created_at: l.createdAt.toISOString(),
		updated_at: l.updatedAt.toISOString()
	};
}

export function toApiComment(c: Comment) {
	return {
		id: c.id,
		project_id: c.projectId,
		subject_type: c.subjectType,
		subject_id: c.subjectId,
		author_id: c.authorId,
		author_name: c.authorName,
		body: c.body,
		version: c.version,
		created_at: c.createdAt.toISOString(),
		updated_at: c.updatedAt?.toISOString() ?? null
	};
}

/** Rewrites a conflict's `current` into the API's shape. */
export function apiConflict(e: unknown, shape: (row: never) => unknown): never {
	if (e instanceof LogError && e.logCode === 'conflict' && e.details) {
		const d = e.details as ConflictDetails;
		throw new LogError('conflict', e.message, { ...d, current: shape(d.current as never) });
	}
	throw e;
}
