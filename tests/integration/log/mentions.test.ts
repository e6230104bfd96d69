/** @mentions in comments: the mentioned member gets an e-mail (read back from the mail catcher's .eml files). */
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../../src/lib/server/db';
import { closeMail } from '../../../src/lib/server/mail';
import { listCaptured, type CapturedMail } from '../../../src/lib/server/mail/catcher';
import * as activity from '../../../src/lib/server/db/activity';
import * as setupPage from '../../../src/routes/projects/[projectId]/setups/[setupId]/+page.server';
import * as reviewPage from '../../../src/routes/projects/[projectId]/review/+page.server';
import * as apiComments from '../../../src/routes/api/v1/projects/[projectId]/comments/+server';
import { testKnex } from '../helpers/db';
import { makeProject } from '../helpers/fixtures';
import { call } from '../helpers/route';
import { act } from './helpers';

let db: Knex;
const MAIL_DIR = process.env.MAIL_DIR ?? '';

beforeAll(async () => {
	if (!MAIL_DIR) throw new Error('MAIL_DIR is not set: run through `npm test`, which starts the mail catcher.');
	db = testKnex();
	await db.migrate.latest();
});
afterAll(async () => {
	closeMail();
	await db.destroy();
	await closeDb();
});

async function mailTo(address: string, min = 1, timeoutMs = 8000): Promise<CapturedMail[]> {
	const until = Date.now() + timeoutMs;
	for (;;) {
		const found = (await listCaptured(MAIL_DIR)).filter((m) => m.to.some((t) => t.toLowerCase() === address.toLowerCase()));
		if (found.length >= min || Date.now() > until) return found;
		await new Promise((r) => setTimeout(r, 150));
	}
}

describe('mentions', () => {
	it('a colorist’s comment in review mailing “@Test gaffer” reaches the gaffer with the comment and a link; nobody else is mailed', async () => {
		const p = await makeProject(db, 'Mentions');
		const body = 'The key reads green on camera. @Test gaffer can you add a quarter minus green?';
		const r = await act(reviewPage.actions as never, 'comment', '/r', { params: { projectId: String(p.projectId) }, user: p.crew.colorist, form: { subjectType: 'light', subjectId: p.lightId, body } });
		expect(r.status).toBe(200);
		expect(r.data.mentioned).toEqual([{ userId: p.crew.gaffer.id, name: 'Test gaffer' }]);
		const [mail] = await mailTo(p.crew.gaffer.email);
		expect(mail, 'a mail to the gaffer was captured').toBeTruthy();
		expect(mail.mail.subject).toMatch(/^Test colorist mentioned you on light “Key panel” in “Wide” \(Mentions /);
		expect(mail.mail.text).toContain('> The key reads green on camera. @Test gaffer can you add a quarter minus green?');
		expect(mail.mail.text).toContain(`/projects/${p.projectId}/setups/${p.setupId}#comment-${r.data.commentId}`);
		expect(mail.mail.html).toContain('Open the comment');
		for (const who of ['owner', 'dp', 'colorist', 'viewer', 'stranger'] as const) expect(await mailTo(p.crew[who].email, 1, 300)).toEqual([]);
		const entry = (await activity.list(p.projectId, { subjectType: 'comment' })).items[0];
		expect(entry.summary).toBe('Commented on light “Key panel” in “Wide”, mentioning Test gaffer');
	});

	it('mentions through the setup page and the API; no mail for the author themself or for a stranger’s name', async () => {
		const p = await makeProject(db, 'Mentions 2');
		const viaPage = await act(setupPage.actions as never, 'comment', '/s', { params: { projectId: String(p.projectId), setupId: String(p.setupId) }, user: p.crew.dp, form: { subjectType: 'setup', subjectId: p.setupId, body: '@Test colorist and @Test dp: target locked. @Test stranger ignore.' } });
		expect(viaPage.data.mentioned.map((m: { userId: number }) => m.userId)).toEqual([p.crew.colorist.id]);
		expect(await mailTo(p.crew.colorist.email)).toHaveLength(1);
		expect(await mailTo(p.crew.stranger.email, 1, 300)).toEqual([]);
		expect(await mailTo(p.crew.dp.email, 1, 300)).toEqual([]);
		const viaApi = await call(apiComments.POST, '/api', { params: { projectId: String(p.projectId) }, user: p.crew.gaffer, json: { subjectType: 'setup', subjectId: p.setupId, body: 'Done, @Test owner.' } });
		expect((await viaApi.json()).mentioned).toEqual([{ userId: p.crew.owner.id, name: 'Test owner' }]);
		const [mail] = await mailTo(p.crew.owner.email);
		expect(mail.mail.subject).toMatch(/^Test gaffer mentioned you on setup “Wide”/);
	});
});
