import { fail } from '@sveltejs/kit';
import { projectAccess, ROLE_LABELS, ROLES } from '$lib/server/authz';
import { parseForm, requestContext } from '$lib/server/auth/form';
import { LIFETIMES } from '$lib/server/auth/policy';
import { describeLifetime } from '$lib/server/mail/templates';
import * as service from '$lib/server/services/projects';
import type { Actions, PageServerLoad } from './$types';

const LAST_OWNER = 'A project needs at least one owner: make someone else owner first.';

export const load: PageServerLoad = async (event) => {
	const access = await projectAccess(event);
	const manage = access.can('member.change');
	const members = await service.listMembers(access);
	const pending = access.can('member.invite') ? await service.listPendingInvitations(access) : [];
	return {
		project: { id: access.project.id, name: access.project.name },
		manage,
		canInvite: access.can('member.invite'),
		inviteLifetime: describeLifetime(LIFETIMES.invitation),
		roles: ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] })),
		members: members.map((m) => ({ userId: m.userId, name: m.name, email: manage ? m.email : null, role: m.role, isYou: m.userId === access.user.id })),
		invitations: pending.map((i) => ({ id: i.id, email: i.email, roleLabel: ROLE_LABELS[i.role], expiresAt: i.expiresAt }))
	};
};

export const actions: Actions = {
	invite: async (event) => {
		const access = await projectAccess(event, 'member.invite');
		const parsed = parseForm(service.inviteSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'invite', issues: parsed.issues, values: parsed.values });
		const result = await service.invite(access, parsed.data, requestContext(event).origin);
		if (!result.ok) return fail(400, { action: 'invite', issues: { email: ['That person is on the project already.'] }, values: parsed.values });
		return { action: 'invite', invited: parsed.data.email };
	},
	revoke: async (event) => {
		const access = await projectAccess(event, 'member.invite');
		const parsed = parseForm(service.invitationIdSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'revoke', message: 'Pick an invitation.' });
		if (!(await service.revokeInvitation(access, parsed.data.invitationId))) return fail(404, { action: 'revoke', message: 'That invitation is gone already.' });
		return { action: 'revoke' };
	},
	role: async (event) => {
		const access = await projectAccess(event, 'member.change');
		const parsed = parseForm(service.roleChangeSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'role', message: 'Pick a member and a role.' });
		const result = await service.changeRole(access, parsed.data.userId, parsed.data.role);
		if (!result.ok) return fail(400, { action: 'role', message: result.reason === 'last-owner' ? LAST_OWNER : 'That person is not on the project.' });
		return { action: 'role' };
	},
	remove: async (event) => {
		const access = await projectAccess(event, 'member.change');
		const parsed = parseForm(service.memberSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { action: 'remove', message: 'Pick a member.' });
		const result = await service.removeMember(access, parsed.data.userId);
		if (!result.ok) return fail(400, { action: 'remove', message: result.reason === 'last-owner' ? LAST_OWNER : 'That person is not on the project.' });
		return { action: 'remove' };
	}
};
