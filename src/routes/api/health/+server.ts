import { json } from '@sveltejs/kit';
import { checkDatabase } from '$lib/server/health';

export async function GET() {
	const db = await checkDatabase();
	return json({ ok: db.ok, db }, { status: db.ok ? 200 : 503, headers: { 'cache-control': 'no-store' } });
}
