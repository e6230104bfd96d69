/** The activity log: who changed what in a project, and when. Written by the services, never edited. */
import type { Knex } from 'knex';
import { db } from './index';
import { parseJson, toJson } from './json';

export type ActivitySubject = 'project' | 'shoot_day' | 'setup' | 'light' | 'circuit' | 'reading' | 'comment' | 'fix' | 'photo';

export interface Activity {
	id: number;
	projectId: number;
	userId: number | null;
	userName: string | null;
	action: string;
	subjectType: ActivitySubject;
	subjectId: number | null;
	summary: string;
	details: Record<string, unknown> | null;
	createdAt: Date;
}

export interface NewActivity {
	userId: number | null;
	action: string;
	subjectType: ActivitySubject;
	subjectId: number | null;
	summary: string;
	details?: Record<string, unknown> | null;
	createdAt?: Date;
}

type Row = Record<string, unknown>;

function fromRow(r: Row): Activity {
	return {
		id: Number(r.id),
		projectId: r.project_id as number,
		userId: (r.user_id as number | null) ?? null,
		userName: r.user_email ? ((r.user_name as string) || (r.user_email as string)) : null,
		action: r.action as string,
		subjectType: r.subject_type as ActivitySubject,
		subjectId: (r.subject_id as number | null) ?? null,
		summary: r.summary as string,
		details: parseJson<Record<string, unknown>>(r.details),
		createdAt: r.created_at as Date
	};
}

export async function create(projectId: number, a: NewActivity, q: Knex = db): Promise<void> {
	await q('activity').insert({
		project_id: projectId,
		user_id: a.userId,
		action: a.action.slice(0, 60),
		subject_type: a.subjectType,
		subject_id: a.subjectId,
		summary: a.summary.slice(0, 500),
		details: toJson(a.details ?? null),
		...(a.createdAt ? { created_at: a.createdAt } : {})
	});
}

export interface ListOptions {
	subjectType?: ActivitySubject;
	subjectId?: number;
	userId?: number;
	/** Matches the summary. */
	q?: string;
	order?: 'asc' | 'desc';
	limit?: number;
	offset?: number;
}

/** Newest first unless asked otherwise. */
export async function list(projectId: number, o: ListOptions = {}, q: Knex = db): Promise<{ items: Activity[]; total: number }> {
	const query = q('activity as a').where('a.project_id', projectId);
	if (o.subjectType) query.where('a.subject_type', o.subjectType);
	if (o.subjectId !== undefined) query.where('a.subject_id', o.subjectId);
	if (o.userId !== undefined) query.where('a.user_id', o.userId);
	if (o.q?.trim()) query.where('a.summary', 'like', `%${o.q.trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`);
	const [{ n }] = (await query.clone().count({ n: '*' })) as { n: number }[];
	const order = o.order ?? 'desc';
	const rows = await query
		.leftJoin('users as u', 'u.id', 'a.user_id')
		.select('a.*', 'u.name as user_name', 'u.email as user_email')
		.orderBy('a.created_at', order)
		.orderBy('a.id', order)
		.limit(o.limit ?? 50)
		.offset(o.offset ?? 0);
	return { items: rows.map(fromRow), total: Number(n) };
}
