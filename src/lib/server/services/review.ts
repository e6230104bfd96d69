/**
 * The review: the lighting log as the colorist reads it. Every setup with its target white, each
 * light's final setting (gel stack, LED settings, dimmer, accepted fix) and all its readings with
 * their distance to the target, and the comments on each, filtered by day, setup and light kind.
 * The CSV export and the printable report read the same structure.
 */
import * as circuits from '$lib/server/db/circuits';
import * as comments from '$lib/server/db/comments';
import * as fixes from '$lib/server/db/fixes';
import * as lights from '$lib/server/db/lights';
import * as readings from '$lib/server/db/readings';
import * as setups from '$lib/server/db/setups';
import * as shootDays from '$lib/server/db/shoot-days';
import * as users from '$lib/server/db/users';
import type { ProjectAccess } from '$lib/server/authz';
import type { Reading } from '$lib/server/db/readings';
import { LIGHT_KINDS, SETUP_STATUS_LABELS } from '$lib/schemas/log';
import {
	commentView,
	fixView,
	lightView,
	readingView,
	resolveTarget,
	type CommentView,
	type LightView,
	type ReadingView,
	type TargetView
} from './log';

export interface ReviewFilters {
	dayId?: number;
	setupId?: number;
	kind?: string;
	/** 1-based page of setups; `pageSize: 0` means every setup on one page (exports). */
	page?: number;
	pageSize?: number;
}

export interface ReviewLight {
	light: LightView;
	readings: (ReadingView & { comments: CommentView[] })[];
	comments: CommentView[];
	/** The light's last change: who and when. */
	changedBy: string | null;
	changedAt: Date;
}

export interface ReviewSetup {
	day: { id: number; date: string; label: string; locationName: string; mainsVoltage: number; mainsFrequency: number };
	id: number;
	name: string;
	notes: string;
	status: string;
	statusLabel: string;
	target: TargetView | null;
	targetMissing: boolean;
	targetTolerance: number;
	targetLocked: boolean;
	locked: boolean;
	lights: ReviewLight[];
	comments: CommentView[];
}

export interface Review {
	days: { id: number; date: string; label: string }[];
	setupOptions: { id: number; name: string; dayId: number }[];
	kinds: { id: string; label: string }[];
	setups: ReviewSetup[];
	total: number;
	page: number;
	pageCount: number;
}

export const REVIEW_PAGE_SIZE = 8;

export async function reviewLog(access: ProjectAccess, f: ReviewFilters = {}): Promise<Review> {
	const projectId = access.project.id;
	const [{ items: dayList }, allSetups, allLights] = await Promise.all([
		shootDays.list(projectId),
		setups.list(projectId),
		lights.list(projectId)
	]);
	let chosen = allSetups;
	if (f.dayId) chosen = chosen.filter((s) => s.shootDayId === f.dayId);
	if (f.setupId) chosen = chosen.filter((s) => s.id === f.setupId);
	if (f.kind) {
		const withKind = new Set(allLights.filter((l) => l.kind === f.kind).map((l) => l.setupId));
		chosen = chosen.filter((s) => withKind.has(s.id));
	}
	const pageSize = f.pageSize ?? REVIEW_PAGE_SIZE;
	const pageCount = pageSize > 0 ? Math.max(1, Math.ceil(chosen.length / pageSize)) : 1;
	const page = Math.min(Math.max(1, f.page ?? 1), pageCount);
	const shown = pageSize > 0 ? chosen.slice((page - 1) * pageSize, page * pageSize) : chosen;
	const days = new Map(dayList.map((d) => [d.id, d]));

	const out: ReviewSetup[] = [];
	for (const s of shown) {
		const lightList = allLights.filter((l) => l.setupId === s.id && (!f.kind || l.kind === f.kind));
		const { items: readingList } = await readings.list(projectId, { setupId: s.id, limit: 500, sort: 'taken_at', order: 'asc' });
		const byId = new Map<number, Reading>(readingList.map((r) => [r.id, r]));
		const target = s.target ? await resolveTarget(projectId, s.target, s.targetTolerance, byId) : null;
		const fixList = await fixes.latestByLight(projectId, { setupId: s.id });
		const circuitLabels = new Map((await circuits.list(projectId, { setupId: s.id })).map((c) => [c.id, c.label]));
		const commentList = await comments.list(projectId, {
			subjects: [{ type: 'setup', id: s.id }, ...lightList.map((l) => ({ type: 'light' as const, id: l.id })), ...readingList.map((r) => ({ type: 'reading' as const, id: r.id }))]
		});
		const people = new Map((await users.list([...new Set(lightList.map((l) => l.updatedBy).filter((x): x is number => x !== null))])).map((u) => [u.id, u.name || u.email]));
		const cv = (type: string, id: number) => commentList.filter((c) => c.subjectType === type && c.subjectId === id).map((c) => commentView(c, access.user.id));
		const day = days.get(s.shootDayId)!;
		out.push({
			day: { id: day.id, date: day.date, label: day.label, locationName: day.locationName, mainsVoltage: day.mainsVoltage, mainsFrequency: day.mainsFrequency },
			id: s.id,
			name: s.name,
			notes: s.notes,
			status: s.status,
			statusLabel: SETUP_STATUS_LABELS[s.status],
			target,
			targetMissing: Boolean(s.target) && !target,
			targetTolerance: s.targetTolerance,
			targetLocked: s.targetLockedAt !== null,
			locked: s.lockedAt !== null,
			comments: cv('setup', s.id),
			lights: lightList.map((l) => {
				// Oldest first as the review reads; the last one is the light's final reading.
				const mine = readingList.filter((r) => r.lightId === l.id).sort((a, b) => (a.takenAt ?? a.createdAt).localeCompare(b.takenAt ?? b.createdAt) || a.id - b.id);
				const views = mine.map((r) => ({ ...readingView(r, target), comments: cv('reading', r.id) }));
				const lightComments = cv('light', l.id);
				const fix = fixList.get(l.id);
				const changedBy = l.updatedBy ? (people.get(l.updatedBy) ?? null) : null;
				return {
					light: lightView(l, {
						circuitLabel: l.circuitId ? (circuitLabels.get(l.circuitId) ?? null) : null,
						lastReading: views.at(-1) ?? null,
						latestFix: fix ? fixView(fix) : null,
						commentCount: lightComments.length,
						updatedBy: changedBy
					}),
					readings: views,
					comments: lightComments,
					changedBy,
					changedAt: l.updatedAt
				};
			})
		});
	}
	const presentKinds = [...new Set(allLights.map((l) => l.kind))];
	return {
		days: dayList.map((d) => ({ id: d.id, date: d.date, label: d.label })),
		setupOptions: allSetups.filter((s) => !f.dayId || s.shootDayId === f.dayId).map((s) => ({ id: s.id, name: s.name, dayId: s.shootDayId })),
		kinds: presentKinds.map((k) => ({ id: k, label: LIGHT_KINDS[k] ?? k })),
		setups: out,
		total: chosen.length,
		page,
		pageCount
	};
}
