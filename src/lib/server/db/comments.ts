/** Comments on a setup, a light or a reading (the colorist's review and the crew's answers). */
import type { Knex } from 'knex';
import { db } from './index';
import type { CommentSubject } from '../../schemas/log';

export interface Comment {
	id: number;
	projectId: number;
	subjectType: CommentSubject;
	subjectId: number;
	authorId: number | null;
	/** The author's name (or address when they gave no name); null when the account is gone. */
	authorName: string | null;
	authorEmail: string | null;
	body: string;
	version: number;
	createdAt: Date;
	updatedAt: Date | null;
	deletedAt: Date | null;
}

type Row = Record<string, unknown>;

function fromRow(r: Row): Comment {
	return {
		id: r.id as number,
		projectId: r.project_id as number,
		subjectType: r.subject_type as CommentSubject,
		subjectId: r.subject_id as number,
		authorId: (r.author_id as number | null) ?? null,
		authorName: r.author_email ? ((r.author_name as string) || (r.author_email as string)) : null,
		authorEmail: (r.author_email as string | null) ?? null,
		body: r.body as string,
		version: r.version as number,
		createdAt: r.created_at as Date,
		updatedAt: (r.updated_at as Date | null) ?? null,
		deletedAt: (r.deleted_at as Date | null) ?? null
	};
}

function base(q: Knex) {
	return q('comments as c').leftJoin('users as u', 'u.id', 'c.author_id').select('c.*', 'u.name as author_name', 'u.email as author_email');
}

export interface ListOptions {
	subjectType?: CommentSubject;
	subjectId?: number;
	/** Comments on any of these subjects. */
	subjects?: readonly { type: CommentSubject; id: number }[];
	includeDeleted?: boolean;
	limit?: number;
	offset?: number;
}

/** Oldest first, as a conversation reads. */
export async function list(projectId: number, o: ListOptions = {}, q: Knex = db): Promise<Comment[]> {
	const query = base(q).where('c.project_id', projectId).orderBy('c.created_at').orderBy('c.id');
	if (!o.includeDeleted) query.whereNull('c.deleted_at');
	if (o.subjectType) query.where('c.subject_type', o.subjectType);
	if (o.subjectId !== undefined) query.where('c.subject_id', o.subjectId);
	if (o.subjects) {
		const subjects = o.subjects;
		if (subjects.length === 0) return [];
		query.where((w) => {
			for (const s of subjects) w.orWhere((x) => x.where('c.subject_type', s.type).andWhere('c.subject_id', s.id));
		});
	}
	if (o.limit !== undefined) query.limit(o.limit).offset(o.offset ?? 0);
	return (await query).map(fromRow);
}

export async function read(projectId: number, id: number, q: Knex = db): Promise<Comment | null> {
	const row = await base(q).where({ 'c.project_id': projectId, 'c.id': id }).whereNull('c.deleted_at').first();
	return row ? fromRow(row) : null;
}

export interface NewComment {
	subjectType: CommentSubject;
	subjectId: number;
	body: string;
	authorId: number | null;
	createdAt?: Date;
}

export async function create(projectId: number, c: NewComment, q: Knex = db): Promise<Comment> {
	const [id] = await q('comments').insert({
		project_id: projectId,
		subject_type: c.subjectType,
		subject_id: c.subjectId,
		author_id: c.authorId,
		body: c.body,
		...(c.createdAt ? { created_at: c.createdAt } : {})
	});
	return (await read(projectId, Number(id), q)) as Comment;
}

export async function update(projectId: number, id: number, body: string, expectedVersion: number, q: Knex = db): Promise<{ comment: Comment } | { conflict: Comment } | null> {
	const n = await q('comments')
		.where({ project_id: projectId, id, version: expectedVersion })
		.whereNull('deleted_at')
		.update({ body, updated_at: q.fn.now(3), version: q.raw('version + 1') });
	const current = await read(projectId, id, q);
	if (!current) return null;
	return n === 1 ? { comment: current } : { conflict: current };
}

/** Hides the comment (the row stays for the activity log). */
export async function destroy(projectId: number, id: number, q: Knex = db): Promise<boolean> {
	return (await q('comments').where({ project_id: projectId, id }).whereNull('deleted_at').update({ deleted_at: q.fn.now(3) })) === 1;
}
