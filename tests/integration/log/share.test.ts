/** Sending the lighting log to someone on the project: the mail, the activity, and who can be sent it. */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import * as activity from '../../../src/lib/server/db/activity';
import { closeMail } from '../../../src/lib/server/mail';
import * as exportPage from '../../../src/routes/projects/[projectId]/export/+page.server';
import { linkIn, mailTo, waitForMail } from '../auth/helpers/mail';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { act, load } from './helpers';

let db: Knex;
let p: Awaited<ReturnType<typeof makeProject>>;
beforeAll(async () => {
	db = testKnex();
	await db.migrate.latest();
	p = await makeProject(db, 'Share the log');
});
afterAll(async () => {
	closeMail();
	await db.destroy();
	await closeDb();
});

const params = () => ({ projectId: String(p.projectId) });

describe('send the log to a member', () => {
	it('the export page offers everyone on the project but yourself, with their roles', async () => {
		const page = await load(exportPage.load as never, '/e', { params: params(), user: p.crew.gaffer });
		const names = page.data.recipients.map((r: { name: string; roleLabel: string }) => `${r.name} · ${r.roleLabel}`);
		expect(names).toEqual(['Test owner · Owner', 'Test dp · Director of photography', 'Test colorist · Colorist', 'Test viewer · Viewer']);
		const viewer = await load(exportPage.load as never, '/e', { params: params(), user: p.crew.viewer });
		expect(viewer.data.recipients).toEqual([]);
	});

	it('the gaffer sends it to the colorist: a mail with the note and a link to the review, and a line in the activity', async () => {
		const since = new Date(Date.now() - 1000);
		const o = await act(exportPage.actions as never, 'share', '/e', { params: params(), user: p.crew.gaffer, form: { userId: p.crew.colorist.id, note: 'Night 1 is ready for the grade.' } });
		expect(o.status).toBe(200);
		expect(o.data).toMatchObject({ action: 'share', ok: true, message: 'Sent to Test colorist.' });
		const mail = await waitForMail(p.crew.colorist.email, { subject: /shared a lighting log with you/, since });
		expect(mail.mail.subject).toContain('Test gaffer');
		expect(mail.mail.text).toContain('Night 1 is ready for the grade.');
		expect(new URL(linkIn(mail, `/projects/${p.projectId}/review`)).pathname).toBe(`/projects/${p.projectId}/review`);
		expect(mail.mail.html).toContain('Open the lighting log');
		const { items } = await activity.list(p.projectId, { limit: 5 });
		expect(items[0]).toMatchObject({ action: 'log.shared', userId: p.crew.gaffer.id, summary: 'Sent the lighting log to Test colorist', details: { note: 'Night 1 is ready for the grade.' } });
	});

	it('refuses someone who is not on the project and yourself with a sentence, and sends nothing', async () => {
		const since = new Date();
		const stranger = await act(exportPage.actions as never, 'share', '/e', { params: params(), user: p.crew.gaffer, form: { userId: p.crew.stranger.id, note: '' } });
		expect(stranger.status).toBe(400);
		expect(stranger.data.message).toMatch(/Choose someone on this project/);
		const self = await act(exportPage.actions as never, 'share', '/e', { params: params(), user: p.crew.gaffer, form: { userId: p.crew.gaffer.id, note: '' } });
		expect(self.status).toBe(400);
		const blank = await act(exportPage.actions as never, 'share', '/e', { params: params(), user: p.crew.gaffer, form: { userId: '', note: 'x'.repeat(1001) } });
		expect(blank.status).toBe(400);
		expect(Object.keys(blank.data.issues).sort()).toEqual(['note', 'userId']);
		await new Promise((r) => setTimeout(r, 300));
		expect(await mailTo(p.crew.stranger.email, since)).toEqual([]);
	});
});
