/** Demo people: one per project role plus a site admin. Invented names, `example.test` addresses. */
import { hashPassword, verifyPassword } from '../../src/lib/server/auth/password';
import * as users from '../../src/lib/server/db/users';
import type { ProjectRole } from '../../src/lib/server/db/members';
import type { SeedContext } from './context';

/** The one password of every demo account. Demo only: printed at start for anyone to use. */
export const DEMO_PASSWORD = 'night-wash-demo';

export type DemoKey = ProjectRole | 'admin';

export interface DemoAccount {
	key: DemoKey;
	/** What the sign-in list calls the account. */
	label: string;
	email: string;
	name: string;
	isAdmin: boolean;
	/** Role on the demo project. */
	projectRole: ProjectRole;
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
	{ key: 'owner', label: 'owner', email: 'demo.owner@example.test', name: 'Demo Owner', isAdmin: false, projectRole: 'owner' },
	{ key: 'dp', label: 'DP', email: 'demo.dp@example.test', name: 'Demo DP', isAdmin: false, projectRole: 'dp' },
	{ key: 'gaffer', label: 'gaffer', email: 'demo.gaffer@example.test', name: 'Demo Gaffer', isAdmin: false, projectRole: 'gaffer' },
	{ key: 'colorist', label: 'colorist', email: 'demo.colorist@example.test', name: 'Demo Colorist', isAdmin: false, projectRole: 'colorist' },
	{ key: 'viewer', label: 'viewer', email: 'demo.viewer@example.test', name: 'Demo Viewer', isAdmin: false, projectRole: 'viewer' },
	{ key: 'admin', label: 'site admin', email: 'demo.admin@example.test', name: 'Demo Admin', isAdmin: true, projectRole: 'viewer' }
];

/** Creates the demo accounts, or brings existing ones back to their demo state (name, admin flag, password). */
export async function seedAccounts(ctx: SeedContext): Promise<void> {
	for (const a of DEMO_ACCOUNTS) {
		const found = await users.readWithPassword(a.email);
		if (!found) {
			ctx.users[a.key] = await users.create({
				email: a.email,
				name: a.name,
				isAdmin: a.isAdmin,
				emailVerified: new Date(),
				passwordHash: await hashPassword(DEMO_PASSWORD)
			});
			continue;
		}
		const passwordOk = await verifyPassword(found.passwordHash, DEMO_PASSWORD);
		ctx.users[a.key] =
			(await users.update(found.id, {
				name: a.name,
				isAdmin: a.isAdmin,
				emailVerified: found.emailVerified ?? new Date(),
				...(passwordOk ? {} : { passwordHash: await hashPassword(DEMO_PASSWORD) })
			})) ?? undefined;
	}
}
