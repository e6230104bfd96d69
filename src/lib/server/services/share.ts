/**
 * Sending the lighting log to someone on the project (the colorist before a grade, the DP after a
 * night): an e-mail with a link to the review view and an optional note, recorded in the activity.
 * Only members can be sent it, so the form cannot be used to mail strangers; people who are not on
 * the project yet are invited from the members page instead.
 */
import { ROLE_LABELS, type ProjectAccess } from '$lib/server/authz';
import * as activity from '$lib/server/db/activity';
import * as members from '$lib/server/db/members';
import { sendLogShared } from '$lib/server/mail';
import { LogError } from './log';

/** The members the log can be sent to: everyone on the project but the sender. */
export async function shareRecipients(access: ProjectAccess): Promise<{ userId: number; name: string; roleLabel: string }[]> {
	return (await members.list(access.project.id))
		.filter((m) => m.userId !== access.user.id)
		.map((m) => ({ userId: m.userId, name: m.name || m.email, roleLabel: ROLE_LABELS[m.role] }));
}

/** Mails the review link to a member; refuses anyone not on the project. */
export async function shareLog(access: ProjectAccess, input: { userId: number; note: string }, origin: string): Promise<{ name: string }> {
	if (!access.can('export.create')) throw new LogError('forbidden', 'Your role on this project cannot send the log.');
	const to = await members.read(access.project.id, input.userId);
	if (!to || to.userId === access.user.id) throw new LogError('invalid', 'Choose someone on this project. To send the log to someone new, invite them from the members page first.');
	const note = input.note.trim();
	await sendLogShared(to.email, {
		sharerName: access.user.name || access.user.email,
		projectName: access.project.name,
		url: `${origin}/projects/${access.project.id}/review`,
		note: note || null
	});
	const name = to.name || to.email;
	await activity.create(access.project.id, {
		userId: access.user.id,
		action: 'log.shared',
		subjectType: 'project',
		subjectId: access.project.id,
		summary: `Sent the lighting log to ${name}`,
		details: note ? { note } : null
	});
	return { name };
}
