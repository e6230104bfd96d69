import { describe, expect, it } from 'vitest';
import { can, canSite, parseProjectId, PERMISSIONS, permissionsOf, ROLE_PERMISSIONS, ROLES, type Permission, type Role } from '$lib/server/authz';

// The role table of the product notes ("Roles"), row by row, written out here on purpose: authz.ts
// must match it exactly, and a change to either has to change both.
const TABLE: Record<string, { permissions: Permission[]; roles: Role[] }> = {
	'see the project, its log, readings, photos': { permissions: ['project.view'], roles: ['owner', 'dp', 'gaffer', 'colorist', 'viewer'] },
	comment: { permissions: ['comment.create'], roles: ['owner', 'dp', 'gaffer', 'colorist'] },
	'export CSV / report': { permissions: ['export.create'], roles: ['owner', 'dp', 'gaffer', 'colorist'] },
	'add and edit lights, readings, photos, power plan': {
		permissions: ['light.edit', 'reading.edit', 'photo.edit', 'power.edit'],
		roles: ['owner', 'dp', 'gaffer']
	},
	'ask for fixes, accept a fix': { permissions: ['fix.request', 'fix.accept'], roles: ['owner', 'dp', 'gaffer'] },
	'set or lock a target white, lock a setup': { permissions: ['target.set', 'target.lock', 'setup.lock'], roles: ['owner', 'dp'] },
	// Not a row of the product's table: the DP leads the look and keeps the project's name and notes
	// current with the owner; the project's fate stays the owner's alone.
	'rename the project and edit its notes': { permissions: ['project.edit'], roles: ['owner', 'dp'] },
	'invite and change members': { permissions: ['member.invite', 'member.change'], roles: ['owner'] },
	'archive or delete the project': { permissions: ['project.archive', 'project.delete'], roles: ['owner'] }
};

function expectedFor(role: Role): Permission[] {
	return Object.values(TABLE)
		.filter((row) => row.roles.includes(role))
		.flatMap((row) => row.permissions);
}

describe('authz role table', () => {
	it('covers every permission exactly once across the rows', () => {
		const listed = Object.values(TABLE).flatMap((r) => r.permissions);
		expect([...listed].sort()).toEqual([...PERMISSIONS].sort());
		expect(new Set(listed).size).toBe(listed.length);
	});

	for (const role of ['owner', 'dp', 'gaffer', 'colorist', 'viewer'] as const) {
		it(`${role}: exactly the allowed set`, () => {
			expect([...ROLE_PERMISSIONS[role]].sort()).toEqual(expectedFor(role).sort());
			expect(permissionsOf(role)).toEqual(PERMISSIONS.filter((p) => expectedFor(role).includes(p)));
			for (const p of PERMISSIONS) expect(can(role, p), `${role} ${p}`).toBe(expectedFor(role).includes(p));
		});
	}

	it('has the five roles, widest first', () => {
		expect(ROLES).toEqual(['owner', 'dp', 'gaffer', 'colorist', 'viewer']);
	});

	it('nobody, or an unknown role, may do nothing', () => {
		for (const p of PERMISSIONS) {
			expect(can(null, p)).toBe(false);
			expect(can(undefined, p)).toBe(false);
			expect(can('producer' as Role, p)).toBe(false);
		}
		expect(can('owner', 'project.fly' as Permission)).toBe(false);
	});

	it('site permissions belong to admins only', () => {
		const person = { id: 1, email: 'a@example.test', name: 'A', isAdmin: false };
		expect(canSite(person, 'account.manage')).toBe(false);
		expect(canSite({ ...person, isAdmin: true }, 'library.manage')).toBe(true);
		expect(canSite(null, 'account.manage')).toBe(false);
	});
});

describe('parseProjectId', () => {
	it('takes positive integers that fit an unsigned INT', () => {
		expect(parseProjectId('1')).toBe(1);
		expect(parseProjectId(37)).toBe(37);
		expect(parseProjectId('4294967295')).toBe(4294967295);
	});
	it('refuses everything else', () => {
		for (const bad of ['0', '-1', '01', '1.0', '1e3', ' 1', 'abc', '', undefined, '4294967296', 'NaN', 'Infinity']) {
			expect(parseProjectId(bad as string)).toBeNull();
		}
	});
});
